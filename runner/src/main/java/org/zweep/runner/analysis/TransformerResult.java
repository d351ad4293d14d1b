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
 */
public record TransformerResult(double frequencyHz, double openH, double shortH, double voltageRatio,
        double turnsRatio, double k, double leakageH, double mutualH, double magnetizingH, List<String> notes) {
    public TransformerResult {
        notes = List.copyOf(notes);
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

    /** The transformer parameters in {@code rows}, or null when there are no transformer rows at all. */
    static TransformerResult of(List<PointRow> rows, double nominalTurns) {
        TreeMap<Double, double[]> open = inductance(rows, "secondary_open");
        TreeMap<Double, double[]> shorted = inductance(rows, "secondary_shorted");
        double ratioSum = 0;
        int ratioCount = 0;
        for (PointRow r : rows) {
            if ("ok".equals(r.status()) && "voltage_ratio".equals(r.quantity()) && r.ratio() > 0) {
                ratioSum += 1 / r.ratio();
                ratioCount++;
            }
        }
        if (open.isEmpty() && shorted.isEmpty() && ratioCount == 0) {
            return null;
        }
        List<String> notes = new ArrayList<>();
        double f = Double.NaN;
        double loc = open.isEmpty() ? Double.NaN : mean(open.firstEntry().getValue());
        double lsc = shorted.isEmpty() ? Double.NaN : mean(shorted.firstEntry().getValue());
        for (Double freq : open.keySet()) {
            if (shorted.containsKey(freq)) {
                f = freq;
                loc = mean(open.get(freq));
                lsc = mean(shorted.get(freq));
                break;
            }
        }
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
                notes.add(String.format(Locale.ROOT, "no voltage ratio measured: the nominal turns ratio %.4g is used",
                        n));
            }
        }
        return new TransformerResult(f, loc, lsc, fwd, n, k, lsc, k * loc / n, k * loc,
                notes);
    }

    private static TreeMap<Double, double[]> inductance(List<PointRow> rows, String wiring) {
        TreeMap<Double, double[]> out = new TreeMap<>();
        for (PointRow r : rows) {
            if ("ok".equals(r.status()) && "impedance".equals(r.quantity()) && wiring.equals(r.wiring())) {
                double[] acc = out.computeIfAbsent(r.frequencyHz(), x -> new double[2]);
                acc[0] += r.value("ls_h");
                acc[1]++;
            }
        }
        return out;
    }

    private static double mean(double[] acc) {
        return acc[0] / acc[1];
    }
}
