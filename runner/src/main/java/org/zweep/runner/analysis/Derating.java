package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.zweep.runner.text.Figures;

/**
 * How a value (C or L) falls with DC bias: each point as a percentage of its value at zero bias,
 * and the bias at which it has fallen by given percentages, by linear interpolation between the
 * two points around the crossing (the first crossing, going up in bias).
 *
 * @param quantity the column derated, {@code cs_f} or {@code ls_h}
 * @param frequencyHz the test frequency
 * @param level the drive level (V rms or A rms)
 * @param biasMode {@code V} or {@code A}
 * @param referenceBias the bias of the reference value (0, or the smallest bias swept)
 * @param referenceValue the value there, in F or H
 * @param points every bias point, ascending
 * @param drops for each drop percentage, the bias where the value has fallen by it; {@code null}
 *     when the sweep never falls that far
 * @param notes explanations for people
 */
public record Derating(String quantity, double frequencyHz, double level, String biasMode, double referenceBias,
        double referenceValue, List<Point> points, Map<Integer, Double> drops, List<String> notes) {
    /** Drop percentages reported for capacitors unless the step names its own. */
    public static final List<Integer> CAPACITOR_DROPS = List.of(20, 50);
    /** Drop percentages reported for inductors (saturation current) unless the step names its own. */
    public static final List<Integer> INDUCTOR_DROPS = List.of(10, 20, 30);

    public Derating {
        points = List.copyOf(points);
        drops = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(drops));
        notes = List.copyOf(notes);
    }

    /**
     * One bias point.
     *
     * @param bias DC bias in V or A
     * @param value the value in F or H
     * @param percent the value as % of the reference
     */
    public record Point(double bias, double value, double percent) {
    }

    /**
     * Derates {@code values} (one per bias, any order, biases distinct) at the given drops.
     * Negative biases are left out (the search goes up from zero).
     */
    public static Derating of(String quantity, double frequencyHz, double level, String biasMode, double[] biases,
            double[] values, List<Integer> dropsPercent) {
        List<double[]> pts = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        boolean negative = false;
        for (int i = 0; i < biases.length; i++) {
            if (biases[i] < 0) {
                negative = true;
            } else if (Double.isFinite(values[i])) {
                pts.add(new double[] {biases[i], values[i]});
            }
        }
        if (negative) {
            notes.add("negative bias points left out of the derating");
        }
        pts.sort((a, b) -> Double.compare(a[0], b[0]));
        if (pts.isEmpty()) {
            throw new IllegalArgumentException("no bias points");
        }
        double refBias = pts.get(0)[0];
        double ref = pts.get(0)[1];
        if (refBias != 0) {
            notes.add(String.format(Locale.ROOT, "no 0 %s point: values are relative to the one at %s", biasMode,
                    Figures.format(refBias, Figures.unit(biasMode))));
        }
        List<Point> points = new ArrayList<>();
        for (double[] p : pts) {
            points.add(new Point(p[0], p[1], 100 * p[1] / ref));
        }
        Map<Integer, Double> drops = new LinkedHashMap<>();
        for (int drop : dropsPercent) {
            Double at = biasAtDrop(points, drop);
            drops.put(drop, at);
            if (at == null) {
                double min = points.stream().mapToDouble(Point::percent).min().orElseThrow();
                notes.add(String.format(Locale.ROOT, "never falls by %d %% up to %s (lowest %.1f %% of the %s value)",
                        drop, Figures.format(points.get(points.size() - 1).bias(), Figures.unit(biasMode)), min,
                        Figures.format(refBias, Figures.unit(biasMode))));
            }
        }
        return new Derating(quantity, frequencyHz, level, biasMode, refBias, ref, points, drops, notes);
    }

    /**
     * The bias where the value has first fallen by {@code dropPercent} (linear interpolation
     * between the two points around the crossing), or null when it never falls that far.
     */
    public Double biasAtDrop(double dropPercent) {
        return biasAtDrop(points, dropPercent);
    }

    private static Double biasAtDrop(List<Point> points, double drop) {
        double target = 100 - drop;
        for (int i = 1; i < points.size(); i++) {
            Point a = points.get(i - 1);
            Point b = points.get(i);
            if (b.percent() <= target && a.percent() > target) {
                return a.bias() + (b.bias() - a.bias()) * (a.percent() - target) / (a.percent() - b.percent());
            }
        }
        return null;
    }
}
