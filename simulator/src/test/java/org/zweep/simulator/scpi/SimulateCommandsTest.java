package org.zweep.simulator.scpi;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.io.TempDir;
import java.util.Arrays;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.FixtureSlot;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.bench.Wiring;

/** The SIMulate subsystem on the physics bench: slot, wiring, seed, devices and bench files. */
class SimulateCommandsTest {
    private static final Path BENCHES = Path.of("../sequences/benches");
    private final SimulatedBench bench = new SimulatedBench(
            BenchSpec.ofNetlist("R1 hi lo 100", "test").ideal().withTiming(Timing.NONE));
    private final Instrument in = new Instrument(bench, InstrumentOptions.defaults().withTiming(TimingModel.NONE)
            .withBenchLoader(BenchLoader.simulated(true, TimingModel.NONE, List.of(BENCHES))));
    private final Session s = in.openSession(Session.Hooks.NONE);

    @AfterEach
    void close() {
        in.close();
    }

    private String send(String m) {
        byte[] r = s.execute(m.getBytes(StandardCharsets.US_ASCII));
        return r == null ? null : new String(r, 0, r.length - 1, StandardCharsets.US_ASCII);
    }

    private double[] read() {
        return Arrays.stream(send("READ?").split(",")).mapToDouble(Double::parseDouble).toArray();
    }

    private int nextError() {
        String e = send("SYST:ERR?");
        return Integer.parseInt(e.substring(0, e.indexOf(',')));
    }

    @Test
    void theSlotTheWindingAndTheSeedAreSetOnTheBench() {
        send("SIM:FIXT SHOR;:SIM:SEC SHORT;:SIM:SEED 1234");
        assertEquals(FixtureSlot.SHORT, bench.slot());
        assertEquals(Wiring.SECONDARY_SHORTED, bench.wiring());
        assertEquals(1234, bench.seed());
        assertEquals("SHOR;SHOR;1234", send("SIM:FIXT?;SEC?;SEED?"));
        send("SIM:FIXT DEVICE");
        assertEquals("DEV", send("SIM:FIXT:SLOT?"));
    }

    @Test
    void anIdealBenchReadsTheResistorItself() {
        double[] z = read();
        assertEquals(100, z[0], 1e-6); // --ideal: no residuals, no noise
        assertEquals(0, z[1], 1e-6);
    }

    @Test
    void aNetlistReplacesTheDeviceAndKeepsTheSlot() {
        send("SIM:DEV \"R1 hi mid 47\\nL1 mid lo 1m\"");
        assertEquals(0, nextError());
        double[] z = read();
        assertEquals(47, z[0], 1e-6);
        assertEquals(2 * Math.PI * 1000 * 1e-3, z[1], 1e-6); // X = ωL at the 1 kHz default, common practice
        send("SIM:DEV #210R1 hi lo 5");
        assertEquals(5, read()[0], 1e-6);
    }

    @Test
    void aBadNetlistOrAMissingBenchFileIsAnExecutionErrorAndChangesNothing() {
        send("SIM:DEV \"R1 hi\"");
        assertEquals(-200, nextError());
        send("SIM:BENC \"no/such/file.bench.yaml\"");
        assertEquals(-256, nextError());
        assertEquals(100, read()[0], 1e-6);
    }

    @Test
    void aBenchFileLoadsItsDevice() {
        send("SIM:BENC \"kp-c0805-104.bench.yaml\"");
        assertEquals(0, nextError());
        double[] z = read();
        assertTrue(z[1] < 0, "a capacitor reads a negative reactance (Z = R + jX, X_C = −1/(ωC)): " + z[1]);
        // 100 nF at 1 kHz: |X| ≈ 1/(2π·1e3·1e-7) ≈ 1592 Ω before derating, common practice
        assertTrue(Math.abs(z[1]) > 1000 && Math.abs(z[1]) < 3000, Double.toString(z[1]));
    }

