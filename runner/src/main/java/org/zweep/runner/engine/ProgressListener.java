package org.zweep.runner.engine;

import org.zweep.runner.results.PointRow;

/**
 * Hears how a run goes, to show progress. {@link #measured} comes from the engine's writing thread,
 * in the order the points are written, and so may overlap a {@link #note} or {@link #work} from the
 * thread running the engine (a reconnect, a bias ramp): implementations must be thread-safe. Every
 * method does nothing by default.
 */
public interface ProgressListener {
    /** Shows nothing ({@code --quiet}). */
    ProgressListener QUIET = new ProgressListener() {
    };

    /** The run starts with {@code done} of {@code total} points already on disk. */
    default void started(int total, int done) {
    }

    /** A point was written; {@code done} of {@code total} are on disk now. */
    default void measured(PointRow row, int done, int total) {
    }

    /**
     * A piece of work without points of its own begins (a compensation standard, a bias ramp),
     * expected to take {@code expectedS} seconds; it lasts until the next event.
     */
    default void work(String what, double expectedS) {
    }

    /** A one-line note for the operator (reconnects, prompts, warnings). */
    default void note(String line) {
    }

    /** The run ended (for whatever reason); release the display. */
    default void finished() {
    }
}
