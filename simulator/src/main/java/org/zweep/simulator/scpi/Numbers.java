package org.zweep.simulator.scpi;

import java.math.BigDecimal;

/** Response formatting per IEEE 488.2 §8.7 ("precise talker"). */
final class Numbers {
    /** SCPI-1999 Vol 1 §7.2.1.5: not-a-number, sent for a reading that has no value. */
    static final double NAN = 9.91e37;
    /** SCPI-1999 Vol 1 §7.2.1.4: infinity. */
    static final double INFINITY = 9.9e37;

    private Numbers() {
    }

    /**
     * NR3 with the shortest mantissa that reads back as the same double, e.g. {@code 1.0E+03},
     * {@code -2.5E-07}; {@code NaN} is sent as {@code 9.91E+37} and infinities as {@code ±9.9E+37}.
     */
    static String nr3(double v) {
        if (Double.isNaN(v)) {
            v = NAN;
        } else if (Double.isInfinite(v)) {
            v = v > 0 ? INFINITY : -INFINITY;
        }
        if (v == 0.0) {
            return "0.0E+00";
        }
        BigDecimal bd = new BigDecimal(Double.toString(Math.abs(v))).stripTrailingZeros();
        String digits = bd.unscaledValue().toString();
        int exp = digits.length() - 1 - bd.scale();
        StringBuilder b = new StringBuilder(24);
        if (v < 0) {
            b.append('-');
        }
        b.append(digits.charAt(0)).append('.');
        b.append(digits.length() > 1 ? digits.substring(1) : "0");
        b.append('E').append(exp < 0 ? '-' : '+');
        int a = Math.abs(exp);
        if (a < 10) {
            b.append('0');
        }
        return b.append(a).toString();
    }

    /** The value sent in a REAL,64 block or an ASCII reply for a reading with no value. */
    static double wire(double v) {
        if (Double.isNaN(v)) {
            return NAN;
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? INFINITY : -INFINITY;
        }
        return v;
    }
}
