package org.zweep.runner.analysis;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.PointsCsvWriter;
import org.zweep.runner.results.RunManifest;

/** Writes small run folders in the RUNFOLDER.md format with the engine's own writers, for tests. */
public final class TestRunFolders {
    private final Path dir;
    private final List<PointRow> rows = new ArrayList<>();
    private final Map<String, Integer> steps = new LinkedHashMap<>();
    private final List<RunManifest.CheckInfo> checks = new ArrayList<>();
    private RunManifest.PartInfo part = new RunManifest.PartInfo("capacitor", "KP-C0805-104", 100e-9, "F", 10.0, null);
    private Instant time = Instant.parse("2024-05-01T10:00:00Z");
    private double relativeU = Double.NaN;

    public TestRunFolders(Path dir) {
        this.dir = dir;
    }

    public TestRunFolders part(String kind, String name, double nominal, String unit, Double tolerance, Double turns) {
        part = new RunManifest.PartInfo(kind, name, nominal, unit, tolerance, turns);
        return this;
    }

    /**
     * Impedance rows added from now on carry u(R) = u(X) = {@code relative}·|Z|, r = 0 (as if the
     * meter stated that accuracy); NaN for none.
     */
    public TestRunFolders uncertainty(double relative) {
        relativeU = relative;
        return this;
    }

    /** Adds impedance rows for {@code sweep}, one per point, at the given conditions. */
    public TestRunFolders impedance(String step, List<Impedance> sweep, String drive, double level, String biasMode,
            double bias, String wiring, int repeat) {
        int index = steps.computeIfAbsent(step, s -> steps.size());
        for (Impedance z : sweep) {
            time = time.plusMillis(100);
            rows.add(PointRow.of(new PointRow.Key(rows.size(), step, index, repeat), new PointRow.Conditions("impedance",
                    wiring, z.frequencyHz(), new PointRow.Source(drive, level), new PointRow.Source(biasMode, bias)),
                    true, z.resistanceOhm(), z.reactanceOhm(), Double.isNaN(relativeU) ? null
                            : new org.zweep.driver.uncertainty.UncertainImpedance(z, relativeU * z.magnitudeOhm(),
                                    relativeU * z.magnitudeOhm(), 0), "", time));
        }
        return this;
    }

    /** Adds one voltage-ratio row with |V2/V1| = {@code ratio}. */
    public TestRunFolders ratio(String step, double frequencyHz, double ratio) {
        int index = steps.computeIfAbsent(step, s -> steps.size());
        time = time.plusMillis(100);
        rows.add(PointRow.of(new PointRow.Key(rows.size(), step, index, 0), new PointRow.Conditions("voltage_ratio",
                "secondary_open", frequencyHz, new PointRow.Source("V", 1.0), new PointRow.Source("V", 0.0)), true,
                ratio, 0.0, "", time));
        return this;
    }

    /** Adds one impedance row without a value (the meter gave none) at {@code frequencyHz}. */
    public TestRunFolders noValue(String step, double frequencyHz) {
        int index = steps.computeIfAbsent(step, s -> steps.size());
        time = time.plusMillis(100);
        rows.add(PointRow.of(new PointRow.Key(rows.size(), step, index, 0), new PointRow.Conditions("impedance", "none",
                frequencyHz, new PointRow.Source("V", 1.0), new PointRow.Source("V", 0.0)), false, Double.NaN,
                Double.NaN, "", time));
        return this;
    }

    public TestRunFolders check(String name, String parameter, String step, Double frequencyHz, Double min, Double max) {
        checks.add(new RunManifest.CheckInfo(name, parameter, step, frequencyHz, min, max));
        return this;
    }

    /** A check under decision rule {@code rule} ({@code simple}, {@code guarded}, {@code probability 0.95}). */
    public TestRunFolders check(String name, String parameter, String step, Double frequencyHz, Double min, Double max,
            String rule) {
        checks.add(new RunManifest.CheckInfo(name, parameter, step, frequencyHz, min, max, null, null, null, rule));
        return this;
    }

    /** The last check made a {@code saturation} check: the bias at a {@code dropPercent} % drop, under {@code rule}. */
    public TestRunFolders withDrop(double dropPercent, String rule) {
        RunManifest.CheckInfo c = checks.remove(checks.size() - 1);
        checks.add(new RunManifest.CheckInfo(c.name(), c.parameter(), c.step(), c.frequencyHz(), c.min(), c.max(), null,
                null, dropPercent, rule));
        return this;
    }

    /**
     * A transformer run, all figures computed: L1 = 10 mH, n = 4, k = 0.99, so Lsc1 = L1(1 − k²) = 199.0 µH and
     * V1/V2 = L1/M = 4.0404; steps {@code open}, {@code short} and {@code ratio}, at 1 kHz.
     */
    public static TestRunFolders x7Transformer(Path dir) {
        double w = 2 * Math.PI * 1000;
        double m = 0.99 * Math.sqrt(10e-3 * 0.625e-3);
        return new TestRunFolders(dir).part("transformer", "KP-T-4", 10e-3, "H", null, 4.0)
                .impedance("open", List.of(new Impedance(1000, 2.0, w * 10e-3)), "V", 1.0, "V", 0, "secondary_open", 0)
                .impedance("short", List.of(new Impedance(1000, 2.5, w * 199.0e-6)), "V", 1.0, "V", 0,
                        "secondary_shorted", 0)
                .ratio("ratio", 1000, m / 10e-3);
    }

    /** Writes points.csv, run.json and sequence.yaml; returns the folder. */
    public Path write() throws Exception {
        Files.createDirectories(dir);
        try (PointsCsvWriter w = PointsCsvWriter.open(dir.resolve("points.csv"))) {
            rows.forEach(w::append);
        }
        Files.writeString(dir.resolve("sequence.yaml"), "name: test\n");
        List<RunManifest.StepInfo> stepInfo = new ArrayList<>();
        steps.forEach((name, index) -> stepInfo.add(new RunManifest.StepInfo(index, name,
                (int) rows.stream().filter(r -> r.step().equals(name)).count())));
        RunManifest.builder().sequence(new RunManifest.SequenceInfo("test", "/tmp/test.yaml", "00", "sequence.yaml"))
                .part(part).steps(stepInfo).checks(checks)
                .meter(new RunManifest.MeterInfo("sim:bench.yaml", "standard", "Korvane Test,SIM-1,0001,1.0"))
                .compensation(new RunManifest.CompensationInfo("none", List.of(), null))
                .software(new RunManifest.SoftwareInfo("zweep", "test")).host("test-host").seed(1L)
                .started("2024-05-01T10:00:00Z").ended(time.toString())
                .counts(new RunManifest.Counts(rows.size(), rows.size())).outcome("completed").verdict("none")
                .build().write(dir.resolve("run.json"));
        return dir;
    }
}
