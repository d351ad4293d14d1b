package org.zweep.runner.analysis;

import java.util.List;

/**
 * The result of one check of the run's manifest.
 *
 * @param name the check's name
 * @param parameter the parameter checked (a {@code points.csv} column, {@code srf_hz}, a fitted
 *     parameter such as {@code esr_ohm}, or a transformer figure such as {@code k})
 * @param step the step it applies to
 * @param frequencyHz the point's frequency; NaN for whole-sweep figures
 * @param min the lowest passing value; NaN for none
 * @param max the highest passing value; NaN for none
 * @param values the values checked (one per reading, or the one figure); empty when none was found
 * @param passed whether every value is within the limits (false when there is no value)
 * @param note why it failed without a value, or empty
 */
public record CheckOutcome(String name, String parameter, String step, double frequencyHz, double min, double max,
        List<Double> values, boolean passed, String note) {
    public CheckOutcome {
        values = List.copyOf(values);
    }

    /** {@code pass} or {@code fail}. */
    public String result() {
        return passed ? "pass" : "fail";
    }
}
