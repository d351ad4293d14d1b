package org.zweep.runner.plot;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Rectangle2D;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.LogAxis;
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
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.Derating;
import org.zweep.runner.analysis.Si;

/**
 * Builds the charts. Our own look: white background, light grid, labelled axes with units and SI
 * prefixes, a colour-blind-safe palette (Okabe–Ito), lines thick enough for print.
 */
public final class Charts {
    static final Color BLUE = new Color(0x00, 0x72, 0xB2);
    static final Color VERMILION = new Color(0xD5, 0x5E, 0x00);
    static final Color GREEN = new Color(0x00, 0x9E, 0x73);
    static final Color GRID = new Color(0xDD, 0xDD, 0xDD);
    static final Font TITLE = new Font(Font.SANS_SERIF, Font.BOLD, 15);
    static final Font LABEL = new Font(Font.SANS_SERIF, Font.PLAIN, 13);
    static final Font TICK = new Font(Font.SANS_SERIF, Font.PLAIN, 11);

    private Charts() {
    }

    /** |Z| (log, left axis) and θ (right axis) versus frequency. */
    public static JFreeChart impedance(String title, List<Impedance> points) {
        XYSeries mag = new XYSeries("|Z|");
        XYSeries phase = new XYSeries("θ");
        for (Impedance z : points) {
            mag.add(z.frequencyHz(), z.magnitudeOhm());
            phase.add(z.frequencyHz(), z.phaseDeg());
        }
        XYPlot plot = plot(frequencyAxis(points), axis("|Z| (Ω)", mag), new XYSeriesCollection(mag), line(BLUE, true));
        NumberAxis deg = new NumberAxis("θ (°)");
        deg.setRange(-95, 95);
        deg.setTickUnit(new NumberTickUnit(30));
        style(deg);
        plot.setRangeAxis(1, deg);
        plot.setDataset(1, new XYSeriesCollection(phase));
        plot.mapDatasetToRangeAxis(1, 1);
        plot.setRenderer(1, line(VERMILION, true));
        return chart(title, plot);
    }

    /** R and X versus frequency. */
    public static JFreeChart resistanceReactance(String title, List<Impedance> points) {
        XYSeries r = new XYSeries("R");
        XYSeries x = new XYSeries("X");
        for (Impedance z : points) {
            r.add(z.frequencyHz(), z.resistanceOhm());
            x.add(z.frequencyHz(), z.reactanceOhm());
        }
        XYSeriesCollection data = new XYSeriesCollection(r);
        data.addSeries(x);
        XYLineAndShapeRenderer renderer = line(BLUE, true);
        renderer.setSeriesPaint(1, VERMILION);
        renderer.setSeriesStroke(1, new BasicStroke(2f));
        renderer.setSeriesShape(1, new Rectangle2D.Double(-3, -3, 6, 6));
        NumberAxis y = new NumberAxis("R, X (Ω)");
        style(y);
        y.setNumberFormatOverride(new SiTickFormat());
        return chart(title, plot(frequencyAxis(points), y, data, renderer));
    }

    /**
     * The series value (Cs, Ls or Rs, as {@code unit}) from the data as points and from the fitted
     * model as a line, versus frequency; only positive values are drawn (log axis).
     *
     * @param symbol {@code Cs}, {@code Ls} or {@code Rs}
     */
    public static JFreeChart seriesValue(String title, String symbol, String unit, List<Impedance> points,
            CircuitFit fit) {
        XYSeries measured = new XYSeries(symbol + " measured");
        XYSeries model = new XYSeries(symbol + " fitted " + (fit == null ? "" : fit.model().id()));
        for (Impedance z : points) {
            add(measured, z.frequencyHz(), value(symbol, z.frequencyHz(), z.resistanceOhm(), z.reactanceOhm()));
        }
        if (fit != null && !points.isEmpty()) {
            double f0 = points.get(0).frequencyHz();
            double f1 = points.get(points.size() - 1).frequencyHz();
            for (int i = 0; i <= 400; i++) {
                double f = f0 * Math.pow(f1 / f0, i / 400.0);
                Complex z = fit.impedanceAt(f);
                add(model, f, value(symbol, f, z.getReal(), z.getImaginary()));
            }
        }
        XYSeriesCollection data = new XYSeriesCollection(measured);
        data.addSeries(model);
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer();
        renderer.setSeriesLinesVisible(0, false);
        renderer.setSeriesShapesVisible(0, true);
        renderer.setSeriesPaint(0, BLUE);
        renderer.setSeriesShape(0, new Ellipse2D.Double(-3.5, -3.5, 7, 7));
        renderer.setSeriesLinesVisible(1, true);
        renderer.setSeriesShapesVisible(1, false);
        renderer.setSeriesPaint(1, VERMILION);
        renderer.setSeriesStroke(1, new BasicStroke(2f));
        return chart(title, plot(frequencyAxis(points), axis(symbol + " (" + unit + ")", measured), data, renderer));
    }

