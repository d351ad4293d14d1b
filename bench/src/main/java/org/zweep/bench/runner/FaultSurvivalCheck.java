package org.zweep.bench.runner;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.zweep.runner.cli.Cli;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.PointsCsvReader;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Runs of the shipped sequences against the TCP simulator (timing {@code none}) with random link
 * faults, each compared with the uninterrupted run of the same seed, for the fault figures:
 * <pre>
 * java -cp bench/target/benchmarks.jar org.zweep.bench.runner.FaultSurvivalCheck [REPO] [SEEDS] [KIND...]
 * </pre>
 * {@code KIND} is a simulator fault spec ({@code --fault} syntax); by default
 * {@code drop-random=0.02}, {@code garble@~0.01} and {@code delay=2@~0.01} (with a 1 s reply
 * timeout, so every delayed reply times out). For each sequence and kind it prints how many runs
 * completed unattended (the exit code of the uninterrupted run, no resume), and — after resuming
 * the others, at most three times, on the same faulty server — in how many some point was lost,
 * duplicated or changed.
 */
public final class FaultSurvivalCheck {
    private static final String TIMEOUT_S = "1";

    private FaultSurvivalCheck() {
    }

    /** One run's outcome. */
    record Outcome(boolean unattended, int resumes, int lost, int duplicated, int changed, String firstProblem) {
    }

    public static void main(String[] args) throws Exception {
        Path repo = Path.of(args.length > 0 ? args[0] : ".").toAbsolutePath();
        int seeds = args.length > 1 ? Integer.parseInt(args[1]) : 100;
        List<String> kinds = args.length > 2 ? List.of(args).subList(2, args.length)
                : List.of("drop-random=0.02", "garble@~0.01", "delay=2@~0.01");
        List<Path> sequences;
        try (var s = Files.list(repo.resolve("sequences"))) {
            sequences = s.filter(p -> p.toString().endsWith(".yaml")).sorted().toList();
        }
        Path dir = Files.createTempDirectory("zweep-fault-survival");
        int threads = Math.max(1, Math.min(4, Runtime.getRuntime().availableProcessors()));
        ExecutorService pool = Executors.newFixedThreadPool(threads);
        System.out.printf(Locale.ROOT, "%d seeds per sequence and fault kind, reply timeout %s s, %d threads, %s%n",
                seeds, TIMEOUT_S, threads, Instant.now());
        for (String kind : kinds) {
            for (Path seq : sequences) {
                List<Future<Outcome>> futures = new ArrayList<>();
                for (int seed = 1; seed <= seeds; seed++) {
                    long s = seed;
                    futures.add(pool.submit(() -> trial(repo, seq, kind, s, dir)));
                }
                int unattended = 0;
                int intact = 0;
                int resumes = 0;
                List<String> problems = new ArrayList<>();
                for (int i = 0; i < futures.size(); i++) {
                    Outcome o = futures.get(i).get();
                    unattended += o.unattended() ? 1 : 0;
                    resumes += o.resumes();
                    boolean ok = o.lost() == 0 && o.duplicated() == 0 && o.changed() == 0;
                    intact += ok ? 1 : 0;
                    if (o.firstProblem() != null && problems.size() < 5) {
                        problems.add("seed " + (i + 1) + ": " + o.firstProblem());
                    }
                }
                System.out.printf(Locale.ROOT, "%-18s %-36s completed unattended %3d/%d (%.1f %%), resumes needed %d,"
                        + " no point lost/duplicated/changed %3d/%d%n", kind, seq.getFileName(), unattended, seeds,
                        100.0 * unattended / seeds, resumes, intact, seeds);
                problems.forEach(p -> System.out.println("    " + p));
            }
        }
        pool.shutdown();
    }

