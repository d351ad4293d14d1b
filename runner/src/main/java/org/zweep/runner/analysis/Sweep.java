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
 * @param driveMode {@code V} or {@code A}
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
public record Sweep(String step, int stepIndex, String wiring, String driveMode, double level, String biasMode,
        double bias, List<Impedance> points, int repeats, List<UncertainImpedance> uncertainties) {
    public Sweep {
        points = List.copyOf(points);
        uncertainties = List.copyOf(uncertainties);
    }

    /** A sweep without uncertainties. */
    public Sweep(String step, int stepIndex, String wiring, String driveMode, double level, String biasMode,
            double bias, List<Impedance> points, int repeats) {
        this(step, stepIndex, wiring, driveMode, level, biasMode, bias, points, repeats, List.of());
    }

    /** Whether every point has a known uncertainty (then fits are weighted by it). */
    public boolean hasUncertainties() {
        return !points.isEmpty() && uncertainties.size() == points.size();
    }

    /** The sweeps in {@code rows} (ok impedance rows only), in order of first appearance. */
    public static List<Sweep> of(List<PointRow> rows) {
        Map<Integer, Collector> steps = new LinkedHashMap<>();
        for (PointRow r : rows) {
            steps.computeIfAbsent(r.stepIndex(), k -> new Collector(null)).add(r);
        }
        List<Sweep> out = new ArrayList<>();
        steps.values().forEach(c -> out.addAll(c.sweeps()));
        return out;
    }

    /**
     * Gathers the sweeps of one step from its rows as they stream by, holding one running sum per
     * distinct point (not the rows): the mean, the spread of the repeats, the stated uncertainties
     * and the part's main value, from which the step's bias sweeps and repeat statistics are
     * taken too. Not thread-safe.
     */
    static final class Collector {
        private final String column;
        private final Map<Conditions, Group> groups = new LinkedHashMap<>();
        private long seen;

        /** @param column the part's main column ({@code cs_f}, ...) or null when not wanted */
        Collector(String column) {
            this.column = column;
        }

        /** Takes {@code r} into its sweep when it is an impedance row with a value; ignores it otherwise. */
        void add(PointRow r) {
            if (!"ok".equals(r.status()) || !"impedance".equals(r.quantity())) {
                return;
            }
            Conditions key = new Conditions(r.wiring(), r.driveMode(), r.level(), r.biasMode(), r.bias());
            groups.computeIfAbsent(key, k -> new Group(r.step(), r.stepIndex()))
                    .byFrequency.computeIfAbsent(r.frequencyHz(), f -> new Point(seen++)).add(r, column);
        }

        /** The sweeps gathered, in order of first appearance. */
        List<Sweep> sweeps() {
            List<Sweep> out = new ArrayList<>();
            groups.forEach((c, g) -> out.add(g.sweep(c)));
            return out;
        }

        /**
         * The bias sweeps of the main value: per frequency, level, wiring and bias mode measured at
         * two or more biases, per bias: the value's sum, the count, the sum of the readings' stated
         * variances (NaN when one is unknown) and the sum of squared deviations from the mean; in
         * order of first appearance. See {@link StepData#deratingU(double[])}.
         */
        Map<StepData.DeratingKey, TreeMap<Double, double[]>> derating() {
            Map<StepData.DeratingKey, TreeMap<Double, double[]>> all = new LinkedHashMap<>();
            Map<StepData.DeratingKey, Long> first = new LinkedHashMap<>();
            groups.forEach((c, g) -> g.byFrequency.forEach((f, p) -> {
                StepData.DeratingKey k = new StepData.DeratingKey(f, c.level(), c.wiring(), c.biasMode());
                double[] acc = all.computeIfAbsent(k, x -> new TreeMap<>()).computeIfAbsent(c.bias(), b -> new double[4]);
                acc[0] += p.sumV;
                acc[1] += p.n;
                acc[2] += p.statedV;
                acc[3] += p.m2V;
                first.merge(k, p.seq, Math::min);
            }));
            Map<StepData.DeratingKey, TreeMap<Double, double[]>> out = new LinkedHashMap<>();
            first.entrySet().stream().sorted(Map.Entry.comparingByValue()).forEach(e -> {
                if (all.get(e.getKey()).size() >= 2) {
                    out.put(e.getKey(), all.get(e.getKey()));
                }
            });
            return out;
        }

        /** The spread of every point read more than once (R, X and the main value), in order of first appearance. */
        List<RepeatStats> repeats() {
            List<Map.Entry<Conditions, Point>> points = new ArrayList<>();
            groups.forEach((c, g) -> g.byFrequency.forEach((f, p) -> {
                if (p.n >= 2) {
                    points.add(Map.entry(new Conditions(c.wiring(), c.driveMode(), c.level(), c.biasMode(), f), p));
                }
            }));
            points.sort(java.util.Comparator.comparingLong(e -> e.getValue().seq));
            List<RepeatStats> out = new ArrayList<>();
            for (Map.Entry<Conditions, Point> e : points) {
                Point p = e.getValue();
                Conditions c = e.getKey(); // the frequency in place of the bias here
                Map<String, Double> mean = new LinkedHashMap<>();
                Map<String, Double> std = new LinkedHashMap<>();
                Map<String, Double> rel = new LinkedHashMap<>();
                double[][] stats = {{p.meanR, p.m2R}, {p.meanX, p.m2X}, {p.meanV, p.m2V}};
                String[] names = {"r_ohm", "x_ohm", column};
                for (int i = 0; i < names.length; i++) {
                    double sd = Math.sqrt(stats[i][1] / (p.n - 1));
                    mean.put(names[i], stats[i][0]);
                    std.put(names[i], sd);
                    rel.put(names[i], sd / Math.abs(stats[i][0]));
                }
                out.add(new RepeatStats(c.bias(), c.level(), p.bias, c.wiring(), p.n, mean, std, rel));
            }
            return out;
        }

        private record Conditions(String wiring, String driveMode, double level, String biasMode, double bias) {
        }

        private static final class Group {
            final String step;
            final int stepIndex;
            final TreeMap<Double, Point> byFrequency = new TreeMap<>();

            Group(String step, int stepIndex) {
                this.step = step;
                this.stepIndex = stepIndex;
            }

            Sweep sweep(Conditions c) {
                List<Impedance> pts = new ArrayList<>(byFrequency.size());
                List<UncertainImpedance> us = new ArrayList<>(byFrequency.size());
                boolean known = true;
                int repeats = 0;
                for (Map.Entry<Double, Point> e : byFrequency.entrySet()) {
                    Point p = e.getValue();
                    Impedance mean = new Impedance(e.getKey(), p.sumR / p.n, p.sumX / p.n);
                    pts.add(mean);
                    repeats = Math.max(repeats, p.n);
                    known = known && p.known;
                    if (known) {
                        us.add(p.meanUncertainty(mean));
                    }
                }
                return new Sweep(step, stepIndex, c.wiring(), c.driveMode(), c.level(), c.biasMode(), c.bias(), pts,
                        repeats, known ? us : List.of());
            }
        }

        /**
         * The readings at one frequency: their sums, the running mean and co-moments of R and X
         * (Welford's update, so the spread needs no second pass) and the sums of their stated
         * covariances.
         */
        private static final class Point {
            final long seq;
            int n;
            double bias;
            double sumV;
            double meanV;
            double m2V;
            double statedV;
            double sumR;
            double sumX;
            double meanR;
            double meanX;
            double m2R;
            double m2X;
            double cRX;
            double statedR;
            double statedX;
            double statedRX;
            boolean known = true;

            Point(long seq) {
                this.seq = seq;
            }

            void add(PointRow r, String column) {
                double re = r.rOhm();
                double im = r.xOhm();
                n++;
                bias = r.bias();
                if (column != null) {
                    double v = r.value(column);
                    sumV += v;
                    double dV = v - meanV;
                    meanV += dV / n;
                    m2V += dV * (v - meanV);
                    double u = r.uncertainty().known() ? r.uncertainty().of(column) : Double.NaN;
                    statedV += u * u;
                }
                sumR += re;
                sumX += im;
                double dR = re - meanR;
                double dX = im - meanX;
                meanR += dR / n;
                meanX += dX / n;
                m2R += dR * (re - meanR);
                m2X += dX * (im - meanX);
                cRX += dR * (im - meanX);
                if (known && r.uncertainty().known()) {
                    UncertainImpedance u = r.uncertainty().at(r.impedance());
                    statedR += u.varianceR();
                    statedX += u.varianceX();
                    statedRX += u.covarianceRX();
                } else {
                    known = false;
                }
            }

            /** Stated accuracy averaged over the readings plus the Type A covariance of their mean. */
            UncertainImpedance meanUncertainty(Impedance mean) {
                double vr = statedR / n;
                double vx = statedX / n;
                double c = statedRX / n;
                if (n >= 2) {
                    // the covariance of the mean: the sample covariance (n − 1 in the denominator) over n
                    vr += m2R / (n - 1) / n;
                    vx += m2X / (n - 1) / n;
                    c += cRX / (n - 1) / n;
                }
                return UncertainImpedance.fromCovariance(mean, vr, vx, c);
            }
        }
    }

    /**
     * A step name as it stands in file names: every run of characters other than letters, digits,
     * {@code .}, {@code _} and {@code -} becomes {@code -}; {@code step} when nothing is left.
     */
    public static String fileStem(String step) {
        String out = step.replaceAll("[^A-Za-z0-9._-]+", "-");
        return out.isEmpty() ? "step" : out;
    }

    /**
     * This sweep, or when it has more than {@code max} frequencies, {@code max} of them evenly
     * spread by index (the first and the last kept), with their uncertainties.
     */
    public Sweep thinned(int max) {
        int n = points.size();
        if (n <= max || max < 2) {
            return this;
        }
        List<Impedance> pts = new ArrayList<>(max);
        List<UncertainImpedance> us = new ArrayList<>(hasUncertainties() ? max : 0);
        for (int i = 0; i < max; i++) {
            int k = (int) Math.round(i * (n - 1) / (double) (max - 1));
            pts.add(points.get(k));
            if (hasUncertainties()) {
                us.add(uncertainties.get(k));
            }
        }
        return new Sweep(step, stepIndex, wiring, driveMode, level, biasMode, bias, pts, repeats, us);
    }

    /** This sweep's conditions without its points. */
    Sweep withoutPoints() {
        return new Sweep(step, stepIndex, wiring, driveMode, level, biasMode, bias, List.of(), repeats, List.of());
    }

    /** The number of distinct frequencies. */
    public int frequencies() {
        return points.size();
    }

    /** A label such as {@code 1V 0V} or {@code 10mA 2A}, also used in file names. */
    public String conditionLabel() {
        return Figures.compact(level, Figures.unit(driveMode)) + "_" + Figures.compact(bias, Figures.unit(biasMode)) + ("none".equals(wiring) ? "" : "_" + wiring);
    }

    /** A label for people, e.g. {@code 1 V, bias 0 V}. */
    public String describe() {
        return Figures.format(level, Figures.unit(driveMode)) + ", bias " + Figures.format(bias, Figures.unit(biasMode))
                + ("none".equals(wiring) ? "" : ", " + wiring.replace('_', ' '));
    }

    @Override
    public String toString() {
        return String.format(Locale.ROOT, "%s (%s)", step, describe());
    }
}
