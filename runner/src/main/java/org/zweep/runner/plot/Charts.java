package org.zweep.runner.plot;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Rectangle2D;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.NumberTickUnit;
import org.jfree.chart.axis.ValueAxis;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.RectangleInsets;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.Derating;
import org.zweep.runner.analysis.Resonance;
import org.zweep.runner.text.Figures;

/**
 * Builds the charts. Our own look: white background, light grid, labelled axes with units and SI
 * prefixes, a colour-blind-safe palette (Okabe–Ito), lines thick enough for print.
 */
public final class Charts {
    static final Color BLUE = new Color(0x00, 0x72, 0xB2);
    static final Color VERMILION = new Color(0xD5, 0x5E, 0x00);
    static final Color GREEN = new Color(0x00, 0x9E, 0x73);
    static final Color GRID = new Color(0xDD, 0xDD, 0xDD);
    private static final Color[] PALETTE = {BLUE, VERMILION, GREEN, new Color(0xCC, 0x79, 0xA7),
        new Color(0xE6, 0x9F, 0x00), new Color(0x56, 0xB4, 0xE9)};
    private static final BasicStroke SOLID = new BasicStroke(2f);
    private static final BasicStroke DASHED = new BasicStroke(2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 1f,
            new float[] {6f, 4f}, 0f);
    static final Font TITLE = new Font(Font.SANS_SERIF, Font.BOLD, 15);
    static final Font LABEL = new Font(Font.SANS_SERIF, Font.PLAIN, 13);
    static final Font TICK = new Font(Font.SANS_SERIF, Font.PLAIN, 11);

    /** How many traces one chart overlays at most; more sweeps go to further charts. */
    public static final int MAX_TRACES = 6;

    private Charts() {
    }

    /**
     * One sweep drawn on a chart.
     *
     * @param label the legend text for the sweep's conditions, e.g. {@code 1 V, bias 0 V}; empty
     *     when the chart shows a single sweep
     * @param points the sweep, ascending in frequency
     * @param fit the circuit fitted to it, or null
     */
    public record Trace(String label, List<Impedance> points, CircuitFit fit) {
        public Trace {
            points = List.copyOf(points);
        }

        String name(String quantity) {
            return label.isEmpty() ? quantity : quantity + ", " + label;
        }
    }

    /** |Z| (log, left axis, solid) and θ (right axis, dashed) versus frequency, one colour per trace. */
    public static JFreeChart impedance(String title, List<Trace> traces) {
        XYSeriesCollection mags = new XYSeriesCollection();
        XYSeriesCollection phases = new XYSeriesCollection();
        XYSeries all = new XYSeries("all |Z|");
        for (Trace t : traces) {
            XYSeries mag = new XYSeries(t.name("|Z|"));
            XYSeries phase = new XYSeries(t.name("θ"));
            for (Impedance z : t.points()) {
                mag.add(z.frequencyHz(), z.magnitudeOhm());
                all.add(z.frequencyHz(), z.magnitudeOhm());
                phase.add(z.frequencyHz(), z.phaseDeg());
            }
            mags.addSeries(mag);
            phases.addSeries(phase);
        }
        XYPlot plot = plot(frequencyAxis(traces), axis("|Z|", "Ω", all), mags, lines(traces.size(), 0, true));
        NumberAxis deg = new NumberAxis("θ (°)");
        deg.setRange(-95, 95);
        deg.setTickUnit(new NumberTickUnit(30));
        style(deg);
        plot.setRangeAxis(1, deg);
        plot.setDataset(1, phases);
        plot.mapDatasetToRangeAxis(1, 1);
        plot.setRenderer(1, lines(traces.size(), traces.size() == 1 ? 1 : 0, false));
        return chart(title, plot);
    }

