package org.zweep.runner.plot;

import java.awt.BasicStroke;
import java.awt.Color;
import java.util.List;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.StandardXYBarPainter;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.data.statistics.HistogramDataset;

/** A histogram of one checked parameter over the parts of a lot, with the check's limits marked. */
public final class Histogram {
    private static final Color BLUE = new Color(0x00, 0x72, 0xB2);
    private static final Color RED = new Color(0xD5, 0x5E, 0x00);

    private Histogram() {
    }

    /**
     * The chart.
     *
     * @param title the chart's title
     * @param quantity the axis quantity ({@code Cs})
     * @param unit the unit symbol ({@code F}; empty for a number)
     * @param values the values (SI; non-finite ones left out)
     * @param lsl the lowest passing value, NaN for none
     * @param usl the highest passing value, NaN for none
     */
    public static JFreeChart of(String title, String quantity, String unit, List<Double> values, double lsl,
            double usl) {
        double[] v = values.stream().filter(Double::isFinite).mapToDouble(Double::doubleValue).toArray();
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double x : v) {
            lo = Math.min(lo, x);
            hi = Math.max(hi, x);
        }
        HistogramDataset data = new HistogramDataset();
        if (v.length > 0) {
            // about √n bins between 5 and 20 (common practice, no source); a single value gets a bin of its own
            int bins = (int) Math.max(5, Math.min(20, Math.round(Math.sqrt(v.length))));
            double span = hi > lo ? hi - lo : Math.max(Math.abs(lo) * 1e-6, 1e-30);
            data.addSeries("parts", v, bins, hi > lo ? lo : lo - span / 2, hi > lo ? hi : lo + span / 2);
        }
        double viewLo = lo;
        double viewHi = hi;
        for (double l : new double[] {lsl, usl}) {
            if (Double.isFinite(l)) {
                viewLo = Math.min(viewLo, l);
                viewHi = Math.max(viewHi, l);
            }
        }
        double maxAbs = Math.max(Math.abs(viewLo), Math.abs(viewHi));
        NumberAxis x = ReadableTicks.linear(quantity, unit, maxAbs, true);
        x.setAutoRangeIncludesZero(false);
        if (viewHi > viewLo && Double.isFinite(viewHi - viewLo)) {
            double pad = (viewHi - viewLo) * 0.08;
            x.setRange(viewLo - pad, viewHi + pad);
        }
        NumberAxis y = new NumberAxis("parts");
        y.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        XYBarRenderer r = new XYBarRenderer(0.05);
        r.setBarPainter(new StandardXYBarPainter());
        r.setShadowVisible(false);
        r.setSeriesPaint(0, BLUE);
        XYPlot plot = new XYPlot(data, x, y, r);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setRangeGridlinePaint(new Color(0xDD, 0xDD, 0xDD));
        mark(plot, lsl, "min");
        mark(plot, usl, "max");
        JFreeChart chart = new JFreeChart(title, JFreeChart.DEFAULT_TITLE_FONT, plot, false);
        chart.setBackgroundPaint(Color.WHITE);
        return chart;
    }

    private static void mark(XYPlot plot, double value, String label) {
        if (!Double.isFinite(value)) {
            return;
        }
        ValueMarker m = new ValueMarker(value, RED, new BasicStroke(2f));
        m.setLabel(label);
        m.setLabelPaint(RED);
        m.setLabelAnchor(org.jfree.chart.ui.RectangleAnchor.TOP_RIGHT);
        m.setLabelTextAnchor(org.jfree.chart.ui.TextAnchor.TOP_LEFT);
        plot.addDomainMarker(m);
    }
}
