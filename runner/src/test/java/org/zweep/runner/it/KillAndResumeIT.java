package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.sequence.SequenceLoader;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.SimulatorServer;

/**
 * A child JVM runs {@code zweep run}; it is killed hard (or sent Ctrl-C / SIGTERM) in the middle,
 * the folder is resumed, and the points must be exactly those of an uninterrupted run with the
 * same seed.
 */
class KillAndResumeIT {
    static final Path SEQ = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");

    @TempDir
    Path dir;

    /** Starts {@code zweep run} in a child JVM with default signal dispositions (see {@link Children}). */
    static Process child(Path out, String meter) throws Exception {
        return Children.zweep(out.resolveSibling(out.getFileName() + ".log"), "run", SEQ.toString(), "--meter", meter,
                "--dialect", Sims.dialect(), "--out", out.toString(), "--seed", "7", "--quiet");
    }

    /** Waits until the folder holds at least {@code rows} complete rows (bias step under way). */
    static void awaitRows(Path out, int rows, Process p) throws Exception {
        long end = System.nanoTime() + Duration.ofSeconds(60).toNanos();
        Path csv = out.resolve("points.csv");
        while (System.nanoTime() < end) {
            if (!p.isAlive()) {
                throw new AssertionError("child ended early with " + p.exitValue() + ": "
                        + Files.readString(out.resolveSibling(out.getFileName() + ".log")));
            }
            if (Files.exists(csv) && Files.readAllLines(csv).size() - 1 >= rows) {
                return;
            }
            Thread.sleep(20);
        }
        throw new AssertionError("no " + rows + " rows within 60 s");
    }

    Map<Integer, PointRow> uninterrupted() {
        Path ref = dir.resolve("reference");
        Sims.Result r = Sims.zweep("run", SEQ.toString(), "--meter", "sim:" + Sims.benchOf(SEQ) + "?timing=none",
                "--dialect", Sims.dialect(), "--out", ref.toString(), "--seed", "7", "--quiet");
        assertEquals(0, r.code(), r.err());
        return Rows.of(ref);
    }

    static void assertSamePoints(Map<Integer, PointRow> expected, Map<Integer, PointRow> actual) {
        assertEquals(expected.keySet(), actual.keySet());
        for (Integer k : expected.keySet()) {
            assertEquals(Rows.timeless(expected.get(k)), Rows.timeless(actual.get(k)), "point " + k);
        }
    }

    @Test
    void killedHardMidRunAndResumedGivesExactlyThePointsOfAnUninterruptedRun() throws Exception {
        Path out = dir.resolve("killed");
        // real timing, so the bias-derating step (2 V/s ramp, 0.5 s settle) takes seconds
        Process p = child(out, "sim:" + Sims.benchOf(SEQ));
        awaitRows(out, 54, p);
        p.destroyForcibly().waitFor(10, TimeUnit.SECONDS);
        int before = Rows.of(out).size();
        assertTrue(before < SequenceLoader.load(SEQ).points().size(), "killed before the end: " + before + " rows");
        // a kill keeps every row the operating system had (the point in progress and the one whose row
        // was being written are measured again on resume)
        assertTrue(before >= 54, "rows seen before the kill are kept: " + before);
        assertEquals("running", RunManifest.read(out.resolve("run.json")).outcome());

        Sims.Result r = Sims.zweep("run", "--resume", out.toString(), "--meter",
                "sim:" + Sims.benchOf(SEQ) + "?timing=none", "--dialect", Sims.dialect(), "--quiet");
        assertEquals(0, r.code(), r.out() + r.err());
        assertSamePoints(uninterrupted(), Rows.of(out));
        RunManifest m = RunManifest.read(out.resolve("run.json"));
        assertEquals("completed", m.outcome());
        assertEquals(7L, m.seed());
    }

    /** Runs the child against a TCP simulator with real timing, signals it mid bias step, returns its exit code. */
    int signalledMidRun(Path out, boolean ctrlC) throws Exception {
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.none())) {
            // host-side waits are real only when the simulator's timing is real: use it
            server.instrument().setTiming(org.zweep.simulator.scpi.TimingModel.REAL);
            Process p = child(out, Sims.address(server));
            awaitRows(out, 55, p);
            Children.signal(p, ctrlC ? "INT" : "TERM"); // SIGTERM: JVM shutdown hooks run
            assertTrue(p.waitFor(30, TimeUnit.SECONDS), "child stopped");
            assertTrue(Sims.biasOff(server), "bias off on the simulator after the signal");
            RunManifest m = RunManifest.read(out.resolve("run.json"));
            assertTrue(m.counts().measured() < SequenceLoader.load(SEQ).points().size(), "stopped before the end");
            assertEquals(m.counts().measured(), Rows.of(out).size(), "every measured point is on disk");
            return p.exitValue();
        }
    }

    @Test
    void ctrlCStopsAfterThePointInProgressWithBiasOffAndLeavesAResumableRun() throws Exception {
        Path out = dir.resolve("interrupted");
        assertEquals(130, signalledMidRun(out, true), Files.readString(dir.resolve("interrupted.log")));
        RunManifest m = RunManifest.read(out.resolve("run.json"));
        assertEquals("aborted", m.outcome());
        Sims.Result r = Sims.zweep("run", "--resume", out.toString(), "--meter",
                "sim:" + Sims.benchOf(SEQ) + "?timing=none", "--dialect", Sims.dialect(), "--quiet");
        assertEquals(0, r.code(), r.out() + r.err());
        assertSamePoints(uninterrupted(), Rows.of(out));
    }

    @Test
    void terminationSignalTurnsBiasOffOnTheSimulatorBeforeTheJvmExits() throws Exception {
        signalledMidRun(dir.resolve("terminated"), false);
    }
}
