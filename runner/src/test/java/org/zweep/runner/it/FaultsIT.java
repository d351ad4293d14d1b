package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.SimulatorServer;

/** Faults injected by the TCP simulator mid-sweep: dropped links, stalls, meter errors, no meter. */
class FaultsIT {
    static final Path SEQ = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");

    @TempDir
    Path dir;
    Map<Integer, PointRow> reference;

    @BeforeEach
    void referenceRun() {
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.none())) {
            Sims.Result r = run(server, dir.resolve("reference"));
            assertEquals(0, r.code(), r.err());
            reference = Rows.of(dir.resolve("reference"));
        }
    }

    static Sims.Result run(SimulatorServer server, Path out, String... extra) {
        String[] base = {"run", SEQ.toString(), "--meter", Sims.address(server), "--dialect",
            Sims.dialect(), "--out", out.toString(), "--seed", "11", "--timeout", "1"};
        String[] all = new String[base.length + extra.length];
        System.arraycopy(base, 0, all, 0, base.length);
        System.arraycopy(extra, 0, all, base.length, extra.length);
        return Sims.zweep(all);
    }

    void assertSameAsReference(Path out) {
        Map<Integer, PointRow> rows = Rows.of(out);
        assertEquals(reference.keySet(), rows.keySet(), "nothing lost or duplicated");
        for (Integer k : rows.keySet()) {
            assertEquals(Rows.timeless(reference.get(k)), Rows.timeless(rows.get(k)), "point " + k);
        }
    }

    @Test
    void droppedLinksMidSweepAreReconnectedAndTheRunCompletesWithTheSamePoints() {
        // every connection is dropped after its 200th message (more than a 0 -> 25 V ramp needs):
        // several drops during the run, one in the bias ramp
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.parse("drop@200", 1))) {
            Path out = dir.resolve("dropped");
            Sims.Result r = run(server, out);
            assertEquals(0, r.code(), r.out() + r.err());
            assertTrue(r.out().contains("reconnected to " + Sims.address(server)), r.out());
            assertSameAsReference(out);
            assertTrue(Sims.biasOff(server), "bias off on the simulator");
        }
    }

    @Test
    void stalledRepliesTimeOutAreReconnectedAndTheRunCompletesWithTheSamePoints() {
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.parse("stall@250", 1))) {
            Path out = dir.resolve("stalled");
            Sims.Result r = run(server, out);
            assertEquals(0, r.code(), r.out() + r.err());
            assertSameAsReference(out);
            assertTrue(Sims.biasOff(server), "bias off on the simulator");
        }
    }

    @Test
    void meterReportedErrorStopsTheStepShowsTheMetersCodeAndTextAndBiasIsOff() {
        // message 230 falls in the bias-derating step (after the standards and the sweep)
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.parse("error=-222@230", 1))) {
            Path out = dir.resolve("error");
            Sims.Result r = run(server, out);
            assertEquals(3, r.code(), r.out() + r.err());
            assertTrue(r.err().contains("-222") && r.err().contains("Data out of range"), r.err());
            assertTrue(r.err().contains("step 'bias-derating' stopped"), r.err());
            assertTrue(Sims.biasOff(server), "bias off on the simulator after the meter error");
            assertEquals("failed", RunManifest.read(out.resolve("run.json")).outcome());
        }
    }

    @Test
    void linkThatStaysDownGivesUpAfterTheBudgetWithExitCode3AndAResumableFolder() {
        Path out = dir.resolve("gone");
        SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.parse("drop@150", 1));
        Sims.Result r;
        try {
            // the server goes away for good at the first drop: stop it from a watcher thread
            Thread watcher = new Thread(() -> {
                try {
                    while (!Files.exists(out.resolve("points.csv")) || Files.readAllLines(out.resolve("points.csv"))
                            .size() < 2) {
                        Thread.sleep(5);
                    }
                } catch (Exception e) {
                    return;
                }
                server.close();
            });
            watcher.start();
            r = run(server, out, "--reconnect-budget", "1");
        } finally {
            server.close();
        }
        assertEquals(3, r.code(), r.out() + r.err());
        assertTrue(r.err().contains("could not reconnect"), r.err());
        assertTrue(r.err().contains("zweep run --resume " + out), r.err());
        assertEquals("failed", RunManifest.read(out.resolve("run.json")).outcome());
    }
}
