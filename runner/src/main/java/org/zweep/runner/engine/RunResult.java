package org.zweep.runner.engine;

import java.util.List;

/**
 * How a run of the engine ended.
 *
 * @param outcome completed, aborted (stopped on request, resumable) or failed
 * @param planned the points planned
 * @param measured the points on disk now (including those measured before a resume)
 * @param problems one line per step stopped by a meter error, or the reason the run failed
 */
public record RunResult(Outcome outcome, int planned, int measured, List<String> problems) {
    public RunResult {
        problems = List.copyOf(problems);
    }

    /** How a run ended. */
    public enum Outcome {
        /** Every point measured. */
        COMPLETED,
        /** Stopped on request (Ctrl-C, termination); resumable. */
        ABORTED,
        /** Stopped by a meter error or a lost link; resumable. */
        FAILED;

        /** The {@code run.json} word for it. */
        public String word() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }
}
