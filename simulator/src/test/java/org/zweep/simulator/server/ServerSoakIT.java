package org.zweep.simulator.server;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.lang.management.ManagementFactory;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicBoolean;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.scpi.BenchLoader;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;

/**
 * Issue 17, item 1: the attacks that grew the server (unread delayed replies, clients that never
 * read, idle connections, over-long lines, huge netlists, odd syntax), repeated over loopback in
 * bounded loops, leave its heap and thread count where they started, while a fresh client probing
 * every 20 ms (connect, {@code *IDN?}, its reply) is answered throughout. The attackers run in a
 * process of their own ({@link SoakAttacks}), as attackers do: in this JVM their own work (building
 * 2 MiB lines and 12,000-element netlists, their threads) counted against the server's heap and
 * held the probe up in their own garbage collections. The probe runs in the server's JVM, so the
 * server's pauses count against it. Rounds per batch: {@code -Dzweep.soak.rounds=N} (default 10);
 * batches run at least: {@code -Dzweep.soak.batches=N} (default 1; more to see the spread).
 * The figures (heap, resident memory, threads, probe latency, the CPU shares of the server, the
 * attackers and the rest of the machine, the slowest probe per attack) are printed one line each.
 */
class ServerSoakIT {
    private static final int CAP = 64;
    private static final String IDN = Instrument.IDENTIFICATION;