    /**
     * |R| (solid) and |X| (dashed) versus frequency on a log axis when they span a decade or more,
     * one colour per trace; a single sweep whose X changes sign gets the crossing marked.
     */
    public static JFreeChart resistanceReactance(String title, List<Trace> traces) {
        XYSeriesCollection data = new XYSeriesCollection();
        XYSeries all = new XYSeries("all");
        for (Trace t : traces) {
            XYSeries r = new XYSeries(t.name("|R|"));
            for (Impedance z : t.points()) {
                add(r, z.frequencyHz(), Math.abs(z.resistanceOhm()));
                add(all, z.frequencyHz(), Math.abs(z.resistanceOhm()));
            }
            data.addSeries(r);
        }
        for (Trace t : traces) {
            XYSeries x = new XYSeries(t.name("|X|"));
            for (Impedance z : t.points()) {
                add(x, z.frequencyHz(), Math.abs(z.reactanceOhm()));
                add(all, z.frequencyHz(), Math.abs(z.reactanceOhm()));
            }
            data.addSeries(x);
        }
        int n = traces.size();
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer(true, true);
        for (int i = 0; i < n; i++) {
            Color c = n == 1 ? BLUE : colour(i);
            Color cx = n == 1 ? VERMILION : c;
            style(renderer, i, c, SOLID, new Ellipse2D.Double(-3, -3, 6, 6));
            style(renderer, n + i, cx, n == 1 ? SOLID : DASHED, new Rectangle2D.Double(-3, -3, 6, 6));
        }
        XYPlot plot = plot(frequencyAxis(traces), axis("|R|, |X|", "Ω", all), data, renderer);
        markResonance(plot, traces);
        return chart(title, plot);
    }

