package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.TreeMap;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.text.Figures;

/**
 * Transformer parameters from a run: primary inductance with the secondary open (L_oc) and
 * shorted (L_sc), and the open-circuit voltage ratio. Formulas in {@link TransformerMath}.
 *
 * @param frequencyHz the frequency L_oc and L_sc are taken at (the lowest both were measured at);
 *     NaN when they were not both measured
 * @param openH L_oc (series inductance, secondary open), NaN when not measured
 * @param shortH L_sc (secondary shorted), NaN when not measured
 * @param voltageRatio V1/V2 driving the primary, secondary open; NaN when not measured
 * @param turnsRatio N1/N2 = k·V1/V2 (symmetric-leakage model), or V1/V2 when k is unknown, or the
 *     nominal when no ratio was measured; NaN when none of these
 * @param k coupling √(1 − L_sc/L_oc); NaN when L_oc or L_sc is missing
 * @param leakageH leakage inductance referred to the primary: L_sc as measured (the one
 *     definition used everywhere; equal to {@code shortH})
 * @param mutualH mutual inductance k·L_oc/n (= k√(L1·L2) with L2 = L1/n²)
 * @param magnetizingH k·L_oc
 * @param notes explanations for people
 * @param uOpenH the standard uncertainty of L_oc: the mean of its rows' u (the meter's stated
 *     accuracy does not average away) combined with the standard deviation of the mean of repeats;
 *     NaN when a row's u is unknown
 * @param uShortH the same for L_sc (and so for the leakage inductance)
 * @param uK the standard uncertainty of k, propagated from u(L_oc) and u(L_sc) taken as
 *     independent (JCGM 100:2008, 5.1.2)
 * @param uTurnsRatio the standard uncertainty of the turns ratio; NaN while the voltage ratio's is
 *     unknown (no accuracy is stated for a ratio) or when the nominal is used
 * @param uMutualH the standard uncertainty of M; NaN when the turns ratio's is unknown
 */
