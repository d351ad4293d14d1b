package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.uncertainty.UncertainImpedance;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.text.Figures;

/**
 * The impedance points of one step at one drive level, one DC bias and one wiring, repeats
 * averaged per frequency: what is fitted and what a Touchstone file holds.
 *
 * @param step the step's name
 * @param stepIndex the step's index
 * @param wiring {@code none}, {@code secondary_open} or {@code secondary_shorted}
 * @param drive {@code V} or {@code A}
 * @param level the drive level in V rms or A rms
 * @param biasMode {@code V} or {@code A}
 * @param bias the DC bias in V or A
 * @param points the mean impedance per frequency, ascending in frequency
 * @param repeats the largest number of readings averaged at one frequency
 * @param uncertainties the standard uncertainty of each mean (same order as {@code points}), or
 *     empty when any point's is unknown: the average of the readings' stated-accuracy covariances
 *     (a systematic limit, not divided by the number of repeats) plus, with two or more repeats,
 *     the covariance of the mean of the repeats (Type A, JCGM 100:2008, 4.2)
 */
public record Sweep(String step, int stepIndex, String wiring, String drive, double level, String biasMode,
        double bias, List<Impedance> points, int repeats, List<UncertainImpedance> uncertainties) {
    public Sweep {
        points = List.copyOf(points);
        uncertainties = List.copyOf(uncertainties);
    }

    /** A sweep without uncertainties. */
    public Sweep(String step, int stepIndex, String wiring, String drive, double level, String biasMode,
            double bias, List<Impedance> points, int repeats) {
        this(step, stepIndex, wiring, drive, level, biasMode, bias, points, repeats, List.of());
    }

    /** Whether every point has a known uncertainty (then fits are weighted by it). */
    public boolean hasUncertainties() {
        return !points.isEmpty() && uncertainties.size() == points.size();
    }

    /** The sweeps in {@code rows} (ok impedance rows only), in order of first appearance. */
    public static List<Sweep> of(List<PointRow> rows) {
        Map<String, List<PointRow>> groups = new LinkedHashMap<>();
        for (PointRow r : rows) {
            if (!"ok".equals(r.status()) || !"impedance".equals(r.quantity())) {
                continue;
            }
            String key = r.stepIndex() + "\u0000" + r.wiring() + "\u0000" + r.drive() + "\u0000" + r.level()
                    + "\u0000" + r.biasMode() + "\u0000" + r.bias();
            groups.computeIfAbsent(key, k -> new ArrayList<>()).add(r);
        }
        List<Sweep> out = new ArrayList<>();
        for (List<PointRow> g : groups.values()) {
            TreeMap<Double, List<PointRow>> byF = new TreeMap<>();
            for (PointRow r : g) {
                byF.computeIfAbsent(r.frequencyHz(), k -> new ArrayList<>()).add(r);
            }
            List<Impedance> pts = new ArrayList<>();
            List<UncertainImpedance> us = new ArrayList<>();
            boolean known = true;
            int repeats = 0;
            for (Map.Entry<Double, List<PointRow>> e : byF.entrySet()) {
                List<PointRow> rs = e.getValue();
                double re = rs.stream().mapToDouble(PointRow::rOhm).average().orElseThrow();
                double im = rs.stream().mapToDouble(PointRow::xOhm).average().orElseThrow();
                Impedance mean = new Impedance(e.getKey(), re, im);
                pts.add(mean);
                repeats = Math.max(repeats, rs.size());
                known = known && rs.stream().allMatch(r -> r.uncertainty().known());
                if (known) {
                    us.add(meanUncertainty(mean, rs));
                }
            }
            PointRow first = g.get(0);
            out.add(new Sweep(first.step(), first.stepIndex(), first.wiring(), first.drive(), first.level(),
                    first.biasMode(), first.bias(), pts, repeats, known ? us : List.of()));
        }
        return out;
    }

    /** Stated accuracy averaged over the readings plus the Type A covariance of their mean. */
    private static UncertainImpedance meanUncertainty(Impedance mean, List<PointRow> rows) {
        int n = rows.size();
        double vr = 0;
        double vx = 0;
        double c = 0;
        for (PointRow r : rows) {
            UncertainImpedance u = r.uncertainty().at(r.impedance());
            vr += u.varianceR() / n;
            vx += u.varianceX() / n;
            c += u.covarianceRX() / n;
        }
        if (n >= 2) {
            double sr = 0;
            double sx = 0;
            double srx = 0;
            for (PointRow r : rows) {
                double dr = r.rOhm() - mean.resistanceOhm();
                double dx = r.xOhm() - mean.reactanceOhm();
                sr += dr * dr;
                sx += dx * dx;
                srx += dr * dx;
            }
            // the covariance of the mean: the sample covariance (n − 1 in the denominator) over n
            vr += sr / (n - 1) / n;
            vx += sx / (n - 1) / n;
            c += srx / (n - 1) / n;
        }
        return UncertainImpedance.fromCovariance(mean, vr, vx, c);
    }

    /**
     * A step name as it stands in file names: every run of characters other than letters, digits,
     * {@code .}, {@code _} and {@code -} becomes {@code -}; {@code step} when nothing is left.
     */
    public static String fileStem(String step) {
        String out = step.replaceAll("[^A-Za-z0-9._-]+", "-");
        return out.isEmpty() ? "step" : out;
    }

    /** The number of distinct frequencies. */
    public int frequencies() {
        return points.size();
    }

    /** A label such as {@code 1V 0V} or {@code 10mA 2A}, also used in file names. */
    public String conditionLabel() {
        return Figures.compact(level, Figures.unit(drive)) + "_" + Figures.compact(bias, Figures.unit(biasMode)) + ("none".equals(wiring) ? "" : "_" + wiring);
    }

    /** A label for people, e.g. {@code 1 V, bias 0 V}. */
    public String describe() {
        return Figures.format(level, Figures.unit(drive)) + ", bias " + Figures.format(bias, Figures.unit(biasMode))
                + ("none".equals(wiring) ? "" : ", " + wiring.replace('_', ' '));
    }

    @Override
    public String toString() {
        return String.format(Locale.ROOT, "%s (%s)", step, describe());
    }
}
