package org.zweep.runner.compare;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.verdict.CheckOutcome;

/**
 * Two or more runs side by side: every check's value and every fitted element of each step's
 * first fitted sweep, per run, with the difference from the first run (the reference) and the
 * relative change. Values are SI; {@code NaN} where a run has no such value.
 *
 * @param runs the runs, the reference first
 * @param rows the compared quantities: checks first (in the reference's order), then fits
 */
public record Comparison(List<Run> runs, List<Row> rows) {

    /**
     * One run compared.
     *
     * @param folder its folder
     * @param label how tables name it (the serial, else the folder's name)
     * @param manifest its {@code run.json}
     * @param analysis its analysis
     */
    public record Run(Path folder, String label, RunManifest manifest, AnalysisResult analysis) {
    }

    /**
     * One quantity across the runs.
     *
     * @param kind {@code check} or {@code fit}
     * @param name the check's name, or {@code STEP/ELEMENT} for a fitted element
     * @param parameter the parameter (checks) or element (fits), whose suffix names the unit
     * @param values one per run
     */
    public record Row(String kind, String name, String parameter, List<Double> values) {
        /** Run {@code i}'s value minus the reference's. */
        public double difference(int i) {
            return values.get(i) - values.get(0);
        }

        /** The difference relative to the reference's value ({@code NaN} when that is 0). */
        public double relative(int i) {
            double ref = values.get(0);
            return ref == 0 ? Double.NaN : difference(i) / Math.abs(ref);
        }
    }

    /** Reads and analyses {@code folders} (at least two) and compares them. */
    public static Comparison of(List<Path> folders) {
        List<Run> runs = new ArrayList<>();
        for (Path f : folders) {
            RunData data = RunData.read(f).requirePoints();
            RunManifest m = data.manifest();
            String serial = m.identityOrNone().serial();
            String label = serial != null ? serial : String.valueOf(f.toAbsolutePath().normalize().getFileName());
            runs.add(new Run(f, label, m, Analysis.analyze(data, null)));
        }
        Map<String, Row> rows = new LinkedHashMap<>();
        for (int i = 0; i < runs.size(); i++) {
            AnalysisResult a = runs.get(i).analysis();
            for (CheckOutcome c : a.checks()) {
                row(rows, runs.size(), "check", c.name(), c.parameter()).values().set(i, c.lastValue());
            }
        }
        for (int i = 0; i < runs.size(); i++) {
            for (StepResult s : runs.get(i).analysis().steps()) {
                StepResult.SweepFit f = s.primaryFit();
                if (f == null) {
                    continue;
                }
                for (Map.Entry<String, Double> e : f.fit().parameters().entrySet()) {
                    row(rows, runs.size(), "fit", s.name() + "/" + e.getKey(), e.getKey()).values().set(i,
                            e.getValue() == null ? Double.NaN : e.getValue());
                }
            }
        }
        return new Comparison(List.copyOf(runs), List.copyOf(rows.values()));
    }

    private static Row row(Map<String, Row> rows, int n, String kind, String name, String parameter) {
        return rows.computeIfAbsent(kind + ":" + name, k -> {
            List<Double> values = new ArrayList<>();
            for (int i = 0; i < n; i++) {
                values.add(Double.NaN);
            }
            return new Row(kind, name, parameter, values);
        });
    }
}
