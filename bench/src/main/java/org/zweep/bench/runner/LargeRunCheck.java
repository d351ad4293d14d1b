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
 * A 100 000-point run on the in-process simulator with timing {@code none}, for the heap figure:
 * {@code java -Xmx256m -cp bench/target/benchmarks.jar org.zweep.bench.runner.LargeRunCheck [REPO]}.
 * Prints the exit code, the rows written, the wall time and the peak heap in use.
 */
public final class LargeRunCheck {
    private LargeRunCheck() {
    }

    public static void main(String[] args) throws Exception {
        Path repo = Path.of(args.length > 0 ? args[0] : ".").toAbsolutePath();
        Path dir = Files.createTempDirectory("zweep-large");
        Path seq = BenchFiles.sweep(dir, BenchFiles.capacitorBench(repo), 100_000, "1 ms");
        Path out = dir.resolve("run");
        long t0 = System.nanoTime();
        StringWriter err = new StringWriter();
        int code = Cli.run(new String[] {"run", seq.toString(), "--meter",
            "sim:" + BenchFiles.capacitorBench(repo) + "?timing=none", "--out", out.toString(), "--quiet"},
                new PrintWriter(new StringWriter()), new PrintWriter(err));
        double wall = (System.nanoTime() - t0) / 1e9;
        long rows = Files.lines(out.resolve("points.csv")).count() - 1;
        long peak = 0;
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                peak += p.getPeakUsage().getUsed();
            }
        }
        System.out.printf(Locale.ROOT, "exit %d, %d rows, %.1f s (%.1f us/point), peak heap used %.1f MB of max %.0f MB%s%n",
                code, rows, wall, wall / rows * 1e6, peak / 1e6, Runtime.getRuntime().maxMemory() / 1e6,
                err.toString().isBlank() ? "" : ", stderr: " + err.toString().strip());
    }
}