    /**
     * The series value ({@code parameter}: Cs, Ls or Rs) from the data as points and from each
     * trace's fitted model as a line of the same colour, versus frequency. Cs and Ls mean the part's
     * value only well below the self-resonance: points from a third of the first reactance sign
     * change up are drawn apart (hollow, "near or above SRF"), the ones beyond the axis as triangles
     * at its top, and the axis is scaled to the points below. Only positive values are drawn.
     * Values come from the impedance core's {@link DerivedParameter}.
     */
    public static JFreeChart seriesValue(String title, DerivedParameter parameter, List<Trace> traces) {
        String symbol = symbol(parameter);
        boolean reactive = parameter != DerivedParameter.RS;
        XYSeriesCollection data = new XYSeriesCollection();
        XYSeries matter = new XYSeries("matter");
        XYSeries near = new XYSeries(symbol + " near or above SRF (not the part's value)");
        int n = traces.size();
        List<Double> limits = new ArrayList<>();
        for (Trace t : traces) {
            double srf = reactive ? Resonance.fromData(t.points()) : Double.NaN;
            double limit = Double.isFinite(srf) ? srf / NEAR_SRF_FACTOR : Double.POSITIVE_INFINITY;
            limits.add(limit);
            for (Impedance z : t.points()) {
                if (z.frequencyHz() < limit) {
                    add(matter, z.frequencyHz(), parameter.of(z));
                }
            }
        }
        if (matter.getItemCount() == 0) { // no point well below resonance: show them all
            traces.forEach(t -> t.points().forEach(z -> add(matter, z.frequencyHz(), parameter.of(z))));
            limits.replaceAll(l -> Double.POSITIVE_INFINITY);
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = 0;
        for (int i = 0; i < matter.getItemCount(); i++) {
            lo = Math.min(lo, matter.getY(i).doubleValue());
            hi = Math.max(hi, matter.getY(i).doubleValue());
        }
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer();
        for (int i = 0; i < n; i++) {
            Trace t = traces.get(i);
            double limit = limits.get(i);
            XYSeries measured = new XYSeries(t.name(symbol + " measured"));
            for (Impedance z : t.points()) {
                if (z.frequencyHz() < limit) {
                    add(measured, z.frequencyHz(), parameter.of(z));
                } else {
                    add(near, z.frequencyHz(), parameter.of(z));
                }
            }
            XYSeries model = new XYSeries(t.name(symbol + " fitted " + (t.fit() == null ? "" : t.fit().model().id())));
            if (t.fit() != null && !t.points().isEmpty()) {
                double f0 = t.points().get(0).frequencyHz();
                double f1 = Math.min(limit, t.points().get(t.points().size() - 1).frequencyHz());
                for (int k = 0; k <= 400 && f1 > f0; k++) {
                    double f = f0 * Math.pow(f1 / f0, k / 400.0);
                    Complex z = t.fit().impedanceAt(f);
                    add(model, f, parameter.of(new Impedance(f, z.getReal(), z.getImaginary())));
                }
            }
            data.addSeries(measured);
            data.addSeries(model);
            Color pointColour = n == 1 ? BLUE : colour(i);
            Color lineColour = n == 1 ? VERMILION : colour(i);
            renderer.setSeriesLinesVisible(2 * i, false);
            renderer.setSeriesShapesVisible(2 * i, true);
            renderer.setSeriesPaint(2 * i, pointColour);
            renderer.setSeriesShape(2 * i, new Ellipse2D.Double(-3.5, -3.5, 7, 7));
            renderer.setSeriesLinesVisible(2 * i + 1, true);
            renderer.setSeriesShapesVisible(2 * i + 1, false);
            renderer.setSeriesPaint(2 * i + 1, lineColour);
            renderer.setSeriesStroke(2 * i + 1, SOLID);
        }
        String unit = parameter.unit().symbol();
        boolean log = hi / lo >= 10;
        double pad = log ? 0 : Math.max((hi - lo) * 0.08, hi * 0.002);
        double top = log ? hi * 1.25 : hi + pad;
        ValueAxis y = log ? ReadableTicks.log(symbol, unit) : ReadableTicks.linear(symbol, unit, top, true);
        if (Double.isFinite(lo) && hi > 0) {
            y.setRange(log ? lo / 1.25 : lo - pad, top);
        }
        style(y);
        if (near.getItemCount() > 0) {
            XYSeries inRange = new XYSeries(near.getKey());
            XYSeries above = new XYSeries(symbol + " above the axis");
            for (int i = 0; i < near.getItemCount(); i++) {
                double v = near.getY(i).doubleValue();
                if (v <= top) {
                    inRange.add(near.getX(i), v);
                } else {
                    above.add(near.getX(i).doubleValue(), top);
                }
            }
            int s = data.getSeriesCount();
            for (XYSeries extra : List.of(inRange, above)) {
                if (extra.getItemCount() == 0) {
                    continue;
                }
                data.addSeries(extra);
                renderer.setSeriesLinesVisible(s, false);
                renderer.setSeriesShapesVisible(s, true);
                renderer.setSeriesShapesFilled(s, false);
                renderer.setSeriesPaint(s, Color.GRAY);
                renderer.setSeriesShape(s, extra == above ? upTriangle() : new Ellipse2D.Double(-3.5, -3.5, 7, 7));
                s++;
            }
        }
        XYPlot plot = plot(frequencyAxis(traces), y, data, renderer);
        if (reactive) {
            markResonance(plot, traces);
        }
        return chart(title, plot);
    }

    /** Points from SRF / this factor up are near enough to resonance that Cs or Ls is not the part's value. */
    static final double NEAR_SRF_FACTOR = 3;

    private static java.awt.Shape upTriangle() {
        java.awt.geom.Path2D.Double p = new java.awt.geom.Path2D.Double();
        p.moveTo(0, -5);
        p.lineTo(5, 4);
        p.lineTo(-5, 4);
        p.closePath();
        return p;
    }

    /** A vertical line at the first reactance sign change of a single sweep, labelled with its frequency. */
    private static void markResonance(XYPlot plot, List<Trace> traces) {
        if (traces.size() != 1) {
            return;
        }
        double srf = Resonance.fromData(traces.get(0).points());
        if (!Double.isFinite(srf)) {
            return;
        }
        ValueMarker m = new ValueMarker(srf, Color.GRAY, new BasicStroke(1f, BasicStroke.CAP_BUTT,
                BasicStroke.JOIN_MITER, 1f, new float[] {4f, 4f}, 0f));
        m.setLabel("SRF " + Figures.format(srf, Unit.HERTZ, 3));
        m.setLabelFont(TICK);
        m.setLabelBackgroundColor(Color.WHITE);
        m.setLabelAnchor(org.jfree.chart.ui.RectangleAnchor.BOTTOM_LEFT);
        m.setLabelTextAnchor(org.jfree.chart.ui.TextAnchor.BOTTOM_RIGHT);
        plot.addDomainMarker(m);
    }

    /** D (for a capacitor) or Q versus frequency, on a log axis when it spans a decade, one colour per trace. */
    public static JFreeChart loss(String title, boolean dissipation, List<Trace> traces) {
        DerivedParameter p = dissipation ? DerivedParameter.D : DerivedParameter.Q;
        XYSeriesCollection data = new XYSeriesCollection();
        XYSeries all = new XYSeries("all");
        for (Trace t : traces) {
            XYSeries s = new XYSeries(t.name(p.label()));
            for (Impedance z : t.points()) {
                add(s, z.frequencyHz(), p.of(z));
                add(all, z.frequencyHz(), p.of(z));
            }
            data.addSeries(s);
        }
        XYLineAndShapeRenderer renderer = lines(traces.size(), 2, true);
        return chart(title, plot(frequencyAxis(traces), axis(dissipation ? "D = R/|X|" : "Q = |X|/R", "", all), data,
                renderer));
    }

    /** The value in % of its zero-bias value versus DC bias, with the drop levels and crossings marked. */
    public static JFreeChart derating(String title, Derating d) {
        XYSeries s = new XYSeries(("cs_f".equals(d.quantity()) ? "C" : "L") + " / value at "
                + Figures.format(d.referenceBias(), Figures.unit(d.biasMode())));
        for (Derating.Point p : d.points()) {
            s.add(p.bias(), p.percent());
        }
        XYSeries marks = new XYSeries("drop points");
        d.drops().forEach((pct, at) -> {
            if (at != null) {
                marks.add(at.doubleValue(), 100.0 - pct);
            }
        });
        XYSeriesCollection data = new XYSeriesCollection(s);
        data.addSeries(marks);
        double maxBias = d.points().stream().mapToDouble(p -> Math.abs(p.bias())).max().orElse(1);
        NumberAxis x = ReadableTicks.linear("DC bias", d.biasMode(), maxBias, true);
        style(x);
        NumberAxis y = ReadableTicks.linear(("cs_f".equals(d.quantity()) ? "C" : "L") + " (% of value at "
                + Figures.format(d.referenceBias(), Figures.unit(d.biasMode())) + ")", "", 100, false);
        style(y);
        y.setAutoRangeIncludesZero(false);
        XYLineAndShapeRenderer renderer = line(BLUE, true);
        renderer.setSeriesLinesVisible(1, false);
        renderer.setSeriesShapesVisible(1, true);
        renderer.setSeriesPaint(1, VERMILION);
        renderer.setSeriesShape(1, new Rectangle2D.Double(-5, -5, 10, 10));
        XYPlot plot = plot(x, y, data, renderer);
        for (Integer pct : d.drops().keySet()) {
            ValueMarker m = new ValueMarker(100.0 - pct, GRID.darker(), new BasicStroke(1f, BasicStroke.CAP_BUTT,
                    BasicStroke.JOIN_MITER, 1f, new float[] {4f, 4f}, 0f));
            m.setLabel("−" + pct + " %");
            m.setLabelFont(TICK);
            m.setLabelBackgroundColor(Color.WHITE);
            m.setLabelAnchor(org.jfree.chart.ui.RectangleAnchor.TOP_RIGHT);
            m.setLabelTextAnchor(org.jfree.chart.ui.TextAnchor.BOTTOM_RIGHT);
            plot.addRangeMarker(m);
        }
        return chart(title, plot);
    }

    /** The parameter's symbol without remarks: {@code Rs} for "Rs (ESR)". */
    static String symbol(DerivedParameter p) {
        int space = p.label().indexOf(' ');
        return space < 0 ? p.label() : p.label().substring(0, space);
    }

    private static void add(XYSeries s, double x, double y) {
        if (y > 0 && Double.isFinite(y)) {
            s.add(x, y);
        }
    }

    private static ValueAxis frequencyAxis(List<Trace> traces) {
        XYSeries f = new XYSeries("f");
        traces.forEach(t -> t.points().forEach(z -> f.add(z.frequencyHz(), z.frequencyHz())));
        return axis("Frequency", "Hz", f);
    }

    /**
     * A log axis when the positive y values of {@code data} span at least a decade, a linear one
     * with one SI prefix for the axis otherwise; {@code quantity (unit)} as its label.
     */
    private static ValueAxis axis(String quantity, String unit, XYSeries data) {
        double min = Double.POSITIVE_INFINITY;
        double max = 0;
        for (int i = 0; i < data.getItemCount(); i++) {
            double v = data.getY(i).doubleValue();
            if (v > 0) {
                min = Math.min(min, v);
                max = Math.max(max, v);
            }
        }
        ValueAxis a;
        if (!(max / min >= 10)) {
            NumberAxis lin = ReadableTicks.linear(quantity, unit, max, true);
            lin.setAutoRangeIncludesZero(false);
            a = lin;
        } else {
            a = ReadableTicks.log(quantity, unit);
        }
        style(a);
        return a;
    }

    private static void style(ValueAxis a) {
        a.setLabelFont(LABEL);
        a.setTickLabelFont(TICK);
        a.setLabelPaint(Color.BLACK);
        a.setTickLabelPaint(Color.DARK_GRAY);
        a.setAxisLinePaint(Color.DARK_GRAY);
        a.setTickMarkPaint(Color.DARK_GRAY);
    }

    private static XYLineAndShapeRenderer line(Color color, boolean shapes) {
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, shapes);
        style(r, 0, color, SOLID, new Ellipse2D.Double(-3, -3, 6, 6));
        return r;
    }

