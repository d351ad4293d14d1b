package org.zweep.runner.engine;

import java.util.function.Consumer;
import org.zweep.runner.results.RunManifest;

/** Gets a run's fixture compensation ready before its first point (see the compensation package). */
@FunctionalInterface
public interface FixtureCompensation {
    /** No compensation. */
    FixtureCompensation NONE = (station, resuming, log) -> new Prepared(ReadingCorrector.NONE,
            new RunManifest.CompensationInfo("none", java.util.List.of(), null));

    /**
     * What the run uses.
     *
     * @param corrector applied to every reading ({@link ReadingCorrector#NONE} unless host-side)
     * @param info the {@code run.json} record of it
     */
    record Prepared(ReadingCorrector corrector, RunManifest.CompensationInfo info) {
    }

    /**
     * Prepares compensation on {@code station}.
     *
     * @param resuming whether the run is being resumed
     * @param log one-line notes
     */
    Prepared prepare(Station station, boolean resuming, Consumer<String> log);
}
