package org.zweep.runner.results;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Every sync mode hands each trigger's rows to the operating system before append returns. */
class PointsCsvWriterTest {
    @TempDir
    Path dir;

    private static List<Integer> points(Path f) {
        List<PointRow> rows = new ArrayList<>();
        PointsCsvReader.recover(f, rows::add);
        return rows.stream().map(PointRow::point).toList();
    }

    @Test
    void aSyncedRowIsInTheFileWhenAppendReturns() {
        // what a kill -9 right after append would leave: the file as the OS has it
        Path f = dir.resolve("points.csv");
        try (PointsCsvWriter w = PointsCsvWriter.open(f, PointsCsvWriter.Sync.EACH_ROW)) {
            for (int i = 0; i < 3; i++) {
                w.append(PointsCsvTest.row(i, "s", 1.0 + i, -100.0));
                assertEquals(i + 1, points(f).size(), "rows readable after append " + i);
            }
        }
        assertEquals(List.of(0, 1, 2), points(f));
    }

    @Test
    void aRowSyncedEachRowIsDurableWhenAppendReturns() throws Exception {
        // the power-cut promise the run engine builds on (see RowSync)
        Path f = dir.resolve("points.csv");
        try (PointsCsvWriter w = PointsCsvWriter.open(f, PointsCsvWriter.Sync.EACH_ROW)) {
            for (int i = 0; i < 5; i++) {
                w.append(PointsCsvTest.row(i, "s", 1.0 + i, -100.0));
                assertEquals(java.nio.file.Files.size(f), w.durableBytes(), "after append " + i);
            }
            w.close();
            assertEquals(java.nio.file.Files.size(f), w.durableBytes());
        }
    }

    @Test
    void theRowsOfOneTriggerReachTheSystemTogetherWithTheLast() {
        Path f = dir.resolve("points.csv");
        try (PointsCsvWriter w = PointsCsvWriter.open(f, PointsCsvWriter.Sync.EACH_ROW)) {
            w.append(PointsCsvTest.row(0, "s", 1.0, -100.0), false);
            w.append(PointsCsvTest.row(1, "s", 2.0, -100.0), false);
            assertEquals(List.of(), points(f));
            w.append(PointsCsvTest.row(2, "s", 3.0, -100.0), true);
            assertEquals(List.of(0, 1, 2), points(f));
        }
    }

    @Test
    void everyModeWritesTheSameFile() throws Exception {
        List<String> texts = new ArrayList<>();
        for (PointsCsvWriter.Sync mode : PointsCsvWriter.Sync.values()) {
            Path f = dir.resolve("points-" + mode + ".csv");
            try (PointsCsvWriter w = PointsCsvWriter.open(f, mode)) {
                for (int i = 0; i < 5; i++) {
                    w.append(PointsCsvTest.row(i, "s", 1.0 + i, -100.0), i % 2 == 0);
                }
            }
            texts.add(java.nio.file.Files.readString(f));
        }
        assertEquals(1, texts.stream().distinct().count(), "EACH_ROW and NONE files differ");
        assertEquals(List.of(0, 1, 2, 3, 4), points(dir.resolve("points-NONE.csv")));
    }
}
