package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.PointRow;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Random link faults a run survives unattended, with exactly the points of the uninterrupted run
 * of the same seed. A few seeds here; {@code bench/.../FaultSurvivalCheck} runs 100 per shipped
 * sequence for the figures in README.
 */
class FaultSurvivalIT {
    @TempDir
    Path dir;

    Sims.Result run(Path seq, SimulatorServer server, Path out, long seed) {
        return Sims.zweep("run", seq.toString(), "--meter", Sims.address(server), "--dialect",
                Sims.dialect(), "--out", out.toString(), "--seed", Long.toString(seed), "--timeout", "1", "--quiet");
    }

    @ParameterizedTest(name = "{0} {1} seed {2}")
    @CsvSource({
        // garbled replies, some of which still read as numbers: never stored as a point
        "incoming-kp-c0805-104.yaml, garble@~0.03, 1", "incoming-kp-c0805-104.yaml, garble@~0.03, 2",
        "characterise-kp-l1210-100.yaml, garble@~0.03, 3",
        // random drops: each reconnect is a new draw, so the run goes on; seed 4 drops the capacitor's
        // link again and again in 25 V bias ramps (the bias is held, the ramp goes on)
        "incoming-kp-c0805-104.yaml, drop-random=0.02, 4", "transformer-kp-t2010.yaml, drop-random=0.02, 4",
        "characterise-kp-l1210-100.yaml, drop-random=0.02, 5",
        // a reply later than the timeout: timed out, reconnected, repeated
        "incoming-kp-c0805-104.yaml, delay=2@~0.005, 6"})
    void runWithRandomFaultsCompletesUnattendedWithThePointsOfTheUninterruptedRun(String sequence, String fault,
            long seed) {
        Path seq = Sims.sequences().resolve(sequence);
        Path ref = dir.resolve("reference");
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(seq), FaultPlan.none())) {
            Sims.Result r = run(seq, server, ref, seed);
            assertEquals(0, r.code(), r.err());
        }
        Path out = dir.resolve("faulty");
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(seq), FaultPlan.parse(fault, seed))) {
            Sims.Result r = run(seq, server, out, seed);
            assertEquals(0, r.code(), r.out() + r.err());
        }
        Map<Integer, PointRow> expected = Rows.of(ref);
        Map<Integer, PointRow> actual = Rows.of(out);
        assertEquals(expected.keySet(), actual.keySet(), "nothing lost or duplicated");
        for (Integer k : expected.keySet()) {
            assertEquals(Rows.timeless(expected.get(k)), Rows.timeless(actual.get(k)), "point " + k);
        }
    }
}
