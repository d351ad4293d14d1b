package org.zweep.runner.it;

import org.zweep.runner.testsupport.Ngspice;
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
import java.util.TreeMap;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.results.PointRow;

/**
 * Coverage, end to end: devices whose true impedance ngspice computes from their netlist are run
 * through {@code zweep run} on a simulated bench that states its accuracy (limits at k = 2) and
 * errs as it states, with host-side open/short compensation, under a dialect that states the
 * same accuracy. The fraction of points whose true R, X, |Z| and θ lie within the reported ±U
 * (k = 2) must be 95 % within the statistics of the sample (a normal variable lies within ±2σ
 * with probability 0.9545, Abramowitz and Stegun, Table 26.1). The figures are printed for README.
 * Fitted values: {@link FittedValueCoverageIT}.
 */
class UncertaintyCoverageIT {
    @TempDir
    Path dir;

    private static final String ACCURACY_DIALECT = DeclaredAccuracy.DIALECT;
    private static final String ACCURACY_BENCH = DeclaredAccuracy.BENCH;

    /** A device: its part kind, nominal, netlist (terminals hi, lo) and sweep. */
    private record Device(String name, String kind, String nominal, String netlist, String sweep) {
    }

    private static final List<Device> DEVICES = List.of(
            new Device("cap", "capacitor", "1 uF", "R1 hi a 20m\nL1 a b 1n\nC1 b lo 1u",
                    "{start: 1 kHz, stop: 20 MHz, points: 25, spacing: log}"),
            new Device("ind", "inductor", "100 uH", "R1 hi a 0.5\nL1 a lo 100u\nC1 hi lo 3p",
                    "{start: 100 Hz, stop: 5 MHz, points: 25, spacing: log}"),
            new Device("res", "resistor", "1 kohm", "R1 hi a 1k\nL1 a lo 1.5n\nC1 hi lo 0.08p",
                    "{start: 100 Hz, stop: 20 MHz, points: 25, spacing: log}"),
            new Device("leaky", "capacitor", "10 nF", "R1 hi a 0.2\nL1 a b 2n\nC1 b lo 10n\nR2 b lo 200k",
                    "{start: 100 Hz, stop: 10 MHz, points: 25, spacing: log}"));


