package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.safety.BiasGuardMain;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.SimulatorServer;

/**
 * The guard process: a child {@code zweep run} of a shipped bias sequence on the TCP simulator at
 * real timing is killed with SIGKILL mid bias step (nothing of it runs after that), and the
 * simulator's own record must show the bias ramped down at the step's rate and off within the
 * ramp time plus 2 s, with the guard's record in the run folder. CI runs 3 kills; the figure for
 * README comes from {@code mvn -B -pl runner -am verify -Dtest=NONE -Dit.test=BiasGuardIT
 * -Dsurefire.failIfNoSpecifiedTests=false -Dzweep.guard.runs=20}.
 */
class BiasGuardIT {
    @TempDir
    Path dir;

    /** One shipped bias sequence: its file, whether its bias is a current, its ramp and largest bias. */
    record Case(String file, boolean current, double rampPerS, double maxBias) {
    }

    static final List<Case> CASES = List.of(
            new Case("incoming-kp-c0805-104.yaml", false, 2.0, 25.0), // bias: 0..25 V, ramp 2 V/s
            new Case("characterise-kp-l1210-100.yaml", true, 0.5, 4.0)); // bias: 0..4 A, ramp 0.5 A/s

    @Test
    void killingTheRunWithSigkillMidBiasStepLeavesBiasRampedDownAndOffWithinTheRampTimePlus2s() throws Exception {
        int runs = Integer.getInteger("zweep.guard.runs", 3);
        List<String> failures = new ArrayList<>();
        int good = 0;
        for (int i = 0; i < runs; i++) {
            Case c = CASES.get(i % CASES.size());
            // kill points spread over the step: 15 % .. 85 % of the largest bias, on the way up or held
            double fraction = 0.15 + 0.7 * ((i * 0.618034) % 1.0);
            String problem = killOnce(i, c, c.maxBias() * fraction);
            if (problem == null) {
                good++;
            } else {
                failures.add("run " + i + ": " + problem);
            }
        }
        System.out.printf(Locale.ROOT, "guard figures: bias off within the ramp time + 2 s in %d of %d runs%n", good,
                runs);
        assertEquals(List.of(), failures);
    }

    /** One kill; null when everything held, else what did not. */
    String killOnce(int i, Case c, double killAt) throws Exception {
        Path seq = Sims.sequences().resolve(c.file());
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(seq), FaultPlan.none())) {
            server.instrument().setTiming(TimingModel.REAL);
            String address = Sims.address(server);
            Path out = dir.resolve("run" + i);
            Path log = dir.resolve("run" + i + ".log");
            Process p = Children.zweep(log, "run", seq.toString(), "--meter", address, "--dialect", Sims.dialect(),
                    "--out", out.toString(), "--seed", Integer.toString(i), "--yes", "--quiet");
            long end = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
            while (BiasTrace.read(address).peak(c.current()) < killAt) {
                if (!p.isAlive() || System.nanoTime() > end) {
                    p.destroyForcibly();
                    return "no " + killAt + " bias (child alive: " + p.isAlive() + "): " + Files.readString(log);
                }
                Thread.sleep(20);
            }
            Children.signal(p, "KILL");
            double killedS = System.currentTimeMillis() / 1000.0; // the simulator runs in this JVM: one clock
            p.waitFor(10, TimeUnit.SECONDS);
            BiasTrace atKill = BiasTrace.read(address);
            double value = Math.abs(atKill.last().value(c.current()));
            double allowedS = value / c.rampPerS() + 2.0; // the acceptance figure: ramp time + 2 s
            long deadline = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos((long) (allowedS * 1000) + 10_000);
            BiasTrace t = BiasTrace.read(address);
            while (!(t.last().voltageV() == 0.0 && t.last().currentA() == 0.0 && Sims.biasOff(server))
                    && System.nanoTime() < deadline) {
                Thread.sleep(50);
                t = BiasTrace.read(address);
            }
            double offS = t.last().timeS() - killedS;
            double excess = t.largestExcess(c.current(), c.rampPerS());
            Path record = out.resolve(BiasGuardMain.LOG);
            // the guard writes its record after the bias is off: give it a moment (the file can exist
            // before its line is written, so wait for the line)
            long recordBy = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
            while (!(Files.exists(record) && Files.readString(record).endsWith("\n")) && System.nanoTime() < recordBy) {
                Thread.sleep(50);
            }
            String guardLog = Files.exists(record) ? Files.readString(record) : "";
            System.out.printf(Locale.ROOT, "guard figures: run %d, %s: killed at %.3f %s, off %.2f s later (allowed"
                    + " %.2f s), largest excess over the ramp %.4f%n", i, c.file(), value, c.current() ? "A" : "V", offS,
                    allowedS, excess);
            if (!Sims.biasOff(server) || t.last().voltageV() != 0.0 || t.last().currentA() != 0.0) {
                return "bias not off " + (allowedS + 10) + " s after the kill: " + t.last() + "; " + Files.readString(log);
            }
            if (offS > allowedS) {
                return String.format(Locale.ROOT, "bias off %.2f s after the kill, allowed %.2f s", offS, allowedS);
            }
            if (excess > c.rampPerS() * 0.1 + 1e-9) { // one ramp step: zweep's steps are 0.1 s apart
                return "bias moved " + excess + " beyond the ramp: " + t;
            }
            if (value > 0 && !guardLog.contains("brought DC bias")) {
                return "no record of the guard in " + record + ": '" + guardLog + "'; " + Files.readString(log);
            }
            if (!"running".equals(RunManifest.read(out.resolve("run.json")).outcome())) {
                return "run.json says the run ended: a kill must leave it running";
            }
            return null;
        }
    }
}
