package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Exit codes of {@code zweep run} and {@code zweep measure}, and refusals before anything is sent. */
class RunCommandIT {
    static final Path SEQ = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");

    @TempDir
    Path dir;

    String sim() {
        return "sim:" + Sims.benchOf(SEQ) + "?timing=none";
    }

    /** A copy of the capacitor sequence, next to its bench, with {@code from} replaced by {@code to}. */
    Path variant(String from, String to) throws Exception {
        String text = Files.readString(SEQ);
        assertTrue(text.contains(from), from);
        Path seq = SEQ.resolveSibling("it-" + Math.abs((from + to).hashCode()) + ".yaml");
        Path copy = dir.resolve(seq.getFileName());
        Files.writeString(copy, text.replace(from, to).replace("benches/", Sims.sequences() + "/benches/"));
        return copy;
    }

    @Test
    void failedCheckGivesExitCode1() throws Exception {
        // Cs of the 100 nF part cannot lie within 1 % of 200 nF
        Path seq = variant("nominal: 100 nF", "nominal: 200 nF");
        Sims.Result r = Sims.zweep("run", seq.toString(), "--meter", sim(), "--dialect", Sims.dialect(), "--out",
                dir.resolve("out").toString(), "--quiet");
        assertEquals(1, r.code(), r.out() + r.err());
        assertTrue(r.out().contains("capacitance-1khz") && r.out().contains(": fail"), r.out());
        assertTrue(r.out().contains("verdict: fail"), r.out());
    }

    @Test
    void invalidSequenceGivesExitCode2AndOneLine() throws Exception {
        Path seq = variant("averaging: 2", "averagin: 2");
        Sims.Result r = Sims.zweep("run", seq.toString(), "--meter", sim(), "--out", dir.resolve("out").toString());
        assertEquals(2, r.code(), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
        assertTrue(r.err().startsWith("zweep: " + seq + ":"), r.err());
        assertFalse(Files.exists(dir.resolve("out")), "no run folder for an invalid sequence");
    }

    @Test
    void biasOverTheSafetyLimitIsRefusedBeforeAnyCommandIsSent() throws Exception {
        Path seq = variant("max_bias_voltage: 25 V", "max_bias_voltage: 20 V");
        Path trace = dir.resolve("trace.txt");
        Sims.Result r = Sims.zweep("run", seq.toString(), "--meter", sim(), "--dialect", Sims.dialect(), "--out",
                dir.resolve("out").toString(), "--trace", trace.toString());
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().contains("bias-derating"), r.err());
        assertTrue(!Files.exists(trace) || Files.readAllLines(trace).stream().noneMatch(l -> l.startsWith(">")),
                "the traffic trace holds no command");
    }

    @Test
    void meterThatCannotBeReachedGivesExitCode3() {
        Sims.Result r = Sims.zweep("run", SEQ.toString(), "--meter", "tcp://127.0.0.1:1", "--out",
                dir.resolve("out").toString(), "--quiet", "--timeout", "1");
        assertEquals(3, r.code(), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
    }

    @Test
    void unreachableMeterLeavesNoHalfMadeRunFolderSoTheSameOutWorksAgain() {
        Path out = dir.resolve("out");
        for (int attempt = 0; attempt < 2; attempt++) {
            Sims.Result r = Sims.zweep("run", SEQ.toString(), "--meter", "tcp://127.0.0.1:1", "--out", out.toString(),
                    "--quiet", "--timeout", "1");
            assertEquals(3, r.code(), r.err());
            assertTrue(r.err().contains("connection refused"), "attempt " + attempt + ": " + r.err());
            assertFalse(Files.exists(out), "nothing measured, so no run folder is left behind");
        }
    }

    @Test
    void settingTheMeterCannotDoIsRefusedWithExitCode2AndNoRunFolder() throws Exception {
        // the standard dialect's frequency range ends at 20 MHz (standard.yaml [capabilities])
        Path seq = variant("stop: 20 MHz", "stop: 30 MHz");
        Path out = dir.resolve("out");
        Sims.Result r = Sims.zweep("run", seq.toString(), "--meter", sim(), "--dialect", Sims.dialect(), "--out",
                out.toString(), "--quiet");
        assertEquals(2, r.code(), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
        assertFalse(Files.exists(out), "refused before the first point: no run folder");
    }

    @Test
    void runRefusedDuringCompensationPrintsNoRunFolderLineAndLeavesNoFolder() {
        // message 20 falls in the host-side OPEN standard's sweep (after identify, reset and setup)
        try (org.zweep.simulator.server.SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ),
                org.zweep.simulator.server.FaultPlan.parse("error=-222@20", 1))) {
            Path out = dir.resolve("out");
            Sims.Result r = Sims.zweep("run", SEQ.toString(), "--meter", Sims.address(server),
                    "--dialect", Sims.dialect(), "--quiet", "--out", out.toString());
            assertEquals(3, r.code(), r.out() + r.err());
            assertTrue(r.err().contains("-222"), r.err());
            assertFalse(r.out().contains("run folder:"), r.out());
            assertFalse(Files.exists(out), "refused before the first point: no run folder");
        }
    }

