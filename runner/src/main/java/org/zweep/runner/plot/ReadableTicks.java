package org.zweep.runner.plot;

import java.awt.FontMetrics;
import java.awt.Graphics2D;
import java.awt.geom.Rectangle2D;
import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.jfree.chart.axis.AxisState;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.NumberTick;
import org.jfree.chart.axis.TickType;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.chart.ui.TextAnchor;

/**
 * Axes whose tick labels can be read at any chart size: the finest tick spacing whose labels are
 * all distinct and leave a gap between neighbours is chosen from the space the axis has when it is
 * drawn, measured with the tick font. Linear axes carry one SI prefix for the whole axis in their
 * label ({@code Cs (nF)}) and plain numbers at the ticks; log axes label 1-2-5 steps or whole
 * decades with a prefix per tick ({@code 100 k}, {@code 1 M}).
 */
final class ReadableTicks {
    /** Pixels kept free between two neighbouring labels. */
    static final double GAP_PX = 6;

    private ReadableTicks() {
    }

    /** One candidate tick: value, label (empty for a minor tick), major or minor. */
    record Candidate(double value, String label, boolean major) {
    }

    /**
     * A linear axis {@code quantity (prefix unit)} for values up to {@code maxAbs}: the prefix is
     * the engineering one of {@code maxAbs} (none for an empty unit or a unit that takes none).
     */
    static Linear linear(String quantity, String unit, double maxAbs, boolean prefixed) {
        int exp = 0;
        if (prefixed && !unit.isEmpty() && maxAbs > 0 && Double.isFinite(maxAbs)) {
            exp = (int) Math.floor(Math.log10(maxAbs * (1 + 1e-9)) / 3) * 3;
            exp = Math.max(-15, Math.min(12, exp));
        }
        String shown = unit.isEmpty() ? "" : " (" + org.zweep.driver.impedance.Quantities.prefix(exp) + unit + ")";
        return new Linear(quantity + shown, Math.pow(10, exp));
    }

    /** A log axis for {@code quantity (unit)}; tick labels carry SI prefixes when {@code unit} is not empty. */
    static Log log(String quantity, String unit) {
        return new Log(unit.isEmpty() ? quantity : quantity + " (" + unit + ")", !unit.isEmpty());
    }

    /** Linear axis, one prefix for the whole axis. */
    static final class Linear extends NumberAxis {
        private static final long serialVersionUID = 1L;
        private final double scale;

        Linear(String label, double scale) {
            super(label);
            this.scale = scale;
        }

        @Override
        @SuppressWarnings({"rawtypes", "unchecked"})
        public List refreshTicks(Graphics2D g2, AxisState state, Rectangle2D dataArea, RectangleEdge edge) {
            double lo = getLowerBound();
            double hi = getUpperBound();
            List<List<Candidate>> options = new ArrayList<>();
            double span = hi - lo;
            if (span > 0 && Double.isFinite(span)) {
                int k0 = (int) Math.floor(Math.log10(span)) - 3;
                for (int k = k0; k <= k0 + 5; k++) {
                    for (double m : new double[] {1, 2, 5}) {
                        double step = m * Math.pow(10, k);
                        int decimals = Math.max(0, -(int) Math.floor(Math.log10(step / scale) + 1e-9));
                        List<Candidate> ticks = new ArrayList<>();
                        for (long i = (long) Math.ceil(lo / step - 1e-9); i * step <= hi + step * 1e-9; i++) {
                            double v = i * step;
                            ticks.add(new Candidate(v, plain(v / scale, decimals), true));
                        }
                        options.add(ticks);
                    }
                }
            }
            return choose(this::valueToJava2D, g2, dataArea, edge, options, getTickLabelFont());
        }
    }

    /** Log axis, 1-2-5 labels or every n-th decade, minor ticks between. */
    static final class Log extends LogAxis {
        private static final long serialVersionUID = 1L;
        private final boolean prefixed;

        Log(String label, boolean prefixed) {
            super(label);
            this.prefixed = prefixed;
            setBase(10);
            setSmallestValue(1e-18);
            setMinorTickMarksVisible(true);
        }

        @Override
        @SuppressWarnings({"rawtypes", "unchecked"})
        public List refreshTicks(Graphics2D g2, AxisState state, Rectangle2D dataArea, RectangleEdge edge) {
            double lo = getLowerBound();
            double hi = getUpperBound();
            List<List<Candidate>> options = new ArrayList<>();
            if (lo > 0 && hi > lo) {
                int d0 = (int) Math.floor(Math.log10(lo));
                int d1 = (int) Math.ceil(Math.log10(hi));
                options.add(ticks(lo, hi, d0, d1, 1, new double[] {1, 2, 5}));
                for (int every = 1; every <= Math.max(1, d1 - d0); every++) {
                    options.add(ticks(lo, hi, d0, d1, every, new double[] {1}));
                }
            }
            return choose(this::valueToJava2D, g2, dataArea, edge, options, getTickLabelFont());
        }

