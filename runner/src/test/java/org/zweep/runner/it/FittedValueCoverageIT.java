package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.InputStream;
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
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.dialect.Dialect;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.EquivalentCircuitFit;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.StepResult;

/**
 * Coverage of fitted values, end to end: a capacitor whose netlist is a series R, L, C (20 mΩ,
 * 1 nH, 1 µF, the very model the analysis fits) is run through {@code zweep run} on a simulated
 * bench that states its accuracy and errs as it states, at nine drive levels per run (one weighted
 * fit each), under a dialect stating the same accuracy; the fraction of fits whose C, ESR, ESL and
 * SRF lie within ±2σ of the netlist's values must be 95 % (a normal estimate lies within ±2σ with
 * probability 0.9545, Abramowitz and Stegun, Table 26.1). Printed for README.
 *
 * <p>Fits are independent only when nothing is shared between them: the fits of one run share its
 * compensation standards' readings (their errors are common to the run's nine fits, though
 * independent from frequency to frequency within each fit), which leaves each fit's coverage as it
 * is but makes the fraction over a run's fits vary more than binomially. So the ±2 % figure is
 * measured where the fits are independent (no compensation, a fixture without residuals: 540 fits
 * estimate 95 % to ±0.9 %, 1σ), and the open/short/load case, whose load standard's error is common
 * to every point and every fit of a run, is measured over runs with its own, wider allowance.
 */
class FittedValueCoverageIT {
    @TempDir
    Path dir;

    private static final String ACCURACY_DIALECT = DeclaredAccuracy.DIALECT;
    private static final String ACCURACY_BENCH = DeclaredAccuracy.BENCH;

    /** The netlist's element values: what the fits must cover. */
    private static final Map<String, Double> NETLIST = Map.of("c_f", 1e-6, "esr_ohm", 0.02, "esl_h", 1e-9);
    /** The series RLC's reactance is zero at 1/(2π√(LC)) = 5.0329 MHz (common practice, no source). */
    private static final double SRF_HZ = 1 / (2 * Math.PI * Math.sqrt(1e-9 * 1e-6));

    private static final String LEVELS = "[0.05 V, 0.075 V, 0.1 V, 0.125 V, 0.15 V, 0.3 V, 0.5 V, 0.75 V, 1 V]";

