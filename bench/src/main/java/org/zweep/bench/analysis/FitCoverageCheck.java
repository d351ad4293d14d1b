package org.zweep.bench.analysis;

import java.io.InputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.zweep.driver.dialect.Dialect;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.cli.Cli;

/**
 * Fitted-value coverage over many runs (the large count behind README's figures; the test
 * {@code FittedValueCoverageIT} runs a smaller one):
 * {@code java -cp bench/target/benchmarks.jar org.zweep.bench.analysis.FitCoverageCheck [RUNS [MODE [THREADS]]]}
 * with MODE {@code none} (no compensation, a fixture without residuals: independent fits),
 * {@code open-short} (host-side open/short, fixture residuals) or {@code osl} (open/short/load with a
 * load stated as 100 Ω, U = 0.6 Ω, k = 2, each run's load drawn from that statement). Each run is
 * {@code zweep run} of a 1 µF, 20 mΩ, 1 nH series-RLC capacitor on the in-process simulator
 * (timing none) that states its accuracy (k = 2) and errs as it states, nine drive levels of 25
 * frequencies (one weighted fit each), seeds 1..RUNS. Prints, per fitted value, the fraction of
 * fits within ±2σ of the netlist's value (SRF: ±2u of 5.033 MHz) with two standard errors: the
 * binomial one and the one from the spread between runs (the fits of a run share its standards'
 * readings, and with open/short/load its load error).
 */
public final class FitCoverageCheck {
    private FitCoverageCheck() {
    }

    private static final String ACCURACY_DIALECT = """
            accuracy:
              distribution: normal-k2
              bands:
                low: 10 .. 2e7 Hz; 0.05 .. 0.15 V; 0 s; 0.5 %; 2e-3 ohm; 2e-9 S; phase 0.004 rad
                high: 10 .. 2e7 Hz; 0.3 .. 2 V; 0 s; 0.2 %; 1e-3 ohm; 1e-9 S; phase 0.002 rad
            """;

    private static final String ACCURACY_BENCH = """
              accuracy:
                distribution: normal-k2
                bands:
                  - {frequency_hz: [10, 2.0e7], level_vrms: [0.05, 0.15], integration_min_s: 0,
                     basic: 0.005, short_ohm: 2.0e-3, open_s: 2.0e-9, phase_rad: 0.004}
                  - {frequency_hz: [10, 2.0e7], level_vrms: [0.3, 2], integration_min_s: 0,
                     basic: 0.002, short_ohm: 1.0e-3, open_s: 1.0e-9, phase_rad: 0.002}
            """;

    private static final Map<String, Double> NETLIST = new LinkedHashMap<>(Map.of("c_f", 1e-6, "esr_ohm", 0.02,
            "esl_h", 1e-9));
    private static final double SRF_HZ = 1 / (2 * Math.PI * Math.sqrt(1e-9 * 1e-6));