    @Test
    void resumeOfACompletedRunChangesNothing() {
        Path out = dir.resolve("done");
        assertEquals(0, Sims.zweep("run", SEQ.toString(), "--meter", sim(), "--dialect", Sims.dialect(), "--out",
                out.toString(), "--quiet").code());
        var before = Rows.of(out);
        Sims.Result r = Sims.zweep("run", "--resume", out.toString(), "--quiet");
        assertEquals(0, r.code(), r.err());
        assertEquals(before, Rows.of(out));
    }

    @Test
    void measureJsonUsesTheConvertNamesAndRecoversTheCapacitor() throws Exception {
        Sims.Result r = Sims.zweep("measure", sim(), "--frequency", "1kHz", "--level", "0.5V", "--dialect",
                Sims.dialect(), "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode n = new ObjectMapper().readTree(r.out());
        for (String k : new String[] {"frequency_hz", "r_ohm", "x_ohm", "z_ohm", "theta_deg", "q", "d", "cs_f", "cp_f",
            "ls_h", "lp_h", "rs_ohm", "rp_ohm"}) {
            assertTrue(n.has(k), k + " in " + r.out());
        }
        assertEquals(1000.0, n.get("frequency_hz").asDouble());
        // the bench's part is 100 nF (K, +-10 %): Cs at 1 kHz lies within the tolerance (IEC 60062 letter K)
        double cs = n.get("cs_f").asDouble();
        assertTrue(cs > 90e-9 && cs < 110e-9, "Cs = " + cs);
    }

    @Test
    void measureOverTheMetersBiasRangeGivesExitCode2() {
        Sims.Result r = Sims.zweep("measure", sim(), "--frequency", "1kHz", "--bias", "100V");
        assertEquals(2, r.code(), r.err());
    }

    @Test
    void measureRefusesBiasWithoutASafetyLimitAndBiasOverTheLimitBeforeAnythingIsSent() {
        Sims.Result r = Sims.zweep("measure", "tcp://127.0.0.1:1", "--frequency", "1kHz", "--bias", "2V");
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().contains("--bias needs a safety limit: give --max-bias-voltage"), r.err());
        // the unreachable address shows that nothing was even connected to
        r = Sims.zweep("measure", "tcp://127.0.0.1:1", "--frequency", "1kHz", "--bias", "30V", "--sequence",
                SEQ.toString());
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().contains("DC bias 30") && r.err().contains("exceeds the safety limit 25"), r.err());
        r = Sims.zweep("measure", "tcp://127.0.0.1:1", "--frequency", "1kHz", "--level", "0.8V", "--sequence",
                SEQ.toString(), "--max-level-voltage", "0.5V");
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().contains("drive level") && r.err().contains("exceeds the safety limit"), r.err());
    }

    @Test
    void measureRampsBiasUpAndDownAtTheGivenRateOnTheMetersSide() throws Exception {
        try (org.zweep.simulator.server.SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ),
                org.zweep.simulator.server.FaultPlan.none())) {
            server.instrument().setTiming(org.zweep.simulator.scpi.TimingModel.REAL);
            String address = Sims.address(server);
            Sims.Result r = Sims.zweep("measure", address, "--frequency", "1kHz", "--level", "0.5V", "--bias", "5V",
                    "--ramp", "10V/s", "--settle", "100ms", "--sequence", SEQ.toString(), "--json");
            assertEquals(0, r.code(), r.out() + r.err());
            assertEquals(5.0, new ObjectMapper().readTree(r.out()).get("bias").asDouble(), 0.0);
            BiasTrace t = BiasTrace.read(address);
            assertEquals(5.0, t.peak(false), 0.0);
            assertEquals(0.0, t.last().voltageV(), 0.0);
            assertTrue(Sims.biasOff(server));
            // 5 V at 10 V/s: 0.5 s each way in steps of 1 V (0.1 s); nothing faster than the ramp plus one step
            assertTrue(t.entries().size() >= 2 * 5, "ramped in steps: " + t);
            assertTrue(t.largestExcess(false, 10.0) <= 1.0 + 1e-9, "within the ramp: " + t);
        }
    }
}
