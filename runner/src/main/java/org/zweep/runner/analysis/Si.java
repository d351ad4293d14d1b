package org.zweep.runner.analysis;

import java.util.Locale;

/** Formats SI values with prefixes for people: {@code 100 nF}, {@code 15.9 MHz}. */
public final class Si {
    private static final String[] PREFIX = {"a", "f", "p", "n", "µ", "m", "", "k", "M", "G", "T"};

    private Si() {
    }

    /** {@code value} with an SI prefix and {@code unit}, to 4 significant digits ({@code 1.5 kHz}); "—" for NaN. */
    public static String format(double value, String unit) {
        return format(value, unit, 4);
    }

    /** {@code value} with an SI prefix and {@code unit}, to {@code digits} significant digits. */
    public static String format(double value, String unit, int digits) {
        if (!Double.isFinite(value)) {
            return "—";
        }
        if (value == 0) {
            return "0 " + unit;
        }
        int e = (int) Math.floor(Math.log10(Math.abs(value)) / 3);
        e = Math.max(-6, Math.min(4, e));
        java.math.BigDecimal scaled = new java.math.BigDecimal(value / Math.pow(1000, e))
                .round(new java.math.MathContext(digits));
        if (scaled.abs().compareTo(java.math.BigDecimal.valueOf(1000)) >= 0 && e < 4) {
            e++;
            scaled = new java.math.BigDecimal(value / Math.pow(1000, e)).round(new java.math.MathContext(digits));
        }
        String num = scaled.stripTrailingZeros().toPlainString();
        return num + " " + PREFIX[e + 6] + unit;
    }

    /** A compact form for file names: no space, {@code u} for micro ({@code 10mA}, {@code 1V}, {@code 2.2uF}). */
    public static String compact(double value, String unit) {
        return format(value, unit, 6).replace(" ", "").replace("µ", "u");
    }

    /** {@code value} as a plain number with {@code digits} significant digits (Locale.ROOT). */
    static String plain(double value, int digits) {
        return String.format(Locale.ROOT, "%." + digits + "g", value);
    }

    /** The SI unit of a parameter or column name by its suffix ({@code esl_h} → {@code H}); empty when none. */
    public static String unitOf(String key) {
        if (key.endsWith("_f")) {
            return "F";
        }
        if (key.endsWith("_h")) {
            return "H";
        }
        if (key.endsWith("_ohm")) {
            return "Ω";
        }
        if (key.endsWith("_hz")) {
            return "Hz";
        }
        if (key.endsWith("_deg")) {
            return "°";
        }
        return "";
    }
}