    public static void main(String[] args) throws Exception {
        int runs = args.length > 0 ? Integer.parseInt(args[0]) : 200;
        String mode = args.length > 1 ? args[1] : "none";
        int threads = args.length > 2 ? Integer.parseInt(args[2]) : 2;
        Path dir = Files.createTempDirectory("zweep-fit-coverage");
        String standard;
        try (InputStream in = Dialect.class.getResourceAsStream("standard.yaml")) {
            standard = new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        Path dialect = dir.resolve("stated.yaml");
        Files.writeString(dialect, standard + "\n" + ACCURACY_DIALECT);
        Map<String, List<int[]>> perRun = new LinkedHashMap<>();
        long start = System.nanoTime();
        ExecutorService pool = Executors.newFixedThreadPool(threads);
        List<Future<Map<String, int[]>>> done = new ArrayList<>();
        for (int seed = 1; seed <= runs; seed++) {
            int s = seed;
            done.add(pool.submit(() -> oneRun(dir, dialect, mode, s)));
        }
        for (Future<Map<String, int[]>> f : done) {
            f.get().forEach((k, c) -> perRun.computeIfAbsent(k, x -> new ArrayList<>()).add(c));
        }
        pool.shutdown();
        System.out.printf(Locale.ROOT, "%s, %d runs × 9 levels, %.0f s%n", mode, runs, (System.nanoTime() - start) / 1e9);
        perRun.forEach((k, list) -> {
            int in = list.stream().mapToInt(c -> c[0]).sum();
            int n = list.stream().mapToInt(c -> c[1]).sum();
            double p = in / (double) n;
            double[] fr = list.stream().mapToDouble(c -> c[0] / (double) c[1]).toArray();
            double m = java.util.Arrays.stream(fr).average().orElseThrow();
            double se = Math.sqrt(java.util.Arrays.stream(fr).map(x -> (x - m) * (x - m)).sum() / (fr.length - 1)
                    / fr.length);
            System.out.printf(Locale.ROOT, "  %-8s %5.1f %% of %d fits within ±2σ (±%.1f %% binomial, ±%.1f %% between runs)%n",
                    k, 100 * p, n, 100 * Math.sqrt(p * (1 - p) / n), 100 * se);
        });
    }

    private static Map<String, int[]> oneRun(Path dir, Path dialect, String mode, int seed) throws Exception {
        String fixture = "none".equals(mode)
                ? "  residual_resistance_ohm: 0\n  residual_inductance_h: 0\n  stray_conductance_s: 0\n"
                        + "  stray_capacitance_f: 0\n"
                : "  residual_resistance_ohm: 0.005\n  residual_inductance_h: 5.0e-9\n  stray_conductance_s: 1.0e-9\n"
                        + "  stray_capacitance_f: 10.0e-12\n";
        String load = "osl".equals(mode) ? String.format(Locale.ROOT, "load:\n  resistance_ohm: %.9f\n",
                100 + 0.3 * new Random(1000 + seed).nextGaussian()) : "";
        String compensation = switch (mode) {
            case "none" -> "  compensation: none";
            case "open-short" -> "  compensation: host";
            case "osl" -> "  compensation: host\n  standards: [open, short, load]\n  load: {r: 100 ohm, u_r: 0.6 ohm, k: 2}";
            default -> throw new IllegalArgumentException("MODE is none, open-short or osl, not " + mode);
        };
        Path bench = dir.resolve("bench-" + seed + ".yaml");
        Files.writeString(bench, "seed: 1\nmeter:\n  timing: none\n" + ACCURACY_BENCH + load + "fixture:\n"
                + "  connection: 4-terminal\n" + fixture
                + "device:\n  netlist: |\n    R1 hi a 20m\n    L1 a b 1n\n    C1 b lo 1u\n");
        Path seq = dir.resolve("seq-" + seed + ".yaml");
        Files.writeString(seq, """
                format: zweep-sequence/1
                name: fit-coverage
                meter:
                  address: "sim:%s"
                  dialect: "%s"
                safety:
                  max_bias_voltage: 0 V
                  max_bias_current: 0 A
                  max_level_voltage: 1 V
                  max_level_current: 0 A
                fixture:
                  terminals: 4
                %s
                part:
                  kind: capacitor
                  nominal: 1 uF
                  tolerance: K
                steps:
                  - name: sweep
                    frequency: {start: 1 kHz, stop: 20 MHz, points: 25, spacing: log}
                    level: [0.05 V, 0.075 V, 0.1 V, 0.125 V, 0.15 V, 0.3 V, 0.5 V, 0.75 V, 1 V]
                    integration: 10 ms
                """.formatted(bench, dialect, compensation));
        Path out = dir.resolve("run-" + seed);
        StringWriter err = new StringWriter();
        int code = Cli.run(new String[] {"run", seq.toString(), "--out", out.toString(), "--seed",
            String.valueOf(seed), "--quiet", "--no-index"}, new PrintWriter(new StringWriter()), new PrintWriter(err));
        if (code != 0 && code != 1) {
            throw new IllegalStateException("run " + seed + " exited " + code + ": " + err);
        }
        AnalysisResult a = Analysis.analyze(RunData.read(out), null);
        Map<String, int[]> c = new LinkedHashMap<>();
        for (StepResult.SweepFit sf : a.step("sweep").fits()) {
            CircuitFit f = sf.fit();
            NETLIST.forEach((k, v) -> {
                int[] t = c.computeIfAbsent(k, x -> new int[2]);
                t[0] += f.sigma().get(k) != null && Math.abs(f.value(k) - v) <= 2 * f.sigma().get(k) ? 1 : 0;
                t[1]++;
            });
            int[] t = c.computeIfAbsent("srf_hz", x -> new int[2]);
            t[0] += f.srfHz() != null && Math.abs(f.srfHz() - SRF_HZ) <= 2 * f.srfU() ? 1 : 0;
            t[1]++;
        }
        return c;
    }
}
