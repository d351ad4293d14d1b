package org.zweep.runner.engine;

import org.zweep.runner.results.PointRow;

/** Hears how a run goes, to show progress. Called from the engine's thread. */
public interface ProgressListener {
    /** Shows nothing ({@code --quiet}). */
    ProgressListener QUIET = new ProgressListener() {
        @Override
        public void started(int total, int done) {
        }

        @Override
        public void measured(PointRow row, int done, int total) {
        }

        @Override
        public void note(String line) {
        }

        @Override
        public void finished() {
        }
    };

    /** The run starts with {@code done} of {@code total} points already on disk. */
    void started(int total, int done);

    /** A point was written; {@code done} of {@code total} are on disk now. */
    void measured(PointRow row, int done, int total);

    /** A one-line note for the operator (reconnects, prompts, warnings). */
    void note(String line);

    /** The run ended (for whatever reason); release the display. */
    void finished();
}
