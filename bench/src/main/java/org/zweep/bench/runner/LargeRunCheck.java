package org.zweep.bench.runner;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import org.zweep.runner.cli.Cli;

/**
 * A large run on the in-process simulator with timing {@code none}, then {@code zweep analyze} of
 * it in the same JVM, for the heap figures:
 * {@code java -Xmx256m -cp bench/target/benchmarks.jar org.zweep.bench.runner.LargeRunCheck [REPO [POINTS]]}
 * (POINTS defaults to 1,000,000). Prints, for each, the exit code, the wall time, the process's CPU
 * time (the machine may be shared), the peak heap in use (the sum of the heap pools' peaks, an
 * upper bound that counts garbage not yet collected) and the most heap still in use after a
 * garbage collection (what the phase really held).
 */
public final class LargeRunCheck {
    private LargeRunCheck() {
    }

    /** The most heap in use right after a collection, in bytes, since the last {@link #resetLive}. */
    private static final java.util.concurrent.atomic.AtomicLong LIVE = new java.util.concurrent.atomic.AtomicLong();

    private static void watchCollections() {
        for (java.lang.management.GarbageCollectorMXBean gc : ManagementFactory.getGarbageCollectorMXBeans()) {
            ((javax.management.NotificationEmitter) gc).addNotificationListener((n, h) -> {
                if (!n.getType().equals(com.sun.management.GarbageCollectionNotificationInfo.GARBAGE_COLLECTION_NOTIFICATION)) {
                    return;
                }
                var info = com.sun.management.GarbageCollectionNotificationInfo.from(
                        (javax.management.openmbean.CompositeData) n.getUserData());
                long used = info.getGcInfo().getMemoryUsageAfterGc().values().stream()
                        .mapToLong(java.lang.management.MemoryUsage::getUsed).sum();
                LIVE.accumulateAndGet(used, Math::max);
            }, null, null);
        }
    }

    private static void resetLive() {
        LIVE.set(0);
    }

    private static double cpuSeconds() {
        return ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean())
                .getProcessCpuTime() / 1e9;
    }

    public static void main(String[] args) throws Exception {
        watchCollections();
        Path repo = Path.of(args.length > 0 ? args[0] : ".").toAbsolutePath();
        Path dir = Files.createTempDirectory("zweep-large");
        int points = args.length > 1 ? Integer.parseInt(args[1]) : 1_000_000;
        Path seq = BenchFiles.sweep(dir, BenchFiles.capacitorBench(repo), points, "1 ms");
        if (points > 100_000) {
            // one axis holds at most 100,000 values: the same sweep in steps of 100,000 points
            StringBuilder yaml = new StringBuilder(Files.readString(seq).replaceAll("(?s)steps:.*", "steps:\n"));
            for (int left = points, k = 1; left > 0; left -= 100_000, k++) {
                yaml.append("  - name: sweep-").append(k).append("\n    frequency: {start: 100 Hz, stop: 1 MHz, points: ")
                        .append(Math.min(left, 100_000)).append("}\n    level: 0.5 V\n    integration: 1 ms\n");
            }
            Files.writeString(seq, yaml);
        }
        Path out = dir.resolve("run");
        long t0 = System.nanoTime();
        double cpu0 = cpuSeconds();
        StringWriter err = new StringWriter();
        int code = Cli.run(new String[] {"run", seq.toString(), "--meter",
            "sim:" + BenchFiles.capacitorBench(repo) + "?timing=none", "--out", out.toString(), "--quiet"},
                new PrintWriter(new StringWriter()), new PrintWriter(err));
        double wall = (System.nanoTime() - t0) / 1e9;
        if (!Files.exists(out.resolve("points.csv"))) {
            System.out.printf(Locale.ROOT, "run: exit %d, no points.csv: %s%n", code, err.toString().strip());
            return;
        }
        long rows;
        try (var lines = Files.lines(out.resolve("points.csv"))) {
            rows = lines.count() - 1;
        }
        double cpu = cpuSeconds() - cpu0;
        System.out.printf(Locale.ROOT, "run: exit %d, %d rows, %.1f s wall, %.1f s CPU (%.1f us/point), peak heap used"
                + " %.1f MB, at most %.1f MB in use after a collection, of max %.0f MB%s%n",
                code, rows, wall, cpu, wall / rows * 1e6, peakHeap() / 1e6, LIVE.get() / 1e6,
                Runtime.getRuntime().maxMemory() / 1e6, err.toString().isBlank() ? "" : ", stderr: " + err.toString().strip());
        System.gc();
        ManagementFactory.getMemoryPoolMXBeans().forEach(MemoryPoolMXBean::resetPeakUsage);
        resetLive();
        StringWriter aerr = new StringWriter();
        t0 = System.nanoTime();
        cpu0 = cpuSeconds();
        int acode = Cli.run(new String[] {"analyze", out.toString(), "--json"}, new PrintWriter(new StringWriter()),
                new PrintWriter(aerr));
        wall = (System.nanoTime() - t0) / 1e9;
        System.out.printf(Locale.ROOT, "analyze: exit %d, %.1f s wall, %.1f s CPU, peak heap used %.1f MB, at most %.1f MB"
                + " in use after a collection%s%n", acode, wall, cpuSeconds() - cpu0, peakHeap() / 1e6, LIVE.get() / 1e6,
                aerr.toString().isBlank() ? "" : ", stderr: " + aerr.toString().strip());
    }

    private static long peakHeap() {
        long peak = 0;
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                peak += p.getPeakUsage().getUsed();
            }
        }
        return peak;
    }
}
