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
}
