package org.zweep.runner.engine;

import java.util.List;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.results.RunFolder;

/**
 * Evaluates the whole-sweep checks (such as {@code srf_hz}) of a finished run from its folder;
 * provided by the analysis.
 */
@FunctionalInterface
public interface SweepChecks {
    /** No evaluator: whole-sweep checks are left to {@code zweep analyze}. */
    SweepChecks NONE = (folder, checks) -> List.of();

    /**
     * The outcome of one whole-sweep check.
     *
     * @param limit the check
     * @param value the figure found ({@code NaN} when it could not be found)
     * @param passed whether it passed
     */
    record Outcome(CheckLimit limit, double value, boolean passed) {
    }

    /** The outcomes of {@code checks} (those it can evaluate) for the run in {@code folder}. */
    List<Outcome> evaluate(RunFolder folder, List<CheckLimit> checks);
}