    @Test
    void aBenchFileOutsideTheBenchFoldersIsNotFoundWhetherItExistsOrNot(@TempDir Path dir) throws IOException {
        // issue 17, item 7: SIMulate:BENCh read any file on the simulator's machine
        Path benches = Files.createDirectory(dir.resolve("benches"));
        Path outside = Files.createDirectory(dir.resolve("outside"));
        Files.writeString(outside.resolve("secret.bench.yaml"), "device: {resistor_ohm: 1}\n");
        Files.createSymbolicLink(benches.resolve("link.bench.yaml"), outside.resolve("secret.bench.yaml"));
        Instrument other = new Instrument(bench, InstrumentOptions.defaults().withTiming(TimingModel.NONE)
                .withBenchLoader(BenchLoader.simulated(true, TimingModel.NONE, List.of(benches))));
        try {
            Session o = other.openSession(Session.Hooks.NONE);
            for (String name : new String[] {"/etc/hostname", "/etc/no-such-file", "../outside/secret.bench.yaml",
                    outside.resolve("secret.bench.yaml").toString(), "link.bench.yaml"}) {
                o.execute(("SIM:BENC \"" + name + "\"").getBytes(StandardCharsets.US_ASCII));
                String text = new String(o.execute("SYST:ERR?".getBytes(StandardCharsets.US_ASCII)),
                        StandardCharsets.US_ASCII).strip();
                assertEquals("-256,\"File name not found;" + name + " is not a file in the bench folders\"", text, name);
            }
        } finally {
            other.close();
        }
        assertEquals(100, read()[0], 1e-6); // the bench is unchanged
    }

    @Test
    void aBenchWhoseNetlistFileLiesOutsideTheBenchFoldersIsRefused(@TempDir Path dir) throws IOException {
        Files.writeString(dir.resolve("evil.bench.yaml"), "device:\n  netlist_file: /etc/hostname\n");
        Instrument other = new Instrument(bench, InstrumentOptions.defaults().withTiming(TimingModel.NONE)
                .withBenchLoader(BenchLoader.simulated(true, TimingModel.NONE, List.of(dir))));
        try {
            Session o = other.openSession(Session.Hooks.NONE);
            o.execute("SIM:BENC \"evil.bench.yaml\"".getBytes(StandardCharsets.US_ASCII));
            byte[] e = o.execute("SYST:ERR?".getBytes(StandardCharsets.US_ASCII));
            String text = new String(e, StandardCharsets.US_ASCII);
            assertTrue(text.startsWith("-200,") && text.contains("netlist file '/etc/hostname' not found in the bench folders"),
                    text);
        } finally {
            other.close();
        }
    }

    @Test
    void withoutBenchFoldersSimulateBenchIsRefused() {
        Instrument other = new Instrument(bench, InstrumentOptions.defaults().withTiming(TimingModel.NONE)
                .withBenchLoader(BenchLoader.simulated(true, TimingModel.NONE)));
        try {
            Session o = other.openSession(Session.Hooks.NONE);
            o.execute("SIM:BENC \"kp-c0805-104.bench.yaml\"".getBytes(StandardCharsets.US_ASCII));
            String text = new String(o.execute("SYST:ERR?".getBytes(StandardCharsets.US_ASCII)), StandardCharsets.US_ASCII);
            assertTrue(text.startsWith("-200,") && text.contains("--bench-dir"), text);
        } finally {
            other.close();
        }
    }