        private List<Candidate> ticks(double lo, double hi, int d0, int d1, int every, double[] labelled) {
            List<Candidate> out = new ArrayList<>();
            for (int d = d0; d <= d1; d++) {
                for (int m = 1; m <= 9; m++) {
                    double v = m * Math.pow(10, d);
                    if (v < lo * (1 - 1e-9) || v > hi * (1 + 1e-9)) {
                        continue;
                    }
                    boolean major = Math.floorMod(d, every) == 0 && contains(labelled, m);
                    boolean minor = every == 1 || m == 1;
                    if (major) {
                        out.add(new Candidate(v, logLabel(m, d), true));
                    } else if (minor && d1 - d0 <= 12) {
                        out.add(new Candidate(v, "", false));
                    }
                }
            }
            return out;
        }

        private String logLabel(int mantissa, int decade) {
            if (!prefixed) {
                return decade >= -4 && decade <= 5 ? BigDecimal.valueOf(mantissa).scaleByPowerOfTen(decade).toPlainString()
                        : mantissa + "e" + decade;
            }
            int exp = Math.floorDiv(decade, 3) * 3;
            exp = Math.max(-15, Math.min(12, exp));
            String digits = BigDecimal.valueOf(mantissa).scaleByPowerOfTen(decade - exp).stripTrailingZeros()
                    .toPlainString();
            String prefix = org.zweep.driver.impedance.Quantities.prefix(exp);
            return prefix.isEmpty() ? digits : digits + " " + prefix;
        }
    }

    private static boolean contains(double[] values, int m) {
        for (double v : values) {
            if (v == m) {
                return true;
            }
        }
        return false;
    }

    /** {@code v} with {@code decimals} decimals, no negative zero. */
    static String plain(double v, int decimals) {
        String s = BigDecimal.valueOf(v).setScale(decimals, java.math.RoundingMode.HALF_EVEN).toPlainString();
        return s.matches("-0(\\.0*)?") ? s.substring(1) : s;
    }

    interface Mapper {
        double toJava2D(double value, Rectangle2D area, RectangleEdge edge);
    }

    /**
     * The first of {@code options} (finest first) whose labels are distinct and do not touch, as
     * JFreeChart ticks; the coarsest option when none fits.
     */
    private static List<NumberTick> choose(Mapper map, Graphics2D g2, Rectangle2D area, RectangleEdge edge,
            List<List<Candidate>> options, java.awt.Font font) {
        FontMetrics fm = g2.getFontMetrics(font);
        boolean horizontal = RectangleEdge.isTopOrBottom(edge);
        List<Candidate> chosen = options.isEmpty() ? List.of() : options.get(options.size() - 1);
        for (List<Candidate> option : options) {
            if (fits(option, map, fm, area, edge, horizontal)) {
                chosen = option;
                break;
            }
        }
        List<NumberTick> out = new ArrayList<>();
        TextAnchor anchor = edge == RectangleEdge.TOP ? TextAnchor.BOTTOM_CENTER
                : edge == RectangleEdge.BOTTOM ? TextAnchor.TOP_CENTER
                : edge == RectangleEdge.LEFT ? TextAnchor.CENTER_RIGHT : TextAnchor.CENTER_LEFT;
        for (Candidate c : chosen) {
            out.add(new NumberTick(c.major() ? TickType.MAJOR : TickType.MINOR, c.value(), c.label(), anchor, anchor, 0));
        }
        return out;
    }

    private static boolean fits(List<Candidate> option, Mapper map, FontMetrics fm, Rectangle2D area, RectangleEdge edge,
            boolean horizontal) {
        Set<String> seen = new HashSet<>();
        double prevEnd = Double.NEGATIVE_INFINITY;
        List<double[]> spans = new ArrayList<>();
        for (Candidate c : option) {
            if (!c.major()) {
                continue;
            }
            if (!seen.add(c.label())) {
                return false;
            }
            double at = map.toJava2D(c.value(), area, edge);
            double half = (horizontal ? fm.stringWidth(c.label()) : fm.getAscent() + fm.getDescent()) / 2.0;
            spans.add(new double[] {at - half, at + half});
        }
        if (spans.isEmpty()) {
            return false;
        }
        spans.sort((a, b) -> Double.compare(a[0], b[0]));
        for (double[] s : spans) {
            if (s[0] < prevEnd + GAP_PX) {
                return false;
            }
            prevEnd = s[1];
        }
        return true;
    }
}
