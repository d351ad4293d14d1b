package org.zweep.runner.sequence;

import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;

/**
 * The two source forms written as text, wherever they come from (a sequence field, a
 * {@code zweep measure} option): a drive level or DC bias in V or A, whose written unit decides
 * whether the source is a voltage or a current, and a ramp rate in V/s or A/s. Refusals are
 * {@link InvalidInputException}s saying what was expected; the caller adds where.
 */
public final class SourceValues {
    private SourceValues() {
    }

    /**
     * A value in SI units and the unit it was written in.
     *
     * @param si the value in V or A
     * @param unit {@link Unit#VOLT} or {@link Unit#AMPERE}
     */
    public record Value(double si, Unit unit) {
    }

    /**
     * A source value in V or A ({@code 0.5V}, {@code 100 mA}).
     *
     * @param kind what the value is, for the message ({@code "a drive level"})
     * @param only when not {@code null}, the one unit accepted (the unit of earlier values)
     * @param bound what the number must satisfy
     */
    public static Value parse(String text, String kind, Unit only, Unit.Bound bound) {
        Unit unit = text.endsWith("V") ? Unit.VOLT : text.endsWith("A") ? Unit.AMPERE : null;
        if (unit == null || (only != null && unit != only)) {
            String expected = only == null ? "V or A" : only.symbol();
            throw new InvalidInputException("expected " + kind + " in " + expected + ", got '" + text + "'");
        }
        return new Value(Quantities.parse(text, unit, bound), unit);
    }

    /** A ramp rate in {@code unit}/s ({@code 1 V/s}, {@code 500 mA/s}), above zero, in {@code unit} per second. */
    public static double ratePerS(String text, Unit unit) {
        String per = unit.symbol() + "/s";
        if (!text.endsWith(per)) {
            throw new InvalidInputException("expected a ramp rate in " + per + ", got '" + text + "'");
        }
        try {
            return Quantities.parse(text.substring(0, text.length() - 2), unit, Unit.Bound.POSITIVE);
        } catch (InvalidInputException e) {
            throw new InvalidInputException("expected a ramp rate above zero in " + per + ", got '" + text + "'");
        }
    }
}
