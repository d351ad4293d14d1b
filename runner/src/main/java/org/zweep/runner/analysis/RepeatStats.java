package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
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

    /** The statistics of every point of {@code rows} (one step) read more than once. */
    static List<RepeatStats> of(List<PointRow> rows, List<String> columns) {
        Map<String, List<PointRow>> groups = new LinkedHashMap<>();
        for (PointRow r : rows) {
            if ("ok".equals(r.status()) && "impedance".equals(r.quantity())) {
                groups.computeIfAbsent(r.frequencyHz() + "|" + r.level() + "|" + r.bias() + "|" + r.wiring(),
                        k -> new ArrayList<>()).add(r);
            }
        }
        List<RepeatStats> out = new ArrayList<>();
        for (List<PointRow> g : groups.values()) {
            if (g.size() < 2) {
                continue;
            }
            Map<String, Double> mean = new LinkedHashMap<>();
            Map<String, Double> std = new LinkedHashMap<>();
            Map<String, Double> rel = new LinkedHashMap<>();
            for (String c : columns) {
                SummaryStatistics s = new SummaryStatistics();
                g.forEach(r -> s.addValue(r.value(c)));
                mean.put(c, s.getMean());
                std.put(c, s.getStandardDeviation());
                rel.put(c, s.getStandardDeviation() / Math.abs(s.getMean()));
            }
            PointRow f = g.get(0);
            out.add(new RepeatStats(f.frequencyHz(), f.level(), f.bias(), f.wiring(), g.size(), mean, std, rel));
        }
        return out;
    }
}