    @Test
    void repeatedAttacksLeaveHeapAndThreadsWhereTheyStartedAndAFreshClientIsAnsweredThroughout() throws Exception {
        SimulatedBench bench = new SimulatedBench(BenchSpec.ofNetlist("R1 hi lo 100", "soak").ideal().withTiming(Timing.NONE));
        int rounds = Integer.getInteger("zweep.soak.rounds", 10);
        int minBatches = Integer.getInteger("zweep.soak.batches", 1);
        long idleGapMicros = Long.getLong("zweep.soak.idleGapMicros", IDLE_GAP_MICROS);
        try (SimulatorServer server = SimulatorServer.start(bench, ServerOptions.defaults().withPort(0)
                .withMaxConnections(CAP).withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)
                        .withBenchLoader(BenchLoader.simulated(true, TimingModel.NONE))))) {
            int serverThreadsAtStart = serverThreads();
            Process attackers = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-cp", System.getProperty("java.class.path"), SoakAttacks.class.getName(),
                    server.address().getHostString(), Integer.toString(server.port()), Integer.toString(CAP),
                    Integer.toString(rounds), Long.toString(idleGapMicros)).redirectError(ProcessBuilder.Redirect.INHERIT).start();
            Probe probe = new Probe(server);
            Thread t = new Thread(probe, "soak-probe");
            long heapBefore = 0;
            int threadsBefore = 0;
            long rssBefore = 0;
            List<Batch> batches = new ArrayList<>();
            try (BufferedReader said = new BufferedReader(new InputStreamReader(attackers.getInputStream(), StandardCharsets.US_ASCII));
                    Writer answer = new OutputStreamWriter(attackers.getOutputStream(), StandardCharsets.US_ASCII)) {
                Cpu cpuAtStart = null;
                long[] warmUpProbes = {0};
                int probesAtStart = 0;
                String line;
                while ((line = said.readLine()) != null) {
                    if (line.startsWith("phase ")) {
                        Probe.phase = line.substring(6);
                    } else if (line.startsWith("closed? ")) {
                        // the attackers' closed connections are gone (the probe's may be open): every one
                        // they opened taken from the backlog (a count alone passed while some still waited
                        // there, and the next attack then met the cap), and none but the probe's open
                        long attackersOpened = Long.parseLong(line.substring(8));
                        ServerLimitsIT.awaitTrue(() -> server.tcpConnectionsHandled() >= attackersOpened + warmUpProbes[0] + probe.connects()
                                && server.connectionCount() <= (probe.connected ? 1 : 0), "the attackers' connections closed");
                        answer.write("ok\n");
                        answer.flush();
                    } else if (line.equals("warm")) {
                        // warm-up done: threads, JIT and buffers reached their steady state; the probe's own
                        // client code too (run interpreted, it held the first batch's probes up by 5-10 ms)
                        settle(server);
                        for (int i = 0; i < PROBE_WARM_UP; i++) {
                            warmUpProbes[0]++;
                            try (RawClient c = new RawClient(server)) {
                                assertEquals(IDN, c.query("*IDN?"), "warm-up probe");
                            }
                        }
                        settle(server);
                        heapBefore = heapUsed();
                        threadsBefore = threads();
                        rssBefore = residentKiB();
                        cpuAtStart = Cpu.now(attackers.pid());
                        t.start();
                        answer.write("go\n");
                        answer.flush();
                    } else if (line.equals("done")) {
                        Cpu cpuAtEnd = Cpu.now(attackers.pid());
                        List<Probe.Answer> answers = probe.since(probesAtStart);
                        Batch b = new Batch(answers, cpuAtEnd.othersShare(cpuAtStart), cpuAtEnd.ownShare(cpuAtStart),
                                cpuAtEnd.attackersShare(cpuAtStart), cpuAtEnd.seconds(cpuAtStart));
                        batches.add(b);
                        b.print(batches.size());
                        boolean again = (!b.quiet() && batches.size() < MAX_BATCHES) || batches.size() < minBatches;
                        answer.write(again ? "again\n" : "bye\n");
                        answer.flush();
                        cpuAtStart = Cpu.now(attackers.pid());
                        probesAtStart += answers.size();
                    }
                }
            } finally {
                probe.stop.set(true);
                if (t.isAlive()) {
                    t.join();
                }
            }
            assertEquals(0, attackers.waitFor(), "the attackers' exit code (their complaint is on stderr)");
            settle(server);
            long heapAfter = heapUsed();
            // the connection threads kept for reuse end after their keep-alive
            long end = System.nanoTime() + (SimulatorServer.CONNECTION_THREAD_KEEP_ALIVE_SECONDS + 5) * 1_000_000_000L;
            while ((threads() > threadsBefore || serverThreads() > serverThreadsAtStart) && System.nanoTime() < end) {
                ServerIT.sleep(50);
            }
            int threadsAfter = threads();
            long rssAfter = residentKiB();
            System.out.printf("soak: %d rounds a batch, idle connections %d µs apart; heap %.1f MiB -> %.1f MiB; "
                    + "resident %.1f MiB -> %.1f MiB; threads %d -> %d%n", rounds, idleGapMicros,
                    heapBefore / 1048576.0, heapAfter / 1048576.0, rssBefore / 1024.0, rssAfter / 1024.0,
                    threadsBefore, threadsAfter);

            assertEquals(0, server.connectionCount());
            assertEquals(0, server.outputQueueBytes());
            assertTrue(threadsAfter <= threadsBefore, "threads " + threadsBefore + " -> " + threadsAfter);
            assertTrue(serverThreads() <= serverThreadsAtStart, "server threads " + serverThreadsAtStart + " -> " + serverThreads());
            assertTrue(heapAfter <= heapBefore + (8 << 20), "heap " + heapBefore + " -> " + heapAfter + " bytes");
            for (Batch b : batches) {
                assertEquals(0, b.failures(), "every probe answered");
                assertTrue(b.latencies().length >= rounds, "probes ran: " + b.latencies().length);
            }
            // Liveness on any machine: every probe answered, none held up for seconds.
            for (Batch b : batches) {
                assertTrue(b.maxMs() < 5000, "slowest probe " + b.maxMs() + " ms");
            }
            // The goal (issue 17) is a fresh client answered within 10 ms throughout the attacks,
            // that is the slowest probe. Latency is judged on a batch during which the rest of the
            // machine was quiet (other processes used at most QUIET_OTHERS_PERCENT of one core):
            // the soak itself keeps both cores of a 2-core machine busy, and time another build
            // takes from them is no measure of the server. Up to MAX_BATCHES batches are run to
            // find a quiet one; if none was, the latency is not judged, which is said (a skipped
            // test), not passed.
            //
            // The goal is met on most quiet batches but not reliably enough to be what is asserted.
            // On the development machine (2 cores, a shared virtual machine), 10-round batches
            // during which the rest of the machine was quiet: the slowest probe within 10 ms in 23
            // of 25 batches (2.0–8.1 ms; the others 13.5 and 15.6 ms), the first batch (the judged
            // one) in 5 of 7; the median probe 0.5–0.8 ms. Most of what was measured before (slowest 8–50 ms, about
            // one batch in four within 10 ms) came from this test, not the server: the wait between
            // attacks passed while the last attack's connections still waited in the server's
            // backlog, so the attacks overlapped (60 idle connections on top of 20 non-readers, the
            // cap refusing the attackers and once the probe), and the probe's own client code ran
            // interpreted through the first batch (it now warms up first). Three server designs were
            // measured against the same test: the one here (the accepting thread serves a lone new
            // connection itself, another takes over accepting) did best; a selector thread holding
            // each connection until its first message, then handing it to a pooled thread, did
            // worse (2 of 4 quiet batches over 10 ms: the hand-off to a thread that had just run a
            // flood waited for a processor); the selector executing a waiting client's message
            // itself did no better (1 of 8 over 10 ms). The tail that is left is waiting for a
            // processor and garbage-collection pauses of 2–9 ms on a machine the soak keeps busy.
            // What is asserted are bounds that catch a regression to what was measured before this
            // work (slowest 22–42 ms with the attackers in this JVM, 60–450 ms before the connection
            // threads were pooled): the median within 5 ms and the slowest within 100 ms.
            Batch judged = batches.stream().filter(Batch::quiet).findFirst().orElse(null);
            assumeTrue(judged != null, () -> "fresh-client latency not judged: other processes used "
                    + batches.stream().map(b -> String.format("%.0f %%", b.othersPercent())).toList()
                    + " of one core during the batches (at most " + QUIET_OTHERS_PERCENT + " % needed)");
            long[] lat = judged.latencies();
            System.out.printf("soak: judged batch %d: slowest fresh-client probe %.2f ms against the 10 ms goal (%s)%n",
                    batches.indexOf(judged) + 1, judged.maxMs(), judged.maxMs() <= 10.0 ? "met" : "NOT met");
            assertTrue(pct(lat, 50) <= 5.0, String.format("median fresh-client probe %.2f ms", pct(lat, 50)));
            assertTrue(judged.maxMs() <= 100.0, String.format("slowest fresh-client probe %.2f ms (goal 10 ms, "
                    + "regression bound 100 ms); by attack: %s", judged.maxMs(), judged.slowestByPhase()));
        }
    }

    /** Other processes' CPU, in percent of one core, up to which a batch is judged. */
    private static final double QUIET_OTHERS_PERCENT = 25;
    private static final int MAX_BATCHES = 3;
    /** Probes before the measured ones, once the attackers' warm-up is done (theirs is not the probe's code). */
    private static final int PROBE_WARM_UP = Integer.getInteger("zweep.soak.probeWarmUp", 300);
    /**
     * How far apart the idle attack opens its connections (0: all at once, the attack as issue 17
     * describes it); {@code -Dzweep.soak.idleGapMicros=N} to see what pacing changes.
     */
    private static final long IDLE_GAP_MICROS = 0;

    /** One batch of rounds: the probes' answers and what the CPUs did meanwhile. */
    private record Batch(List<Probe.Answer> answers, double othersPercent, double serverPercent, double attackersPercent,
            double seconds) {
        boolean quiet() {
            return othersPercent <= QUIET_OTHERS_PERCENT;
        }

        long failures() {
            return answers.stream().filter(a -> a.nanos() < 0).count();
        }

        long[] latencies() {
            return answers.stream().mapToLong(Probe.Answer::nanos).filter(n -> n >= 0).sorted().toArray();
        }

        double maxMs() {
            return pct(latencies(), 100);
        }

        String slowestByPhase() {
            java.util.Map<String, Long> m = new java.util.TreeMap<>();
            answers.stream().filter(a -> a.nanos() >= 0).forEach(a -> m.merge(a.phase(), a.nanos(), Math::max));
            StringBuilder b = new StringBuilder();
            m.forEach((ph, ns) -> b.append(b.length() == 0 ? "" : ", ").append(String.format("%s %.1f ms", ph, ns / 1e6)));
            return b.toString();
        }

        void print(int n) {
            long[] lat = latencies();
            System.out.printf("soak: batch %d, %.1f s: fresh-client probes %d, failed %d, latency median %.2f ms, p99 %.2f ms, "
                    + "max %.2f ms; cpu: server's JVM %.0f %%, attackers %.0f %%, other processes %.0f %% of one core%s%n",
                    n, seconds, lat.length, failures(), pct(lat, 50), pct(lat, 99), pct(lat, 100), serverPercent,
                    attackersPercent, othersPercent, quiet() ? "" : " (not quiet)");
            System.out.printf("soak: batch %d slowest probe by attack: %s%n", n, slowestByPhase());
        }
    }

    private static void settle(SimulatorServer server) {
        ServerLimitsIT.awaitTrue(() -> server.connectionCount() == 0, "every attack's connection closed");
        ServerLimitsIT.awaitTrue(() -> server.outputQueueBytes() == 0, "every output queue given back");
        ServerIT.sleep(300); // the threads of just-closed connections end
    }

    private static long heapUsed() {
        long used = Long.MAX_VALUE;
        for (int i = 0; i < 5; i++) {
            System.gc();
            ServerIT.sleep(50);
            used = Math.min(used, ManagementFactory.getMemoryMXBean().getHeapMemoryUsage().getUsed());
        }
        return used;
    }

    /** The server's own threads (accept, connections, kept connection threads). */
    private static int serverThreads() {
        return (int) Thread.getAllStackTraces().keySet().stream().filter(t -> t.getName().startsWith("zweep-sim")).count();
    }

    private static int threads() {
        return ManagementFactory.getThreadMXBean().getThreadCount();
    }

    private static long residentKiB() throws IOException {
        for (String line : Files.readAllLines(Path.of("/proc/self/status"))) {
            if (line.startsWith("VmRSS:")) {
                return Long.parseLong(line.replaceAll("[^0-9]", ""));
            }
        }
        return -1;
    }

    /** CPU time (clock ticks) of the whole machine, this JVM and the attackers' process, at one instant. */
    private record Cpu(long wallNanos, long machineBusy, long own, long attackers) {
        static Cpu now(long attackersPid) throws IOException {
            String[] all = Files.readAllLines(Path.of("/proc/stat")).get(0).trim().split("\\s+");
            // user, nice, system, steal; not irq and softirq, where the kernel carries the soak's own
            // loopback traffic without charging it to a process
            long busy = 0;
            for (int i : new int[] {1, 2, 3, 8}) {
                busy += Long.parseLong(all[i]);
            }
            return new Cpu(System.nanoTime(), busy, ticks(Path.of("/proc/self/stat")),
                    ticks(Path.of("/proc/" + attackersPid + "/stat")));
        }

        private static long ticks(Path stat) throws IOException {
            String s = Files.readString(stat);
            String[] f = s.substring(s.lastIndexOf(')') + 2).split(" ");
            return Long.parseLong(f[11]) + Long.parseLong(f[12]); // utime, stime
        }

        double seconds(Cpu before) {
            return (wallNanos - before.wallNanos) / 1e9;
        }

        /** Percent of one core; clock ticks are 1/100 s on Linux. */
        private double share(long ticks, Cpu before) {
            return ticks / 100.0 / seconds(before) * 100;
        }

        double ownShare(Cpu before) {
            return share(own - before.own, before);
        }

        double attackersShare(Cpu before) {
            return share(attackers - before.attackers, before);
        }

        double othersShare(Cpu before) {
            return share(machineBusy - before.machineBusy - (own - before.own) - (attackers - before.attackers), before);
        }
    }

    private static double pct(long[] sortedNanos, int p) {
        if (sortedNanos.length == 0) {
            return Double.NaN;
        }
        int i = Math.min(sortedNanos.length - 1, (int) Math.ceil(p / 100.0 * sortedNanos.length) - 1);
        return sortedNanos[Math.max(0, i)] / 1e6;
    }

    /** A fresh connection every 20 ms: connect, *IDN?, close; the time from connecting to the reply. */
    private static final class Probe implements Runnable {
        /** One probe: how long it took (-1 when it failed) and during which attack. */
        record Answer(long nanos, String phase) {
        }

        static volatile String phase = "";
        final AtomicBoolean stop = new AtomicBoolean();
        private final java.util.concurrent.atomic.AtomicLong connects = new java.util.concurrent.atomic.AtomicLong();
        /** Whether a probe connection may be open (from before connecting to after closing). */
        volatile boolean connected;
        private final List<Answer> answers = new ArrayList<>();
        final SimulatorServer server;

        Probe(SimulatorServer server) {
            this.server = server;
        }

        @Override
        public void run() {
            while (!stop.get()) {
                String during = phase;
                long t0 = System.nanoTime();
                long took = -1;
                connects.incrementAndGet();
                connected = true;
                try (RawClient c = new RawClient(server)) {
                    String reply = c.query("*IDN?");
                    if (IDN.equals(reply)) {
                        took = System.nanoTime() - t0;
                    } else {
                        System.out.println("soak: probe during " + during + " answered <" + reply + ">");
                    }
                } catch (IOException e) {
                    System.out.println("soak: probe during " + during + " failed: " + e); // took stays -1
                } finally {
                    connected = false;
                }
                synchronized (this) {
                    answers.add(new Answer(took, during));
                }
                ServerIT.sleep(20);
            }
        }

        /** Connections the probe has begun to open so far. */
        long connects() {
            return connects.get();
        }

        /** The answers from the {@code from}th on. */
        synchronized List<Answer> since(int from) {
            return List.copyOf(answers.subList(from, answers.size()));
        }
    }
}
