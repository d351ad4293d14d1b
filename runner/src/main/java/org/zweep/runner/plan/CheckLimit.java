package org.zweep.runner.plan;

/**
 * A pass/fail limit on a derived parameter.
 *
 * @param name a label for the check, unique within the sequence
 * @param parameter the derived parameter, by its result column name ({@code cs_f}, {@code d},
 *     {@code ls_h}, {@code q}, {@code rs_ohm}, ...) or {@code srf_hz} for the self-resonant frequency
 * @param step the step it applies to, by name
 * @param frequencyHz the point it applies to, in Hz; {@code NaN} for a whole-sweep figure such as {@code srf_hz}
 * @param min the lowest passing value in SI units; {@code Double.NEGATIVE_INFINITY} for none
 * @param max the highest passing value in SI units; {@code Double.POSITIVE_INFINITY} for none
 */
public record CheckLimit(String name, String parameter, String step, double frequencyHz, double min, double max) {
    /** Whether {@code value} passes (limits included; NaN never passes). */
    public boolean passes(double value) {
        return value >= min && value <= max;
    }
}
