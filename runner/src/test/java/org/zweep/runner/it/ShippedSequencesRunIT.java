package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.stream.Stream;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.PointsCsvReader;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.sequence.SequenceLoader;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.SimulatorServer;

/** Every shipped sequence, run end to end on the in-process and on the TCP simulator (timing none). */
class ShippedSequencesRunIT {
    @TempDir
    Path dir;

    static Stream<Path> sequences() {
        return Sims.shippedSequences().stream();
    }

    static void assertCompleteRun(Path seq, Path out, Sims.Result r) {
        assertEquals(0, r.code(), "exit code; stdout:\n" + r.out() + "\nstderr:\n" + r.err());
        int planned = SequenceLoader.load(seq).points().size();
        List<PointRow> rows = new ArrayList<>();
        PointsCsvReader.recover(out.resolve("points.csv"), rows::add);
        assertEquals(planned, rows.size());
        Set<Integer> indices = new HashSet<>();
        rows.forEach(row -> indices.add(row.point()));
        assertEquals(planned, indices.size(), "no point duplicated");
        RunManifest m = RunManifest.read(out.resolve("run.json"));
        assertEquals("completed", m.outcome());
        assertEquals(planned, m.counts().measured());
        assertTrue(Files.isRegularFile(out.resolve("sequence.yaml")));
        assertTrue(r.out().contains("verdict: pass"), r.out());
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("sequences")
    void runsCompletelyOnTheInProcessSimulator(Path seq) {
        Path out = dir.resolve("run");
        Sims.Result r = Sims.zweep("run", seq.toString(), "--meter", "sim:" + Sims.benchOf(seq) + "?timing=none",
                "--dialect", Sims.dialect(), "--out", out.toString(), "--quiet");
        assertCompleteRun(seq, out, r);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("sequences")
    void runsCompletelyOnTheTcpSimulatorAndLeavesBiasOff(Path seq) {
        Path out = dir.resolve("run");
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(seq), FaultPlan.none())) {
            Sims.Result r = Sims.zweep("run", seq.toString(), "--meter", Sims.address(server),
                    "--dialect", Sims.dialect(), "--out", out.toString(), "--quiet");
            assertCompleteRun(seq, out, r);
            assertTrue(Sims.biasOff(server), "the simulator's own bias state is off");
        }
    }
}
