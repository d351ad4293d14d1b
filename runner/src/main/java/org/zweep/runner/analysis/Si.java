package org.zweep.runner.analysis;

import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;

/**
 * Analysis figures for people ({@code 100 nF}, {@code 15.9 MHz}), formatted by the driver's
 * {@link Quantities#formatShort}, and the units of analysis parameter names. Stateless.
 */
public final class Si {
    private Si() {
    }

    /** {@code value} to at most 4 significant digits, trailing zeros dropped ({@code 1.5 kHz}); "—" when not finite. */
    public static String format(double value, Unit unit) {
        return format(value, unit, 4);
    }

    /** {@code value} to at most {@code digits} significant digits, trailing zeros dropped; "—" when not finite. */
    public static String format(double value, Unit unit, int digits) {
        return Double.isFinite(value) ? Quantities.formatShort(value, unit, digits) : "—";
    }

    /** A compact form for file names: no space, {@code u} for micro ({@code 10mA}, {@code 1V}, {@code 2.2uF}). */
    public static String compact(double value, Unit unit) {
        return format(value, unit, 6).replace(" ", "").replace("µ", "u");
    }

    /**
     * The unit a run folder names by its symbol ({@code V}, {@code A}, {@code F}, {@code Ω}, ...);
     * {@link Unit#NONE} for a symbol no unit has, so that the number is still shown.
     */
    public static Unit unitOfSymbol(String symbol) {
        return Unit.ofSymbol(symbol).orElse(Unit.NONE);
    }

    /** The unit of a parameter or column name by its suffix ({@code esl_h} → henry); {@link Unit#NONE} when none. */
    public static Unit unitOf(String key) {
        if (key.endsWith("_f")) {
            return Unit.FARAD;
        }
        if (key.endsWith("_h")) {
            return Unit.HENRY;
        }
        if (key.endsWith("_ohm")) {
            return Unit.OHM;
        }
        if (key.endsWith("_hz")) {
            return Unit.HERTZ;
        }
        if (key.endsWith("_deg")) {
            return Unit.DEGREE;
        }
        return Unit.NONE;
    }

    /**
     * The human label of a parameter or column name: {@code C}, {@code ESR}, {@code ESL},
     * {@code SRF} for the fitted capacitor, {@code Cs}, {@code Ls}, {@code D}... for the derived
     * parameters, {@code V2/V1} for the measured voltage ratio; the name itself when it has none.
     */
    public static String label(String key) {
        return switch (key) {
            case "c_f" -> "C";
            case "esr_ohm" -> "ESR";
            case "esl_h" -> "ESL";
            case "l_h" -> "L";
            case "r_ohm" -> "R";
            case "rcore_ohm" -> "Rcore (core loss)";
            case "tan_delta" -> "tan δ";
            case "srf_hz" -> "SRF";
            case "ratio" -> "V2/V1";
            case "leakage_h" -> "leakage L";
            case "mutual_h" -> "M";
            default -> java.util.Arrays.stream(org.zweep.driver.impedance.DerivedParameter.values())
                    .filter(p -> p.key().equals(key)).map(p -> p.label()).findFirst().orElse(key);
        };
    }

    /** A time for people, to the second, in UTC: {@code 2026-12-03 08:09:58 UTC}; "—" for null. */
    public static String time(java.time.Instant t) {
        return t == null ? "—" : TIME.format(t);
    }

    /** {@link #time(java.time.Instant)} of an ISO-8601 instant text, or the text itself when it is not one. */
    public static String time(String iso) {
        if (iso == null) {
            return "—";
        }
        try {
            return time(java.time.Instant.parse(iso));
        } catch (java.time.format.DateTimeParseException e) {
            return iso;
        }
    }

    private static final java.time.format.DateTimeFormatter TIME = java.time.format.DateTimeFormatter
            .ofPattern("yyyy-MM-dd HH:mm:ss 'UTC'", java.util.Locale.ROOT).withZone(java.time.ZoneOffset.UTC);
}