    private Path dialect() throws Exception {
        String standard;
        try (InputStream in = Dialect.class.getResourceAsStream("standard.yaml")) {
            standard = new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        Path p = dir.resolve("stated.yaml");
        Files.writeString(p, standard + "\n" + ACCURACY_DIALECT);
        return p;
    }

    private Path bench(String name, String fixture, String extra) throws Exception {
        Path p = dir.resolve(name + ".bench.yaml");
        Files.writeString(p, "seed: 1\nmeter:\n  timing: none\n" + ACCURACY_BENCH + extra + "fixture:\n"
                + "  connection: 4-terminal\n" + fixture
                + "device:\n  netlist: |\n    R1 hi a 20m\n    L1 a b 1n\n    C1 b lo 1u\n");
        return p;
    }

    /** Runs the capacitor at nine levels; the run folder. */
    private Path run(String name, Path bench, Path dialect, int seed, String compensation) throws Exception {
        String seq = """
                format: zweep-sequence/1
                name: fit-coverage-%s
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
                    level: %s
                    integration: 10 ms
                """.formatted(name, bench, dialect, compensation, LEVELS);
        Path file = dir.resolve(name + "-" + seed + ".yaml");
        Files.writeString(file, seq);
        Path out = dir.resolve("out-" + name + "-" + seed);
        Sims.Result r = Sims.zweep("run", file.toString(), "--out", out.toString(), "--seed", String.valueOf(seed),
                "--quiet", "--no-index");
        assertTrue(r.code() == 0 || r.code() == 1, r.out() + r.err());
        return out;
    }

    /** Counts of fitted values within ±2σ, per parameter, and per run (for the spread between runs). */
    private static final class Tally {
        final Map<String, int[]> counts = new LinkedHashMap<>();
        final Map<String, List<Double>> perRun = new LinkedHashMap<>();

        synchronized void addRun(Map<String, int[]> run) {
            run.forEach((k, c) -> {
                int[] t = counts.computeIfAbsent(k, x -> new int[2]);
                t[0] += c[0];
                t[1] += c[1];
                perRun.computeIfAbsent(k, x -> new ArrayList<>()).add(c[0] / (double) c[1]);
            });
        }

        double fraction(String k) {
            return counts.get(k)[0] / (double) counts.get(k)[1];
        }

        int total(String k) {
            return counts.get(k)[1];
        }

        /** The standard error of the fraction from the spread of the runs' own fractions (fits of a run may be dependent). */
        double runStandardError(String k) {
            List<Double> v = perRun.get(k);
            double m = v.stream().mapToDouble(Double::doubleValue).average().orElseThrow();
            double ss = v.stream().mapToDouble(x -> (x - m) * (x - m)).sum();
            return Math.sqrt(ss / (v.size() - 1) / v.size());
        }

        String report(String title) {
            StringBuilder b = new StringBuilder(title).append(':');
            counts.keySet().forEach(k -> b.append(String.format(Locale.ROOT, " %s %.1f %% of %d (±%.1f %%);", k,
                    100 * fraction(k), total(k), 100 * runStandardError(k))));
            return b.toString();
        }
    }

    /** Whether each fitted value of {@code f} lies within ±2σ of the netlist's; {@code sigma} gives σ. */
    private static Map<String, int[]> inside(CircuitFit f, Map<String, int[]> into) {
        NETLIST.forEach((k, v) -> {
            int[] c = into.computeIfAbsent(k, x -> new int[2]);
            c[0] += f.sigma().get(k) != null && Math.abs(f.value(k) - v) <= 2 * f.sigma().get(k) ? 1 : 0;
            c[1]++;
        });
        int[] c = into.computeIfAbsent("srf_hz", x -> new int[2]);
        c[0] += f.srfHz() != null && Math.abs(f.srfHz() - SRF_HZ) <= 2 * f.srfU() ? 1 : 0;
        c[1]++;
        return into;
    }

    /** Runs {@code seeds} on two threads (the runs share nothing: their own folders and simulators). */
    private static void parallel(int seeds, SeedTask task) throws Exception {
        ExecutorService pool = Executors.newFixedThreadPool(2);
        try {
            List<Future<?>> done = new ArrayList<>();
            for (int seed = 1; seed <= seeds; seed++) {
                int s = seed;
                done.add(pool.submit(() -> {
                    task.run(s);
                    return null;
                }));
            }
            for (Future<?> f : done) {
                f.get();
            }
        } finally {
            pool.shutdownNow();
        }
    }

    @FunctionalInterface
    private interface SeedTask {
        void run(int seed) throws Exception;
    }

    @Test
    void ninetyFivePercentOfFittedValuesLieWithinTwoSigmaOfTheNetlistsValues() throws Exception {
        Path dialect = dialect();
        // independent fits: no compensation, a fixture without residuals
        Path ideal = bench("ideal", "  residual_resistance_ohm: 0\n  residual_inductance_h: 0\n"
                + "  stray_conductance_s: 0\n  stray_capacitance_f: 0\n", "");
        Tally independent = new Tally();
        parallel(60, seed -> {
            AnalysisResult a = Analysis.analyze(RunData.read(run("ideal", ideal, dialect, seed,
                    "  compensation: none")), null);
            Map<String, int[]> c = new LinkedHashMap<>();
            for (StepResult.SweepFit sf : a.step("sweep").fits()) {
                assertTrue(sf.fit().weighted(), "the fit is weighted by the points' uncertainties");
                inside(sf.fit(), c);
            }
            independent.addRun(c);
        });
        // open/short/load with a load standard stated as 100 Ω, U = 0.6 Ω (k = 2), whose true value each run
        // draws from that statement: its error is common to every point and every fit of the run
        Tally osl = new Tally();
        Tally oslAsIndependent = new Tally();
        parallel(40, seed -> {
            double loadTrue = 100 + 0.3 * new Random(1000 + seed).nextGaussian();
            Path b = bench("osl-" + seed, "  residual_resistance_ohm: 0.005\n  residual_inductance_h: 5.0e-9\n"
                    + "  stray_conductance_s: 1.0e-9\n  stray_capacitance_f: 10.0e-12\n",
                    String.format(Locale.ROOT, "load:\n  resistance_ohm: %.9f\n", loadTrue));
            AnalysisResult a = Analysis.analyze(RunData.read(run("osl", b, dialect, seed,
                    "  compensation: host\n  standards: [open, short, load]\n"
                            + "  load: {r: 100 ohm, u_r: 0.6 ohm, k: 2}")), null);
            Map<String, int[]> c = new LinkedHashMap<>();
            Map<String, int[]> asIndependent = new LinkedHashMap<>();
            for (StepResult.SweepFit sf : a.step("sweep").fits()) {
                inside(sf.fit(), c);
                assertTrue(sf.fit().notes().stream().anyMatch(n -> n.contains("common to every point")),
                        sf.fit().notes().toString());
                // the same points fitted as if the load's error were independent from point to point
                inside(EquivalentCircuitFit.fitWeighted(sf.fit().model(), sf.sweep().uncertainties()), asIndependent);
            }
            osl.addRun(c);
            oslAsIndependent.addRun(asIndependent);
        });
        String report = independent.report("fitted values within ±2σ, independent fits")
                + osl.report(" open/short/load, the load's error common")
                + oslAsIndependent.report(" the same taken as independent per point");
        System.out.println(report);
        for (String k : independent.counts.keySet()) {
            assertTrue(independent.total(k) >= 500, k + ": at least 500 fits");
            // issue 12: 95 % ± 2 % (a normal estimate within ±2σ: 95.45 %, Abramowitz and Stegun, Table 26.1)
            assertEquals(0.95, independent.fraction(k), 0.02, report);
        }
        for (String k : osl.counts.keySet()) {
            // 40 runs: the load's error is shared by a run's nine fits, so the fraction varies as over ~40
            // independent values (±3.5 %, 1σ): allow 3σ
            assertEquals(0.95, osl.fraction(k), 0.1, report);
        }
        // the cause of C's lost coverage when the common error is averaged over the points as if independent
        assertTrue(oslAsIndependent.fraction("c_f") < 0.7, report);
    }
}