    /** The netlist's impedance at each frequency, by ngspice (AC analysis, 1 V source, Z = V/I). */
    private Map<Double, Impedance> truth(Device d, List<Double> frequencies) throws Exception {
        Path out = dir.resolve(d.name() + "-z.txt");
        StringBuilder control = new StringBuilder();
        for (double f : frequencies) {
            String ff = String.format(Locale.ROOT, "%.17g", f);
            control.append("ac lin 1 ").append(ff).append(' ').append(ff).append('\n')
                    .append("let z = v(hi)/(-i(V1))\nwrdata ").append(out).append(" real(z) imag(z)\n");
        }
        String deck = "* " + d.name() + "\nV1 hi 0 DC 0 AC 1\n" + d.netlist().replace(" lo", " 0") + "\n.control\n"
                + "set wr_singlescale\nset appendwrite\noption numdgt=15\n" + control + "quit\n.endc\n.end\n";
        Path cir = dir.resolve(d.name() + ".cir");
        Files.writeString(cir, deck);
        Process p = new ProcessBuilder(Ngspice.executable(), "-b", cir.toString()).redirectErrorStream(true)
                .redirectOutput(dir.resolve(d.name() + "-ngspice.log").toFile()).start();
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "ngspice finished");
        assertEquals(0, p.exitValue(), Files.readString(dir.resolve(d.name() + "-ngspice.log")));
        List<Impedance> z = new ArrayList<>();
        for (String line : Files.readAllLines(out)) {
            String[] c = line.strip().split("\\s+");
            if (c.length == 3 && c[0].matches("[-+0-9.eE]+")) {
                z.add(new Impedance(Double.parseDouble(c[0]), Double.parseDouble(c[1]), Double.parseDouble(c[2])));
            }
        }
        assertEquals(frequencies.size(), z.size(), "one ngspice point per frequency");
        Map<Double, Impedance> byF = new TreeMap<>();
        for (int i = 0; i < z.size(); i++) {
            byF.put(frequencies.get(i), z.get(i));
        }
        return byF;
    }

    private Path dialect() throws Exception {
        String standard;
        try (InputStream in = Dialect.class.getResourceAsStream("standard.yaml")) {
            standard = new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        Path p = dir.resolve("stated.yaml");
        Files.writeString(p, standard + "\n" + ACCURACY_DIALECT);
        return p;
    }

    private Path bench(Device d) throws Exception {
        return bench(d, d.name(), "");
    }

    /** A bench for {@code d} named {@code name}, with {@code extra} (such as a load section) appended. */
    private Path bench(Device d, String name, String extra) throws Exception {
        Path p = dir.resolve(name + ".bench.yaml");
        Files.writeString(p, "seed: 1\nmeter:\n  timing: none\n" + ACCURACY_BENCH + extra
                + "fixture:\n  connection: 4-terminal\n  residual_resistance_ohm: 0.005\n"
                + "  residual_inductance_h: 5.0e-9\n  stray_conductance_s: 1.0e-9\n  stray_capacitance_f: 10.0e-12\n"
                + "device:\n  netlist: |\n" + d.netlist().lines().map(l -> "    " + l + "\n")
                        .reduce("", String::concat));
        return p;
    }

    private Path run(Device d, Path bench, Path dialect, int seed) throws Exception {
        return run(d, bench, dialect, seed, "");
    }

    /** Runs {@code d} with host-side compensation; {@code standards} replaces the default [open, short] when given. */
    private Path run(Device d, Path bench, Path dialect, int seed, String standards) throws Exception {
        String seq = """
                format: zweep-sequence/1
                name: coverage-%s
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
                  compensation: host
                %s
                part:
                  kind: %s
                  nominal: %s
                  tolerance: K
                steps:
                  - name: sweep
                    frequency: %s
                    level: [0.1 V, 0.5 V, 1 V]
                    integration: 10 ms
                """.formatted(d.name() + (standards.isEmpty() ? "" : "-osl"), bench, dialect, standards, d.kind(),
                d.nominal(), d.sweep());
        Path file = dir.resolve("coverage-" + d.name() + ".yaml");
        Files.writeString(file, seq);
        Path out = dir.resolve("out-" + d.name() + (standards.isEmpty() ? "" : "-osl") + "-" + seed);
        Sims.Result r = Sims.zweep("run", file.toString(), "--out", out.toString(), "--seed", String.valueOf(seed),
                "--quiet");
        assertTrue(r.code() == 0 || r.code() == 1, r.out() + r.err());
        return out;
    }

    /** Counts of values inside ±U, per parameter. */
    private static final class Tally {
        final Map<String, int[]> counts = new LinkedHashMap<>();

        void add(String name, boolean inside) {
            int[] c = counts.computeIfAbsent(name, k -> new int[2]);
            c[0] += inside ? 1 : 0;
            c[1]++;
        }

        double fraction(String name) {
            int[] c = counts.get(name);
            return c[0] / (double) c[1];
        }

        int total(String name) {
            return counts.get(name)[1];
        }
    }

    @Test
    void ninetyFivePercentOfTrueValuesLieWithinTheReportedExpandedUncertainty() throws Exception {
        Path dialect = dialect();
        int seeds = 4;
        Tally points = new Tally();
        List<String> implausible = new ArrayList<>();
        Map<String, Map<Double, Impedance>> truths = new LinkedHashMap<>();
        for (Device d : DEVICES) {
            Path bench = bench(d);
            Map<Double, Impedance> truth = null;
            for (int seed = 1; seed <= (d.name().equals("cap") ? 2 * seeds : seeds); seed++) {
                Path out = run(d, bench, dialect, seed);
                Map<Integer, PointRow> rows = Rows.of(out);
                if (truth == null) {
                    truth = truth(d, rows.values().stream().map(PointRow::frequencyHz).distinct().sorted().toList());
                    truths.put(d.name(), truth);
                }
                for (PointRow row : rows.values()) {
                    // a nearly lossless point (the inductor near its resonance: R about 1 ohm, u(R) about
                    // 13 ohm) reads R < 0 about half the time and, now and then, beyond what the run takes
                    // for noise: it is stored with its value, flagged implausible, and counted here. Measured
                    // with this bench: 3 of 16 seeds give one such point in 75 (2 of 16 before the
                    // simulator keyed its own noise) - common practice, no source
                    String where = row.frequencyHz() + " Hz, status " + row.status() + " (" + d.name() + ", seed "
                            + seed + ", level " + row.level() + ": R = " + row.rOhm() + " ohm, X = " + row.xOhm()
                            + " ohm, u(R) = " + (row.uncertainty() == null ? "?" : row.uncertainty().of("r_ohm"))
                            + " ohm)";
                    assertTrue(row.okImpedance() || ("implausible".equals(row.status())
                            && Double.isFinite(row.rOhm()) && Double.isFinite(row.xOhm())), "a value at " + where);
                    if (!row.okImpedance()) {
                        implausible.add(where);
                    }
                    Impedance t = truth.get(row.frequencyHz());
                    for (String p : List.of("r_ohm", "x_ohm", "z_ohm", "theta_deg")) {
                        double tv = switch (p) {
                            case "r_ohm" -> t.resistanceOhm();
                            case "x_ohm" -> t.reactanceOhm();
                            case "z_ohm" -> t.magnitudeOhm();
                            default -> t.phaseDeg();
                        };
                        double u = row.uncertainty().of(p);
                        assertTrue(u > 0, p + " has a reported uncertainty");
                        points.add(p, Math.abs(row.value(p) - tv) <= 2 * u);
                    }
                }
            }
        }
        // open/short/load with a load standard stated as 100 Ω, U = 0.6 Ω (k = 2): each run's bench holds a
        // load whose true value is drawn from that statement, so the load's error is common to every point of
        // the run. Measured 2026-12-03: with the load's u, X 94.6 % and |Z| 95.0 % of 1500 points; with the
        // same runs but the load stated as exact, 85.5 % and 85.9 %, which this test refuses
        Tally osl = new Tally();
        Device cap = DEVICES.get(0);
        Map<Double, Impedance> capTruth = truths.get(cap.name());
        for (int seed = 1; seed <= 20; seed++) {
            double loadTrue = 100 + 0.3 * new java.util.Random(1000 + seed).nextGaussian();
            Path bench = bench(cap, "cap-osl-" + seed, String.format(Locale.ROOT, "load:\n  resistance_ohm: %.9f\n",
                    loadTrue));
            Path out = run(cap, bench, dialect, seed, "  standards: [open, short, load]\n"
                    + "  load: {r: 100 ohm, u_r: 0.6 ohm, k: 2}");
            Map<Integer, PointRow> rows = Rows.of(out);
            for (PointRow row : rows.values()) {
                Impedance t = capTruth.get(row.frequencyHz());
                osl.add("r_ohm", Math.abs(row.value("r_ohm") - t.resistanceOhm()) <= 2 * row.uncertainty().of("r_ohm"));
                osl.add("x_ohm", Math.abs(row.value("x_ohm") - t.reactanceOhm()) <= 2 * row.uncertainty().of("x_ohm"));
                osl.add("z_ohm", Math.abs(row.value("z_ohm") - t.magnitudeOhm()) <= 2 * row.uncertainty().of("z_ohm"));
            }
        }
        StringBuilder report = new StringBuilder("coverage of ±U (k = 2):");
        points.counts.keySet().forEach(p -> report.append(String.format(Locale.ROOT, " %s %.1f %% of %d;", p,
                100 * points.fraction(p), points.total(p))));
        report.append(" open/short/load with the load's stated u:");
        osl.counts.keySet().forEach(p -> report.append(String.format(Locale.ROOT, " %s %.1f %% of %d;", p,
                100 * osl.fraction(p), osl.total(p))));
        System.out.println(report);
        // flagged points stay rare: about 0.75 expected in these runs (3 in 16 inductor runs of 75 points,
        // 4 runs here); four or more (Poisson, under 1 %) means the noise or the rule changed
        assertTrue(implausible.size() <= 3, implausible.toString());
        for (String p : osl.counts.keySet()) {
            assertTrue(osl.total(p) >= 1000, p + ": at least 1000 points");
            assertEquals(0.95, osl.fraction(p), 0.02, report.toString()); // as above
        }
        for (String p : points.counts.keySet()) {
            assertTrue(points.total(p) >= 1000, p + ": at least 1000 points");
            // issue 12: 95 % ± 2 % (a normal variable within ±2σ: 95.45 %, Abramowitz and Stegun, Table 26.1)
            assertEquals(0.95, points.fraction(p), 0.02, report.toString());
        }
    }
}
