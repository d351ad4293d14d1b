package org.zweep.driver.dialect;

import java.util.List;

/**
 * How a measurement reply carries each point: its encoding and the fields of one point in order.
 *
 * @param encoding ASCII numbers or an IEEE 488.2 definite-length block of REAL,64 doubles
 * @param fields the fields of one point, in the order the meter sends them
 * @param listEncoding the encoding of a list sweep's reply (the dialect's {@code list-format}
 *     command selects it before a sweep, {@code point-format} the other again before a point)
 */
record ReplyShape(Encoding encoding, List<Field> fields, Encoding listEncoding) {

    /** SCPI's "not a number" for a reading with no value (SCPI-1999 Vol 1 §7.2.1.5: NAN = 9.91E37). */
    static final double NO_VALUE_THRESHOLD = 9.9e37;

    ReplyShape {
        fields = List.copyOf(fields);
    }

    /** A shape whose list sweeps are answered in the same encoding as single points. */
    ReplyShape(Encoding encoding, List<Field> fields) {
        this(encoding, fields, encoding);
    }

    /** Whether list sweeps are answered in another encoding than single points. */
    boolean listsSwitchEncoding() {
        return listEncoding != encoding;
    }

    /** The reply's encoding. */
    enum Encoding {
        ASCII("ascii"), REAL64_BIG("real64-big"), REAL64_LITTLE("real64-little");

        final String word;

        Encoding(String word) {
            this.word = word;
        }
    }

    /** One field of a point. */
    enum Field {
        REAL("real"), IMAG("imag"), MAGNITUDE("magnitude"), PHASE_DEG("phase-deg"), PHASE_RAD("phase-rad"),
        SKIP("skip");

        final String word;

        Field(String word) {
            this.word = word;
        }
    }

    /**
     * The complex value of point {@code index} in {@code values}: {@code {real, imag}}, or
     * {@code null} when the meter sent SCPI's no-value marker (or NaN) in any used field.
     */
    double[] point(double[] values, int index) {
        double real = 0;
        double imag = 0;
        double magnitude = 0;
        double phaseRad = 0;
        boolean polar = false;
        for (int k = 0; k < fields.size(); k++) {
            Field f = fields.get(k);
            double v = values[index * fields.size() + k];
            if (f != Field.SKIP && (Double.isNaN(v) || Math.abs(v) >= NO_VALUE_THRESHOLD)) {
                return null;
            }
            switch (f) {
                case REAL -> real = v;
                case IMAG -> imag = v;
                case MAGNITUDE -> { magnitude = v; polar = true; }
                case PHASE_DEG -> phaseRad = Math.toRadians(v);
                case PHASE_RAD -> phaseRad = v;
                case SKIP -> { }
                default -> throw new IllegalStateException(f.toString());
            }
        }
        return polar ? new double[] {magnitude * Math.cos(phaseRad), magnitude * Math.sin(phaseRad)}
                : new double[] {real, imag};
    }
}