    static Outcome trial(Path repo, Path seq, String kind, long seed, Path dir) throws IOException {
        Path bench = benchOf(seq);
        String name = seq.getFileName().toString().replace(".yaml", "") + "-" + kind.replaceAll("[^a-z0-9.]", "_")
                + "-" + seed;
        // each run in a folder of its own: host-side compensation data in sibling run folders would be reused
        Path ref = dir.resolve(name + "-reference").resolve("run");
        int refCode;
        try (SimulatorServer server = server(bench, FaultPlan.none())) {
            refCode = zweep(run(seq, server, ref, seed));
        }
        Map<Integer, PointRow> expected = rows(ref);
        Path out = dir.resolve(name).resolve("run");
        String problem = null;
        int resumes = 0;
        boolean unattended;
        try (SimulatorServer server = server(bench, FaultPlan.parse(kind, seed))) {
            StringWriter err = new StringWriter();
            int code = Cli.run(run(seq, server, out, seed), new PrintWriter(new StringWriter()), new PrintWriter(err));
            unattended = code == refCode;
            if (!unattended) {
                problem = "exit " + code + ": " + err.toString().strip().lines().findFirst().orElse("");
            }
            while (code != refCode && resumes < 3) {
                resumes++;
                code = Cli.run(new String[] {"run", "--resume", out.toString(), "--meter",
                    "sim:tcp://127.0.0.1:" + server.port(), "--dialect", "standard", "--timeout", TIMEOUT_S, "--quiet"},
                        new PrintWriter(new StringWriter()), new PrintWriter(new StringWriter()));
            }
        }
        int lost = 0;
        int changed = 0;
        int duplicated = 0;
        Map<Integer, PointRow> actual;
        try {
            actual = rows(out);
        } catch (RuntimeException e) {
            return new Outcome(unattended, resumes, expected.size(), 1, 0, e.getMessage());
        }
        for (Map.Entry<Integer, PointRow> e : expected.entrySet()) {
            PointRow a = actual.get(e.getKey());
            if (a == null) {
                lost++;
            } else if (!timeless(a).equals(timeless(e.getValue()))) {
                changed++;
                if (problem == null) {
                    problem = "point " + e.getKey() + " changed: " + timeless(a) + " vs " + timeless(e.getValue());
                }
            }
        }
        if (lost > 0 && problem == null) {
            problem = lost + " points lost";
        }
        return new Outcome(unattended, resumes, lost, duplicated, changed, problem);
    }

    private static String[] run(Path seq, SimulatorServer server, Path out, long seed) {
        return new String[] {"run", seq.toString(), "--meter", "sim:tcp://127.0.0.1:" + server.port(), "--dialect",
            "standard", "--out", out.toString(), "--seed", Long.toString(seed), "--timeout", TIMEOUT_S, "--quiet"};
    }

    private static int zweep(String[] args) {
        StringWriter err = new StringWriter();
        int code = Cli.run(args, new PrintWriter(new StringWriter()), new PrintWriter(err));
        if (code > 1) {
            throw new IllegalStateException("uninterrupted run failed (" + code + "): " + err);
        }
        return code;
    }

    private static SimulatorServer server(Path bench, FaultPlan faults) throws IOException {
        return SimulatorServer.start(new SimulatedBench(BenchSpec.load(bench)), ServerOptions.defaults().withPort(0)
                .withFaults(faults).withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
    }

    private static Path benchOf(Path sequence) throws IOException {
        String line = Files.readAllLines(sequence).stream().filter(l -> l.strip().startsWith("bench:")).findFirst()
                .orElseThrow();
        return sequence.getParent().resolve(line.strip().substring("bench:".length()).strip()).normalize();
    }

    /** The rows by point index; a repeated index is refused by the reader. */
    private static Map<Integer, PointRow> rows(Path runFolder) {
        Map<Integer, PointRow> m = new TreeMap<>();
        PointsCsvReader.recover(runFolder.resolve("points.csv"), r -> m.put(r.point(), r));
        return m;
    }

    private static PointRow timeless(PointRow r) {
        return r.withTime(Instant.EPOCH);
    }
}
