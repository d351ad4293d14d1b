package org.zweep.runner.it;

import java.nio.file.Path;
import java.util.Map;
import java.util.TreeMap;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.PointsCsvReader;

/** Reads a run folder's rows keyed by point index, failing on a duplicate. */
final class Rows {
    private Rows() {
    }

    static Map<Integer, PointRow> of(Path runFolder) {
        Map<Integer, PointRow> m = new TreeMap<>();
        PointsCsvReader.recover(runFolder.resolve("points.csv"), r -> {
            if (m.put(r.point(), r) != null) {
                throw new AssertionError("point " + r.point() + " written twice in " + runFolder);
            }
        });
        return m;
    }

    /** The row without its arrival time (what must be identical between two runs with one seed). */
    static PointRow timeless(PointRow r) {
        return r.withTime(java.time.Instant.EPOCH);
    }
}