    /**
     * A renderer for {@code n} series: one series in the palette colour {@code single}, several in
     * palette order; solid lines with points, or dashed lines without.
     */
    private static XYLineAndShapeRenderer lines(int n, int single, boolean solid) {
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, solid || n == 1);
        for (int i = 0; i < n; i++) {
            style(r, i, colour(n == 1 ? single : i), solid || n == 1 ? SOLID : DASHED,
                    new Ellipse2D.Double(-3, -3, 6, 6));
        }
        return r;
    }

    private static void style(XYLineAndShapeRenderer r, int series, Color colour, BasicStroke stroke,
            java.awt.Shape shape) {
        r.setSeriesPaint(series, colour);
        r.setSeriesStroke(series, stroke);
        r.setSeriesShape(series, shape);
    }

    /** Palette colour {@code i} (Okabe–Ito order, black left out), cycling. */
    static Color colour(int i) {
        return PALETTE[i % PALETTE.length];
    }

    private static XYPlot plot(ValueAxis x, ValueAxis y, XYSeriesCollection data, XYLineAndShapeRenderer renderer) {
        XYPlot p = new XYPlot(data, x, y, renderer);
        p.setBackgroundPaint(Color.WHITE);
        p.setDomainGridlinePaint(GRID);
        p.setRangeGridlinePaint(GRID);
        p.setDomainGridlineStroke(new BasicStroke(1f));
        p.setRangeGridlineStroke(new BasicStroke(1f));
        p.setOutlinePaint(Color.GRAY);
        p.setAxisOffset(RectangleInsets.ZERO_INSETS);
        return p;
    }

    private static JFreeChart chart(String title, XYPlot plot) {
        JFreeChart c = new JFreeChart(title, TITLE, plot, true);
        c.setBackgroundPaint(Color.WHITE);
        c.setTitle(new TextTitle(title, TITLE));
        c.getLegend().setItemFont(TICK);
        c.getLegend().setFrame(org.jfree.chart.block.BlockBorder.NONE);
        c.setPadding(new RectangleInsets(8, 8, 8, 8));
        return c;
    }
}
