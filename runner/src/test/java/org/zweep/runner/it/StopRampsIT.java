package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Every abort path ramps: a child {@code zweep run} of a shipped bias sequence at the simulator's
 * real timing is sent Ctrl-C or SIGTERM mid bias step, and the simulator's own record of the bias
 * it applied must show no change faster than the step's ramp (plus one ramp step of timing
 * jitter), ending at 0 before the bias is switched off.
 */
class StopRampsIT {
    @TempDir
    Path dir;

    @ParameterizedTest(name = "{0} during the {1} bias step")
    @CsvSource({
        // sequence file, bias kind, the step's ramp (V/s or A/s), its largest bias, signal, exit code
        "incoming-kp-c0805-104.yaml, voltage, 2.0, 25.0, INT, 130",
        "incoming-kp-c0805-104.yaml, voltage, 2.0, 25.0, TERM, 143",
        "characterise-kp-l1210-100.yaml, current, 0.5, 4.0, INT, 130",
        "characterise-kp-l1210-100.yaml, current, 0.5, 4.0, TERM, 143",
    })
    void anAbortBringsBiasDownAtTheStepsRampRate(String file, String kind, double rampPerS, double maxBias,
            String signal, int exitCode) throws Exception {
        Path seq = Sims.sequences().resolve(file);
        boolean current = kind.equals("current");
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(seq), FaultPlan.none())) {
            server.instrument().setTiming(TimingModel.REAL);
            String address = Sims.address(server);
            Path out = dir.resolve("run");
            Path log = dir.resolve("run.log");
            Process p = Children.zweep(log, "run", seq.toString(), "--meter", address, "--dialect", Sims.dialect(),
                    "--out", out.toString(), "--seed", "3", "--yes");
            // stop it on the way up, a third of the way to the step's largest bias
            double stopAt = maxBias / 3;
            long end = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
            while (BiasTrace.read(address).peak(current) < stopAt) {
                assertTrue(p.isAlive(), () -> "child ended early: " + read(log));
                assertTrue(System.nanoTime() < end, () -> "no " + stopAt + " bias within 120 s: " + read(log));
                Thread.sleep(50);
            }
            Children.signal(p, signal);
            assertTrue(p.waitFor(60, TimeUnit.SECONDS), "child stopped");
            String text = read(log);
            assertEquals(exitCode, p.exitValue(), text);
            assertTrue(Sims.biasOff(server), "bias off after the signal");
            assertTrue(!text.contains("internal error"), text);
            BiasTrace t = BiasTrace.read(address);
            double peak = t.peak(current);
            assertTrue(peak >= stopAt, "reached " + peak);
            BiasTrace.Entry last = t.last();
            assertEquals(0.0, last.voltageV(), 0.0);
            assertEquals(0.0, last.currentA(), 0.0);
            double step = rampPerS * 0.1; // one ramp step: zweep's steps are 0.1 s apart
            double excess = t.largestExcess(current, rampPerS);
            double rate = t.largestRate(current, 1.0);
            System.out.printf(Locale.ROOT, "ramp figures: %s %s bias, SIG%s: peak %.3f, largest rate over 1 s %.3f"
                    + " (ramp %.3f), largest excess over the ramp %.4f (one step %.3f)%n", file, kind, signal, peak, rate,
                    rampPerS, excess, step);
            // the step's ramp plus one step (the acceptance rule)
            assertTrue(excess <= step + 1e-9, "bias moved " + excess + " beyond the ramp: " + t);
            assertTrue(rate <= rampPerS * 1.1 + step, "largest rate over 1 s " + rate);
            // nothing else moved: a voltage run never applies current and the other way round
            assertEquals(0.0, t.peak(!current), 0.0);
        }
    }

    @ParameterizedTest(name = "SIG{0} during host compensation")
    @CsvSource({"INT, 130", "TERM, 143"})
    void aSignalDuringHostCompensationStopsTheRunWithoutAnInternalError(String signal, int exitCode) throws Exception {
        Path seq = Sims.sequences().resolve("incoming-kp-c0805-104.yaml"); // compensation: host, open and short
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(seq), FaultPlan.none())) {
            server.instrument().setTiming(TimingModel.REAL);
            String address = Sims.address(server);
            Path log = dir.resolve("comp.log");
            Process p = Children.zweep(log, "run", seq.toString(), "--meter", address, "--dialect", Sims.dialect(),
                    "--out", dir.resolve("comp").toString(), "--seed", "3", "--yes");
            long end = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
            while (!fixtureHoldsAStandard(address)) {
                assertTrue(p.isAlive(), () -> "child ended early: " + read(log));
                assertTrue(System.nanoTime() < end, () -> "no compensation within 60 s: " + read(log));
                Thread.sleep(20);
            }
            Thread.sleep(300); // well inside the standard's sweep
            Children.signal(p, signal);
            assertTrue(p.waitFor(60, TimeUnit.SECONDS), "child stopped");
            String text = read(log);
            assertEquals(exitCode, p.exitValue(), text);
            assertTrue(!text.contains("internal error"), text);
            assertTrue(Sims.biasOff(server), "bias off after the signal");
        }
    }

    private static boolean fixtureHoldsAStandard(String address) {
        try (org.zweep.driver.scpi.ScpiClient c = org.zweep.driver.scpi.ScpiClient.open(address,
                org.zweep.driver.scpi.ScpiSettings.DEFAULTS)) {
            String slot = c.query(":SIM:FIXT?").strip();
            return slot.equals("OPEN") || slot.equals("SHOR");
        }
    }

    private static String read(Path log) {
        try {
            return Files.readString(log);
        } catch (java.io.IOException e) {
            return "(no log: " + e + ")";
        }
    }
}
