package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.zweep.runner.results.PointRow;

/**
 * The spread of repeated readings of one point (same step, frequency, level, bias, wiring).
 *
 * @param frequencyHz test frequency
 * @param level drive level
 * @param bias DC bias
 * @param wiring the wiring
 * @param count the number of readings
 * @param mean the mean of each statistic's column ({@code r_ohm}, {@code x_ohm} and the part's
 *     main column)
 * @param std the sample standard deviation (n − 1) of each
 * @param relativeSpread std/|mean| of each
 */
public record RepeatStats(double frequencyHz, double level, double bias, String wiring, int count,
        Map<String, Double> mean, Map<String, Double> std, Map<String, Double> relativeSpread) {
    public RepeatStats {
        mean = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(mean));
        std = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(std));
        relativeSpread = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(relativeSpread));
    }

    /**
     * Gathers the repeats of one step from its rows as they stream by: a running count, mean and
     * sum of squared deviations (Welford's update) per distinct point and column, not the rows.
     * Not thread-safe.
     */
    static final class Collector {
        private final List<String> columns;
        private final Map<Key, double[]> groups = new LinkedHashMap<>();

        /** Statistics of {@code columns} ({@code r_ohm}, {@code x_ohm}, the part's main column). */
        Collector(List<String> columns) {
            this.columns = List.copyOf(columns);
        }

        /** Takes {@code r} when it is an impedance row with a value. */
        void add(PointRow r) {
            if (!"ok".equals(r.status()) || !"impedance".equals(r.quantity())) {
                return;
            }
            // [count, then mean and M2 per column]
            double[] acc = groups.computeIfAbsent(new Key(r.frequencyHz(), r.level(), r.bias(), r.wiring()),
                    k -> new double[1 + 2 * columns.size()]);
            double n = ++acc[0];
            for (int i = 0; i < columns.size(); i++) {
                double v = r.value(columns.get(i));
                double d = v - acc[1 + 2 * i];
                acc[1 + 2 * i] += d / n;
                acc[2 + 2 * i] += d * (v - acc[1 + 2 * i]);
            }
        }

        /** The statistics of every point read more than once, in order of first appearance. */
        List<RepeatStats> stats() {
            List<RepeatStats> out = new ArrayList<>();
            groups.forEach((k, acc) -> {
                int n = (int) acc[0];
                if (n < 2) {
                    return;
                }
                Map<String, Double> mean = new LinkedHashMap<>();
                Map<String, Double> std = new LinkedHashMap<>();
                Map<String, Double> rel = new LinkedHashMap<>();
                for (int i = 0; i < columns.size(); i++) {
                    double m = acc[1 + 2 * i];
                    double sd = Math.sqrt(acc[2 + 2 * i] / (n - 1));
                    mean.put(columns.get(i), m);
                    std.put(columns.get(i), sd);
                    rel.put(columns.get(i), sd / Math.abs(m));
                }
                out.add(new RepeatStats(k.frequencyHz(), k.level(), k.bias(), k.wiring(), n, mean, std, rel));
            });
            return out;
        }

        private record Key(double frequencyHz, double level, double bias, String wiring) {
        }
    }
}
