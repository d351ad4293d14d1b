package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.SimulatorServer;

/**
 * A second Ctrl-C returns within a second on any link: a child {@code zweep run} of the shipped
 * capacitor sequence at real timing, whose link to the meter freezes in the middle of the bias
 * step (a relay stops forwarding, the connection stays open), is sent Ctrl-C twice. The first asks
 * for a ramped stop, which the frozen link cannot carry; the second must end the process with
 * exit 130 within a second, saying it could not confirm bias off (the meter is out of reach).
 */
class StalledLinkStopIT {
    /** The figure: the second Ctrl-C returns within a second. */
    private static final long SECOND_STOP_LIMIT_MS = 1000;

    @TempDir
    Path dir;

    @Test
    void aSecondCtrlCOnAFrozenLinkEndsTheRunWithinASecond() throws Exception {
        Path seq = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(seq), FaultPlan.none());
                FreezableProxy proxy = new FreezableProxy(server.port())) {
            server.instrument().setTiming(TimingModel.REAL);
            String meterSide = "tcp://127.0.0.1:" + server.port();
            Path log = dir.resolve("run.log");
            Process p = Children.zweep(log, "run", seq.toString(), "--meter", "sim:tcp://127.0.0.1:" + proxy.port(),
                    "--dialect", Sims.dialect(), "--out", dir.resolve("run").toString(), "--seed", "3", "--yes");
            long end = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
            while (BiasTrace.read(meterSide).peak(false) < 4.0) {
                assertTrue(p.isAlive(), () -> "child ended early: " + read(log));
                assertTrue(System.nanoTime() < end, () -> "no 4 V of bias within 120 s: " + read(log));
                Thread.sleep(50);
            }
            proxy.freeze();
            Thread.sleep(300); // the run is now waiting for a reply that cannot come
            Children.signal(p, "INT");
            Thread.sleep(300);
            long spawn = System.nanoTime();
            Children.signal(p, "INT"); // returns once kill(1) has sent the signal
            long sent = System.nanoTime();
            assertTrue(p.waitFor(30, TimeUnit.SECONDS), "child stopped");
            long ended = System.nanoTime();
            long tookMs = TimeUnit.NANOSECONDS.toMillis(ended - sent);
            String text = read(log);
            System.out.printf(Locale.ROOT, "second Ctrl-C on a frozen link: process ended %d ms after the signal was"
                    + " sent (%d ms after starting kill(1))%n", tookMs, TimeUnit.NANOSECONDS.toMillis(ended - spawn));
            assertEquals(130, p.exitValue(), text);
            assertTrue(text.contains("could NOT confirm that DC bias is off"), text);
            assertTrue(!text.contains("internal error") && !text.contains("Exception"), text);
            assertTrue(tookMs <= SECOND_STOP_LIMIT_MS, "second Ctrl-C took " + tookMs + " ms: " + text);
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