public record TransformerResult(double frequencyHz, double openH, double shortH, double voltageRatio,
        double turnsRatio, double k, double leakageH, double mutualH, double magnetizingH, List<String> notes,
        double uOpenH, double uShortH, double uK, double uTurnsRatio, double uMutualH) {
    public TransformerResult {
        notes = List.copyOf(notes);
    }

    /** The standard uncertainty of the leakage inductance (that of L_sc, which it is). */
    public double uLeakageH() {
        return uShortH;
    }

    /** N1:N2 for people: {@code 3.995:1} (or {@code 1:4.1} for a step-up winding); "—" when unknown. */
    public String turnsRatioText() {
        return ratioText(turnsRatio);
    }

    /** The measured V1:V2 (secondary open) for people, as {@link #turnsRatioText()}. */
    public String voltageRatioText() {
        return ratioText(voltageRatio);
    }

    /** {@code r} (a ratio a/b) as {@code a:1}, or {@code 1:b} when r &lt; 1; "—" when not finite or not positive. */
    public static String ratioText(double r) {
        if (!(r > 0) || !Double.isFinite(r)) {
            return "—";
        }
        return r >= 1 ? Figures.format(r, org.zweep.driver.impedance.Unit.NONE, 4) + ":1"
                : "1:" + Figures.format(1 / r, org.zweep.driver.impedance.Unit.NONE, 4);
    }

    /**
     * Gathers what the transformer parameters need from a run's rows as they stream by: Ls (its
     * sum, count, sum of stated u and sum of squares) per frequency with the secondary open and
     * shorted, and the voltage ratios. Not thread-safe.
     */
    static final class Collector {
        private final TreeMap<Double, double[]> open = new TreeMap<>();
        private final TreeMap<Double, double[]> shorted = new TreeMap<>();
        private double ratioSum;
        private int ratioCount;
        private boolean seen;

        /** Takes {@code r} when it is a transformer row (a wiring other than none, or a voltage ratio). */
        void add(PointRow r) {
            if ("none".equals(r.wiring()) && !"voltage_ratio".equals(r.quantity())) {
                return;
            }
            seen = true;
            if (!"ok".equals(r.status())) {
                return;
            }
            if ("voltage_ratio".equals(r.quantity())) {
                if (r.ratio() > 0) {
                    ratioSum += 1 / r.ratio();
                    ratioCount++;
                }
                return;
            }
            TreeMap<Double, double[]> m = "secondary_open".equals(r.wiring()) ? open
                    : "secondary_shorted".equals(r.wiring()) ? shorted : null;
            if (m != null && "impedance".equals(r.quantity())) {
                double[] acc = m.computeIfAbsent(r.frequencyHz(), x -> new double[4]);
                double v = r.value("ls_h");
                acc[0] += v;
                acc[1]++;
                acc[2] += r.uncertainty().of("ls_h");
                acc[3] += v * v;
            }
        }

        /** Whether a transformer row was seen (a wiring other than none, or a voltage ratio). */
        boolean seen() {
            return seen;
        }

        /** The transformer parameters, or null when there are no transformer rows at all. */
        TransformerResult result(double nominalTurns) {
            return of(open, shorted, ratioSum, ratioCount, nominalTurns);
        }
    }

    private static TransformerResult of(TreeMap<Double, double[]> open, TreeMap<Double, double[]> shorted,
            double ratioSum, int ratioCount, double nominalTurns) {
        if (open.isEmpty() && shorted.isEmpty() && ratioCount == 0) {
            return null;
        }
        List<String> notes = new ArrayList<>();
        double f = Double.NaN;
        double[] locAcc = open.isEmpty() ? null : open.firstEntry().getValue();
        double[] lscAcc = shorted.isEmpty() ? null : shorted.firstEntry().getValue();
        for (Double freq : open.keySet()) {
            if (shorted.containsKey(freq)) {
                f = freq;
                locAcc = open.get(freq);
                lscAcc = shorted.get(freq);
                break;
            }
        }
        double loc = mean(locAcc);
        double lsc = mean(lscAcc);
        double uLoc = uncertaintyOfMean(locAcc);
        double uLsc = uncertaintyOfMean(lscAcc);
        if (Double.isNaN(f) && !open.isEmpty() && !shorted.isEmpty()) {
            notes.add("open- and short-circuit inductances were measured at different frequencies");
        }
        double k = TransformerMath.couplingFromOpenShort(loc, lsc);
        double fwd = ratioCount == 0 ? Double.NaN : ratioSum / ratioCount;
        double n;
        if (Double.isFinite(fwd) && Double.isFinite(k)) {
            n = TransformerMath.turnsFromForwardRatio(fwd, k);
        } else if (Double.isFinite(fwd)) {
            n = fwd;
            notes.add("turns ratio is the voltage ratio V1/V2 (no coupling measured to correct it by k)");
        } else {
            n = nominalTurns;
            if (Double.isFinite(n)) {
                notes.add("no voltage ratio measured: the nominal turns ratio " + Figures.number(n, 4) + " is used");
            }
        }
        // k = √(1 − Lsc/Loc): ∂k/∂Loc = Lsc/(2k·Loc²), ∂k/∂Lsc = −1/(2k·Loc)
        double uK = Math.hypot(lsc / (2 * k * loc * loc) * uLoc, uLsc / (2 * k * loc));
        double uFwd = Double.NaN; // no accuracy is stated for a voltage ratio
        double uN = Double.isFinite(fwd) && Double.isFinite(k) ? Math.hypot(fwd * uK, k * uFwd) : Double.NaN;
        // M = k·Loc/n = Loc/(V1/V2) when n = k·V1/V2
        double uM = Double.isFinite(uN) ? Math.hypot(uLoc / fwd, loc * uFwd / (fwd * fwd)) : Double.NaN;
        return new TransformerResult(f, loc, lsc, fwd, n, k, lsc, k * loc / n, k * loc,
                notes, uLoc, uLsc, uK, uN, uM);
    }

    /**
     * u of a mean of rows: the mean of their stated u (systematic: not divided by √n) combined
     * with the standard deviation of the mean of the values; NaN when a row's u is unknown.
     */
    private static double uncertaintyOfMean(double[] acc) {
        if (acc == null) {
            return Double.NaN;
        }
        double n = acc[1];
        double stated = acc[2] / n;
        double typeA = 0;
        if (n > 1) {
            double var = Math.max(0, (acc[3] - acc[0] * acc[0] / n) / (n - 1));
            typeA = var / n;
        }
        return Math.sqrt(stated * stated + typeA);
    }

    private static double mean(double[] acc) {
        return acc == null ? Double.NaN : acc[0] / acc[1];
    }
}
