package org.zweep.runner.verdict;

import org.zweep.driver.impedance.Unit;
import org.zweep.runner.plan.CheckLimit;

/**
 * The whole-sweep figures a check may name ({@code srf_hz}, {@code saturation}, fitted and
 * transformer figures), found by the analysis from the whole run.
 */
@FunctionalInterface
public interface SweepFigures {
    /** No figures: whole-sweep checks are not evaluated. */
    SweepFigures NONE = c -> null;

    /**
     * A figure found, or not.
     *
     * @param value the figure in SI units; NaN when the data do not resolve it
     * @param unit its unit
     * @param note why it is NaN, or how it was found; may be empty
     */
    record Figure(double value, Unit unit, String note) {
    }

    /** The figure {@code check} judges; null when this source does not evaluate it. */
    Figure figure(CheckLimit check);
}
