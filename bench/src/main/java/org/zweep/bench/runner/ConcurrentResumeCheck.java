package org.zweep.bench.runner;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import org.zweep.runner.cli.Cli;
import org.zweep.runner.results.RunManifest;

/**
 * Two {@code zweep run --resume DIR} started at once on one unfinished run folder, in two JVMs,
 * {@code N} times (default 10), for the folder-lock figure:
 * {@code java -cp bench/target/benchmarks.jar org.zweep.bench.runner.ConcurrentResumeCheck [REPO] [N]}.
 * Each trial prints both exit codes, whether one was refused because the other held the folder,
 * and whether every point is in {@code points.csv} exactly once.
 */
public final class ConcurrentResumeCheck {
    private ConcurrentResumeCheck() {
    }

    public static void main(String[] args) throws Exception {
        Path repo = Path.of(args.length > 0 ? args[0] : ".").toAbsolutePath();
        int trials = args.length > 1 ? Integer.parseInt(args[1]) : 10;
        Path seq = repo.resolve("sequences/incoming-kp-c0805-104.yaml");
        String meter = "sim:" + repo.resolve("sequences/benches/kp-c0805-104.bench.yaml") + "?timing=none";
        Path dir = Files.createTempDirectory("zweep-concurrent-resume");
        Path ref = dir.resolve("reference");
        StringWriter err = new StringWriter();
        int code = Cli.run(new String[] {"run", seq.toString(), "--meter", meter, "--out", ref.toString(), "--seed", "3",
            "--quiet"}, new PrintWriter(new StringWriter()), new PrintWriter(err));
        if (code != 0) {
            throw new IllegalStateException("reference run failed: " + err);
        }
        List<String> refLines = Files.readAllLines(ref.resolve("points.csv"), StandardCharsets.UTF_8);
        int refused = 0;
        int intact = 0;
        for (int t = 1; t <= trials; t++) {
            Path out = dir.resolve("trial-" + t);
            copyUnfinished(ref, out, refLines, 3);
            Process a = resume(out, meter);
            Process b = resume(out, meter);
            String outA = new String(a.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
            String outB = new String(b.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
            a.waitFor(120, TimeUnit.SECONDS);
            b.waitFor(120, TimeUnit.SECONDS);
            int ea = a.exitValue();
            int eb = b.exitValue();
            boolean oneRefused = (ea == 2 && outA.contains("in use by another zweep run") && eb == 0)
                    || (eb == 2 && outB.contains("in use by another zweep run") && ea == 0);
            List<String> lines = Files.readAllLines(out.resolve("points.csv"), StandardCharsets.UTF_8);
            Set<String> points = new HashSet<>();
            int duplicates = 0;
            for (String l : lines.subList(1, lines.size())) {
                if (!points.add(l.substring(0, l.indexOf(',')))) {
                    duplicates++;
                }
            }
            boolean complete = points.size() == refLines.size() - 1 && duplicates == 0;
            refused += oneRefused ? 1 : 0;
            intact += complete ? 1 : 0;
            System.out.printf(Locale.ROOT, "trial %2d: exits %d and %d, %s, %d rows, %d duplicated%s%n", t, ea, eb,
                    oneRefused ? "one refused (folder in use)" : "NOT refused", lines.size() - 1, duplicates,
                    oneRefused ? "" : "\n  A: " + outA.strip() + "\n  B: " + outB.strip());
        }
        System.out.printf(Locale.ROOT, "second resume refused in %d of %d trials; every point once in %d of %d%n",
                refused, trials, intact, trials);
    }

    private static Process resume(Path out, String meter) throws Exception {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"),
                "org.zweep.runner.cli.Main", "run", "--resume", out.toString(), "--meter", meter, "--quiet");
        pb.redirectErrorStream(true);
        return pb.start();
    }

    /** {@code ref} as a folder with only its first {@code keep} rows, its manifest saying it failed. */
    private static void copyUnfinished(Path ref, Path out, List<String> refLines, int keep) throws Exception {
        Files.createDirectories(out);
        try (var files = Files.walk(ref)) {
            for (Path p : files.toList()) {
                Path target = out.resolve(ref.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(target);
                } else if (!p.getFileName().toString().equals("run.lock")) {
                    Files.copy(p, target);
                }
            }
        }
        Files.write(out.resolve("points.csv"), new ArrayList<>(refLines.subList(0, keep + 1)), StandardCharsets.UTF_8);
        RunManifest m = RunManifest.read(out.resolve("run.json"));
        m.finished("failed", null, new RunManifest.Counts(m.counts().planned(), keep), "none")
                .write(out.resolve("run.json"));
    }
}
