package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.RunManifest;

/**
 * {@code zweep run --resume DIR} keeps to the choice the run was started with: a run started with
 * {@code --no-index} (recorded in {@code run.json}) is not indexed when its resume ends, unless the
 * resume says {@code --index}; a run started indexed is indexed again. The resumes are real
 * {@code zweep} processes; the run they resume is a completed one cut back as a kill leaves it.
 */
class ResumeKeepsIndexChoiceIT {
    @TempDir
    Path dir;

    private String zweep(String... args) throws Exception {
        Path log = Files.createTempFile(dir, "zweep", ".log");
        Process p = Children.zweep(log, args);
        assertTrue(p.waitFor(120, TimeUnit.SECONDS), "zweep did not end");
        String output = Files.readString(log);
        assertEquals(0, p.exitValue(), output);
        return output;
    }

    /** The folder as a {@code kill -9} after 20 points leaves it: 20 rows, outcome running, no end. */
    private static void cutBack(Path run) throws Exception {
        Path points = run.resolve("points.csv");
        List<String> lines = Files.readAllLines(points);
        Files.write(points, lines.subList(0, 21));
        Path manifest = run.resolve("run.json");
        RunManifest m = RunManifest.read(manifest);
        m.toBuilder().outcome("running").ended(null).verdict("none")
                .counts(new RunManifest.Counts(m.counts().planned(), 20)).build().write(manifest);
    }

    @Test
    void aRunStartedWithNoIndexIsNotIndexedWhenResumedUnlessTheResumeSaysIndex() throws Exception {
        Path db = dir.resolve("index.sqlite");
        Path run = dir.resolve("run");
        Sims.Result first = StoreFolders.measure(run, 3, "SN-1", "L-1", null); // --no-index
        assertEquals(0, first.code(), first.err());
        assertEquals(Boolean.FALSE, RunManifest.read(run.resolve("run.json")).index());

        cutBack(run);
        String plain = zweep("run", "--resume", run.toString(), "--quiet", "--db", db.toString());
        assertTrue(plain.contains("points: 66 of 66 measured (completed)"), plain);
        assertTrue(plain.contains("not indexed: the run was started with --no-index ('zweep index " + run
                + "' adds it)"), plain);
        assertFalse(plain.contains("indexed in:"), plain);
        assertFalse(Files.exists(db), "the index was not even opened");

        cutBack(run);
        String asked = zweep("run", "--resume", run.toString(), "--quiet", "--db", db.toString(), "--index");
        assertTrue(asked.contains("indexed in: " + db), asked);
        assertTrue(zweep("runs", "--db", db.toString()).contains("SN-1"));
    }

    @Test
    void aRunStartedIndexedIsIndexedWhenResumed() throws Exception {
        Path db = dir.resolve("index.sqlite");
        Path run = dir.resolve("run");
        Sims.Result first = StoreFolders.measure(run, 4, "SN-2", "L-1", db.toString());
        assertEquals(0, first.code(), first.err());
        assertEquals(Boolean.TRUE, RunManifest.read(run.resolve("run.json")).index());
        cutBack(run);
        String resumed = zweep("run", "--resume", run.toString(), "--quiet", "--db", db.toString());
        assertTrue(resumed.contains("indexed in: " + db), resumed);
    }

    @Test
    void aLotStartedWithNoIndexKeepsToItWhenResumed() throws Exception {
        Path seq = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");
        Path db = dir.resolve("index.sqlite");
        Path lot = dir.resolve("lot");
        Sims.Result first = Sims.zweep("lot", seq.toString(), "--lot", "L-2", "--count", "2", "--meter",
                "sim:" + Sims.benchOf(seq) + "?timing=none", "--out", lot.toString(), "--quiet", "--no-index");
        assertEquals(0, first.code(), first.out() + first.err());
        List<Path> parts;
        try (var s = Files.list(lot)) {
            parts = s.filter(Files::isDirectory).sorted().toList();
        }
        assertEquals(2, parts.size(), parts.toString());
        // part 1 killed after 20 points, part 2 not begun
        cutBack(parts.get(0));
        try (var s = Files.walk(parts.get(1))) {
            for (Path p : s.sorted(java.util.Comparator.reverseOrder()).toList()) {
                Files.delete(p);
            }
        }
        String resumed = zweep("lot", "--resume", lot.toString(), "--quiet", "--db", db.toString());
        assertTrue(resumed.contains("lot L-2 complete: 2 parts"), resumed);
        assertFalse(resumed.contains("indexed in:"), resumed);
        assertTrue(resumed.contains("not indexed: the lot was started with --no-index ('zweep index " + lot
                + "' adds its parts)"), resumed);
        assertFalse(Files.exists(db), "the index was not even opened");
        assertEquals(Boolean.FALSE, RunManifest.read(parts.get(1).resolve("run.json")).index(), "part 2, begun now");
    }
}
