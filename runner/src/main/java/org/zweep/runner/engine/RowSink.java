package org.zweep.runner.engine;

import org.zweep.runner.results.PointRow;

/** Where the engine puts each finished row. */
@FunctionalInterface
public interface RowSink {
    /**
     * Takes one row; it is handed to the operating system before this returns. When
     * {@code lastOfTrigger} is true the row (and every row before it) is made durable: at the latest
     * before the next call returns, so while the next point is measured, never later than the
     * trigger after it. Rows of one list sweep arrive together and may be synced once, with the last.
     */
    void write(PointRow row, boolean lastOfTrigger);
}
