package org.zweep.runner.store;

import java.awt.BasicStroke;
import java.awt.Color;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.zweep.runner.plot.Plots;

/**
 * The individuals control chart of a {@link Trend}: each run's value in run order, the centre
 * line μ, the control limits μ ± 3σ (dashed) and the specification limits (red).
 */
public final class ControlChart {
    private static final Color BLUE = new Color(0x00, 0x72, 0xB2);
    private static final Color RED = new Color(0xD5, 0x5E, 0x00);
    private static final Color GREY = new Color(0x55, 0x55, 0x55);

    private ControlChart() {
    }

    /** The chart of {@code t}. */
    public static JFreeChart of(Trend t) {
        XYSeries values = new XYSeries(t.check() + " (" + t.parameter() + ")");
        int i = 1;
        for (Trend.Point p : t.points()) {
            if (Double.isFinite(p.value())) {
                values.add(i, p.value());
            }
            i++;
        }
        XYSeriesCollection data = new XYSeriesCollection(values);
        NumberAxis x = new NumberAxis("run (oldest first)");
        x.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        NumberAxis y = new NumberAxis(t.parameter());
        y.setAutoRangeIncludesZero(false);
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, true);
        r.setSeriesPaint(0, BLUE);
        XYPlot plot = new XYPlot(data, x, y, r);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setRangeGridlinePaint(new Color(0xDD, 0xDD, 0xDD));
        Capability c = t.capability();
        mark(plot, c.mean(), "μ", GREY, new BasicStroke(1.5f));
        BasicStroke dashed = new BasicStroke(1.5f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 1f,
                new float[] {6f, 4f}, 0f);
        mark(plot, c.ucl(), "UCL μ+3σ", GREY, dashed);
        mark(plot, c.lcl(), "LCL μ−3σ", GREY, dashed);
        mark(plot, c.usl(), "USL", RED, new BasicStroke(2f));
        mark(plot, c.lsl(), "LSL", RED, new BasicStroke(2f));
        // every value and every line in view
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (Trend.Point p : t.points()) {
            if (Double.isFinite(p.value())) {
                lo = Math.min(lo, p.value());
                hi = Math.max(hi, p.value());
            }
        }
        for (double v : new double[] {c.ucl(), c.lcl(), c.usl(), c.lsl()}) {
            if (Double.isFinite(v)) {
                lo = Math.min(lo, v);
                hi = Math.max(hi, v);
            }
        }
        if (hi > lo) {
            double pad = (hi - lo) * 0.08;
            y.setRange(lo - pad, hi + pad);
        }
        String title = String.format(Locale.ROOT, "%s, %s: n = %d, Cpk = %s", t.part(), t.check(), c.n(),
                Double.isFinite(c.cpk()) ? String.format(Locale.ROOT, "%.2f", c.cpk()) : "not defined");
        JFreeChart chart = new JFreeChart(title, JFreeChart.DEFAULT_TITLE_FONT, plot, false);
        chart.setBackgroundPaint(Color.WHITE);
        return chart;
    }

    private static void mark(XYPlot plot, double value, String label, Color colour, BasicStroke stroke) {
        if (!Double.isFinite(value)) {
            return;
        }
        ValueMarker m = new ValueMarker(value, colour, stroke);
        m.setLabel(label);
        m.setLabelPaint(colour);
        m.setLabelAnchor(org.jfree.chart.ui.RectangleAnchor.TOP_LEFT);
        m.setLabelTextAnchor(org.jfree.chart.ui.TextAnchor.BOTTOM_LEFT);
        plot.addRangeMarker(m);
    }

    /** Writes the chart of {@code t} to {@code file}: SVG when its name ends in {@code .svg}, PNG otherwise. */
    public static void write(Trend t, Path file) {
        if (System.getProperty("java.awt.headless") == null) {
            System.setProperty("java.awt.headless", "true");
        }
        JFreeChart chart = of(t);
        try {
            Path parent = file.toAbsolutePath().getParent();
            if (parent != null) {
                Files.createDirectories(parent);
            }
            if (file.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".svg")) {
                Files.writeString(file, Plots.svg(chart, Plots.WIDTH, Plots.HEIGHT, null), StandardCharsets.UTF_8);
            } else {
                ChartUtils.saveChartAsPNG(file.toFile(), chart, Plots.WIDTH, Plots.HEIGHT);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }
}
