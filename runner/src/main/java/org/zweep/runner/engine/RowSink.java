package org.zweep.runner.engine;

import org.zweep.runner.results.PointRow;

/** Where the engine puts each finished row. */
@FunctionalInterface
public interface RowSink {
    /**
     * Takes one row (on the engine's writing thread, see {@link RunEngine}). When
     * {@code lastOfTrigger} is true the row, and every row before it, is handed to the operating
     * system and made durable before this returns. Rows of one list sweep arrive together and may
     * be synced once, with the last.
     */
    void write(PointRow row, boolean lastOfTrigger);
}