    /** D (for a capacitor) or Q versus frequency, on log axes. */
    public static JFreeChart loss(String title, boolean dissipation, List<Impedance> points) {
        XYSeries s = new XYSeries(dissipation ? "D" : "Q");
        for (Impedance z : points) {
            double q = Math.abs(z.reactanceOhm()) / z.resistanceOhm();
            add(s, z.frequencyHz(), dissipation ? 1 / q : q);
        }
        return chart(title, plot(frequencyAxis(points), axis(dissipation ? "D = R/|X|" : "Q = |X|/R", s),
                new XYSeriesCollection(s), line(GREEN, true)));
    }

    /** The value in % of its zero-bias value versus DC bias, with the drop levels and crossings marked. */
    public static JFreeChart derating(String title, Derating d) {
        XYSeries s = new XYSeries(("cs_f".equals(d.quantity()) ? "C" : "L") + " / value at "
                + Si.format(d.referenceBias(), d.biasMode()));
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
        NumberAxis x = new NumberAxis("DC bias (" + d.biasMode() + ")");
        style(x);
        x.setNumberFormatOverride(new SiTickFormat());
        NumberAxis y = new NumberAxis("% of value at " + Si.format(d.referenceBias(), d.biasMode()));
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

    private static double value(String symbol, double f, double r, double x) {
        double w = 2 * Math.PI * f;
        return switch (symbol) {
            case "Cs" -> -1 / (w * x);
            case "Ls" -> x / w;
            default -> r;
        };
    }

    private static void add(XYSeries s, double x, double y) {
        if (y > 0 && Double.isFinite(y)) {
            s.add(x, y);
        }
    }

    private static ValueAxis frequencyAxis(List<Impedance> points) {
        XYSeries f = new XYSeries("f");
        points.forEach(z -> f.add(z.frequencyHz(), z.frequencyHz()));
        return axis("Frequency (Hz)", f);
    }

    /**
     * A log axis with ticks at whole decades (1, 2, 5 decades apart) when the positive y values of
     * {@code data} span at least a decade; a linear axis otherwise (fractional-decade log ticks
     * read badly).
     */
    private static ValueAxis axis(String label, XYSeries data) {
        double min = Double.POSITIVE_INFINITY;
        double max = 0;
        for (int i = 0; i < data.getItemCount(); i++) {
            double v = data.getY(i).doubleValue();
            if (v > 0) {
                min = Math.min(min, v);
                max = Math.max(max, v);
            }
        }
        if (!(max / min >= 10)) {
            NumberAxis a = new NumberAxis(label);
            a.setAutoRangeIncludesZero(false);
            a.setNumberFormatOverride(new SiTickFormat());
            style(a);
            return a;
        }
        LogAxis a = new LogAxis(label);
        a.setBase(10);
        a.setSmallestValue(1e-18);
        a.setNumberFormatOverride(new SiTickFormat());
        org.jfree.chart.axis.TickUnits decades = new org.jfree.chart.axis.TickUnits();
        for (double d : new double[] {1, 2, 5, 10}) {
            decades.add(new NumberTickUnit(d));
        }
        a.setStandardTickUnits(decades);
        a.setMinorTickCount(9);
        a.setMinorTickMarksVisible(true);
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
        r.setSeriesPaint(0, color);
        r.setSeriesStroke(0, new BasicStroke(2f));
        r.setSeriesShape(0, new Ellipse2D.Double(-3, -3, 6, 6));
        return r;
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