    @Test
    void theSameTriggerGivesTheSameNoisyReadingOnAnyConnectionAndAnotherTriggerOtherNoise() {
        SimulatedBench noisy = new SimulatedBench(BenchSpec.ofNetlist("R1 hi lo 100", "test").withTiming(Timing.NONE));
        try (Instrument n = new Instrument(noisy, InstrumentOptions.defaults().withTiming(TimingModel.NONE))) {
            Session a = n.openSession(Session.Hooks.NONE);
            Session b = n.openSession(Session.Hooks.NONE);
            // a reading lost on the way is measured again, maybe on a new connection: the same noise
            String first = text(a.execute(":SOUR:FREQ 1000;:READ?".getBytes(StandardCharsets.US_ASCII)));
            String again = text(b.execute(":SOUR:FREQ 1000;:READ?".getBytes(StandardCharsets.US_ASCII)));
            assertEquals(first, again);
            // another setting, then the first again: a new measurement, new noise
            String other = text(b.execute(":SOUR:FREQ 2000;:READ?".getBytes(StandardCharsets.US_ASCII)));
            String second = text(a.execute(":SOUR:FREQ 1000;:READ?".getBytes(StandardCharsets.US_ASCII)));
            assertTrue(!first.equals(second), first + " / " + second);
            assertTrue(!first.equals(other), "another setting draws other noise");
            // what the fixture holds is part of the trigger
            a.execute(":SIM:FIXT OPEN".getBytes(StandardCharsets.US_ASCII));
            String open = text(a.execute(":SOUR:FREQ 2000;:READ?".getBytes(StandardCharsets.US_ASCII)));
            assertTrue(!open.equals(other), open);
        }
        // a fresh meter with the same seed gives the same readings for the same triggers
        try (Instrument n = new Instrument(new SimulatedBench(BenchSpec.ofNetlist("R1 hi lo 100", "test")
                        .withTiming(Timing.NONE)), InstrumentOptions.defaults().withTiming(TimingModel.NONE));
                Instrument m = new Instrument(new SimulatedBench(BenchSpec.ofNetlist("R1 hi lo 100", "test")
                        .withTiming(Timing.NONE)), InstrumentOptions.defaults().withTiming(TimingModel.NONE))) {
            Session a = n.openSession(Session.Hooks.NONE);
            Session b = m.openSession(Session.Hooks.NONE);
            for (String cmd : new String[] {":SOUR:FREQ 1000;:READ?", ":SOUR:FREQ 2000;:READ?", ":SOUR:FREQ 1000;:READ?"}) {
                assertEquals(text(a.execute(cmd.getBytes(StandardCharsets.US_ASCII))),
                        text(b.execute(cmd.getBytes(StandardCharsets.US_ASCII))), cmd);
            }
        }
    }

    private static String text(byte[] b) {
        return new String(b, StandardCharsets.US_ASCII);
    }

    @Test
    void theTimingModelCanBeSwitched() {
        send("SIM:TIM REAL");
        assertEquals("REAL", send("SIM:TIM?"));
        send("SIM:TIM NONE");
        assertEquals("NONE", send("SIM:TIM?"));
    }

    @Test
    void theBiasHistoryRecordsEachChangeOfTheAppliedBiasWithItsTime() {
        send("SIM:BIAS:HIST:CLE");
        send("SOUR:VOLT:OFFS 2;:SOUR:VOLT:OFFS:STAT ON");
        send("SOUR:VOLT:OFFS 4");
        send("SOUR:VOLT:OFFS 4"); // no change: no entry
        send("SOUR:CURR:OFFS 0.5;:SOUR:CURR:OFFS:STAT ON"); // one source: the voltage goes off
        send("*RST");
        double[] h = Arrays.stream(send("SIMulate:BIAS:HISTory?").split(",")).mapToDouble(Double::parseDouble)
                .toArray();
        assertEquals(5 * 3, h.length, Arrays.toString(h));
        double[][] expected = {{0, 0}, {2, 0}, {4, 0}, {0, 0.5}, {0, 0}};
        for (int k = 0; k < expected.length; k++) {
            assertEquals(expected[k][0], h[3 * k + 1], 0.0, "voltage of entry " + k);
            assertEquals(expected[k][1], h[3 * k + 2], 0.0, "current of entry " + k);
            if (k > 0) {
                assertTrue(h[3 * k] >= h[3 * (k - 1)], "times in order");
            }
        }
        assertTrue(Math.abs(h[0] - System.currentTimeMillis() / 1000.0) < 60, "seconds since the epoch: " + h[0]);
        assertEquals(0, nextError());
        send("SIM:BIAS:HIST:CLE");
        assertEquals(3, send("SIM:BIAS:HIST?").split(",").length);
    }
}
