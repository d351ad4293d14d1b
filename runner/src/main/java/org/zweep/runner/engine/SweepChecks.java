package org.zweep.runner.engine;

import org.zweep.runner.results.RunFolder;
import org.zweep.runner.verdict.SweepFigures;

/**
 * The whole-sweep figures (such as {@code srf_hz} or {@code saturation}) of a finished run, found
 * from its folder; provided by the analysis, so the run and {@code zweep analyze} judge the same
 * figures.
 */
@FunctionalInterface
public interface SweepChecks {
    /** No figures: whole-sweep checks are left to {@code zweep analyze}. */
    SweepChecks NONE = folder -> SweepFigures.NONE;

    /** The figures of the run in {@code folder}. */
    SweepFigures figures(RunFolder folder);
}
