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
 * two points around the crossing (the first crossing, going up in bias). When the points carry
 * standard uncertainties, each crossing gets one too: the law of propagation (JCGM 100:2008,
 * 5.1.2) through the interpolation, from the u of the two values around the crossing and of the
 * reference value, taken as independent (a scale error common to every point, such as the load
 * standard's, cancels in the percentages and is rightly left out). The bias source's own error is
 * not known here and not included.
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
 * @param dropsU for each drop percentage reached, the standard uncertainty of the bias in
 *     {@code drops}, in V or A; NaN when a point's uncertainty is unknown; {@code null} when not reached
 */
public record Derating(String quantity, double frequencyHz, double level, String biasMode, double referenceBias,
        double referenceValue, List<Point> points, Map<Integer, Double> drops, List<String> notes,
        Map<Integer, Double> dropsU) {
    /** Drop percentages reported for capacitors unless the step names its own. */
    public static final List<Integer> CAPACITOR_DROPS = List.of(20, 50);
    /** Drop percentages reported for inductors (saturation current) unless the step names its own. */
    public static final List<Integer> INDUCTOR_DROPS = List.of(10, 20, 30);

    public Derating {
        points = List.copyOf(points);
        drops = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(drops));
        notes = List.copyOf(notes);
        dropsU = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(dropsU));
    }

    /**
     * One bias point.
     *
     * @param bias DC bias in V or A
     * @param value the value in F or H
     * @param percent the value as % of the reference
     * @param uValue the standard uncertainty of the value, in F or H; NaN when unknown
     */
    public record Point(double bias, double value, double percent, double uValue) {
    }

    /**
     * Derates {@code values} (one per bias, any order, biases distinct) at the given drops.
     * Negative biases are left out (the search goes up from zero).
     */
    public static Derating of(String quantity, double frequencyHz, double level, String biasMode, double[] biases,
            double[] values, List<Integer> dropsPercent) {
        double[] unknown = new double[values.length];
        java.util.Arrays.fill(unknown, Double.NaN);
        return of(quantity, frequencyHz, level, biasMode, biases, values, unknown, dropsPercent);
    }

    /**
     * As {@link #of(String, double, double, String, double[], double[], List)}, with the standard
     * uncertainty of each value ({@code uValues}, same order, NaN where unknown), from which each
     * crossing's uncertainty is propagated.
     */
    public static Derating of(String quantity, double frequencyHz, double level, String biasMode, double[] biases,
            double[] values, double[] uValues, List<Integer> dropsPercent) {
        List<double[]> pts = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        boolean negative = false;
        for (int i = 0; i < biases.length; i++) {
            if (biases[i] < 0) {
                negative = true;
            } else if (Double.isFinite(values[i])) {
                pts.add(new double[] {biases[i], values[i], uValues[i]});
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
            points.add(new Point(p[0], p[1], 100 * p[1] / ref, p[2]));
        }
        Map<Integer, Double> drops = new LinkedHashMap<>();
        Map<Integer, Double> dropsU = new LinkedHashMap<>();
        for (int drop : dropsPercent) {
            Double at = biasAtDrop(points, drop);
            drops.put(drop, at);
            dropsU.put(drop, at == null ? null : biasAtDropU(points, drop));
            if (at == null) {
                double min = points.stream().mapToDouble(Point::percent).min().orElseThrow();
                notes.add(String.format(Locale.ROOT, "never falls by %d %% up to %s (lowest %.1f %% of the %s value)",
                        drop, Figures.format(points.get(points.size() - 1).bias(), Figures.unit(biasMode)), min,
                        Figures.format(refBias, Figures.unit(biasMode))));
            }
        }
        return new Derating(quantity, frequencyHz, level, biasMode, refBias, ref, points, drops, notes, dropsU);
    }

    /**
     * The bias where the value has first fallen by {@code dropPercent} (linear interpolation
     * between the two points around the crossing), or null when it never falls that far.
     */
    public Double biasAtDrop(double dropPercent) {
        return biasAtDrop(points, dropPercent);
    }

    /**
     * The standard uncertainty of {@link #biasAtDrop(double)}, in V or A: NaN when it is not
     * reached or a value's uncertainty is unknown.
     */
    public double biasAtDropU(double dropPercent) {
        Double u = biasAtDrop(points, dropPercent) == null ? null : biasAtDropU(points, dropPercent);
        return u == null ? Double.NaN : u;
    }

    private static Double biasAtDrop(List<Point> points, double drop) {
        int i = crossing(points, drop);
        if (i < 0) {
            return null;
        }
        Point a = points.get(i - 1);
        Point b = points.get(i);
        return at(a.bias(), b.bias(), a.value(), b.value(), points.get(0).value(), drop);
    }

    /** The index of the first point at or below the drop whose predecessor is above it; −1 when none. */
    private static int crossing(List<Point> points, double drop) {
        double target = 100 - drop;
        for (int i = 1; i < points.size(); i++) {
            if (points.get(i).percent() <= target && points.get(i - 1).percent() > target) {
                return i;
            }
        }
        return -1;
    }

    /** The interpolated bias where va (at ba) → vb (at bb) crosses (1 − drop/100)·ref. */
    private static double at(double ba, double bb, double va, double vb, double ref, double drop) {
        double target = (1 - drop / 100) * ref;
        return ba + (bb - ba) * (va - target) / (va - vb);
    }

    /**
     * u of the crossing by the law of propagation: u² = Σ (∂I/∂v_k)² u(v_k)² over the two values
     * around the crossing and the reference value (JCGM 100:2008, 5.1.2); the partial derivatives
     * are analytic: with t = (1 − d)·v₀ and s = (I_b − I_a)/(v_a − v_b),
     * ∂I/∂v_a = s·(t − v_b)/(v_a − v_b), ∂I/∂v_b = s·(v_a − t)/(v_a − v_b), ∂I/∂v₀ = −s·(1 − d).
     */
    private static double biasAtDropU(List<Point> points, double drop) {
        int i = crossing(points, drop);
        Point a = points.get(i - 1);
        Point b = points.get(i);
        Point ref = points.get(0);
        double d = drop / 100;
        double t = (1 - d) * ref.value();
        double span = a.value() - b.value();
        double s = (b.bias() - a.bias()) / span;
        double ga = s * (t - b.value()) / span;
        double gb = s * (a.value() - t) / span;
        double g0 = -s * (1 - d);
        double var;
        if (a == ref) {
            // the reference is the value before the crossing: one input, two roles
            var = sq((ga + g0) * a.uValue()) + sq(gb * b.uValue());
        } else {
            var = sq(ga * a.uValue()) + sq(gb * b.uValue()) + sq(g0 * ref.uValue());
        }
        return Math.sqrt(var);
    }

    private static double sq(double v) {
        return v * v;
    }
}
