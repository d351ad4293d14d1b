package org.zweep.runner.export;

import java.util.List;
import java.util.Locale;
import org.zweep.driver.impedance.Impedance;

/**
 * Writes one-port Z-parameter Touchstone files (IBIS Open Forum Touchstone v1.1 and v2.0;
 * Touchstone File Format Specification). Frequencies in Hz, real-imaginary pairs. In v2.0 Z is in ohms (not
 * normalised) and the file carries {@code [Version]}, {@code [Number of Ports]},
 * {@code [Number of Frequencies]}, {@code [Network Data]} and {@code [End]}; in v1.1 Z is
 * normalised to the option line's R. Pure functions.
 */
public final class Touchstone {
    /** Touchstone versions written. */
    public enum Version {
        /** v1.1: option line first, Z normalised to R. */
        V1_1("1.1"),
        /** v2.0: keywords, Z in ohms. */
        V2_0("2.0");

        private final String label;

        Version(String label) {
            this.label = label;
        }

        /** {@code 1.1} or {@code 2.0}. */
        public String label() {
            return label;
        }

        /** The version for {@code 1.1} or {@code 2.0}; null for anything else. */
        public static Version of(String s) {
            for (Version v : values()) {
                if (v.label.equals(s.strip())) {
                    return v;
                }
            }
            return null;
        }
    }

    private Touchstone() {
    }

    /**
     * The file text for {@code points} (strictly increasing frequencies).
     *
     * @param comments lines written as {@code !} comments at the top
     * @param referenceOhm the option line's R (the normalisation in v1.1), positive
     * @throws IllegalArgumentException when frequencies are not strictly increasing or empty
     */
    public static String write(Version version, List<Impedance> points, List<String> comments, double referenceOhm) {
        if (points.isEmpty()) {
            throw new IllegalArgumentException("a Touchstone file needs at least one frequency");
        }
        for (int i = 1; i < points.size(); i++) {
            if (!(points.get(i).frequencyHz() > points.get(i - 1).frequencyHz())) {
                throw new IllegalArgumentException("Touchstone frequencies must be strictly increasing");
            }
        }
        StringBuilder b = new StringBuilder();
        for (String c : comments) {
            b.append("! ").append(c.replace('\n', ' ')).append('\n');
        }
        String option = "# Hz Z RI R " + java.math.BigDecimal.valueOf(referenceOhm).stripTrailingZeros().toPlainString() + "\n";
        double scale = 1;
        if (version == Version.V2_0) {
            b.append("[Version] 2.0\n").append(option).append("[Number of Ports] 1\n")
                    .append("[Number of Frequencies] ").append(points.size()).append('\n').append("[Network Data]\n");
        } else {
            b.append(option);
            scale = 1 / referenceOhm;
        }
        for (Impedance z : points) {
            b.append(number(z.frequencyHz())).append(' ').append(number(z.resistanceOhm() * scale)).append(' ')
                    .append(number(z.reactanceOhm() * scale)).append('\n');
        }
        if (version == Version.V2_0) {
            b.append("[End]\n");
        }
        return b.toString();
    }

    private static String number(double v) {
        return String.format(Locale.ROOT, "%.12E", v);
    }
}
