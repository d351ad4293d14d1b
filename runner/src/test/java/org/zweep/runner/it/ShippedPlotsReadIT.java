package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.awt.Font;
import java.awt.FontMetrics;
import java.awt.geom.Rectangle2D;
import java.awt.image.BufferedImage;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.jfree.chart.ChartRenderingInfo;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.axis.ValueAxis;
import org.jfree.chart.plot.XYPlot;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.zweep.driver.impedance.PartKind;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.plot.Plots;

/**
 * Every plot kind of every shipped sequence (one per shipped part kind) reads right at several
 * sizes: the tick labels of each axis are distinct, no two tick labels overlap (boxes from the
 * SVG text positions and the tick font's metrics), every axis names its unit, and the axes are
 * log where the data span decades.
 */
class ShippedPlotsReadIT {
    /** The size the report uses, a small one and a large one. */
    private static final int[][] SIZES = {{800, 480}, {520, 320}, {1400, 800}};
    private static final Pattern TEXT = Pattern.compile(
            "<text x='([-0-9.]+)' y='([-0-9.]+)' style='fill: rgb\\(([0-9]+),([0-9]+),([0-9]+)\\);[^']*font-size: ([0-9.]+)px;[^']*'[^>]*>([^<]*)</text>");
    private static final String TICK_FILL = "64,64,64"; // Charts: tick labels in dark grey, nothing else is

    @TempDir
    Path tmp;

    static Stream<Path> sequences() {
        return Sims.shippedSequences().stream();
    }

    record Label(String text, double x, double y, double w, double ascent, double descent) {
        Rectangle2D box() {
            return new Rectangle2D.Double(x, y - ascent, w, ascent + descent);
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("sequences")
    void everyPlotHasDistinctNonOverlappingTickLabelsAndUnitsAtEverySize(Path seq) {
        Path out = tmp.resolve("run");
        Sims.Result r = Sims.zweep("run", seq.toString(), "--meter", "sim:" + Sims.benchOf(seq) + "?timing=none",
                "--dialect", Sims.dialect(), "--out", out.toString(), "--quiet");
        assertTrue(r.code() == 0 || r.code() == 1, r.err());
        AnalysisResult a = Analysis.analyze(RunData.read(out), null);
        List<Plots.Named> charts = Plots.charts(a);
        Set<String> kinds = new HashSet<>();
        for (Plots.Named c : charts) {
            kinds.add(c.name().replaceAll(".*-(impedance|rx|value|d|q|bias)(-[0-9]+)?$", "$1"));
            for (int[] size : SIZES) {
                checkLabels(c, size[0], size[1]);
            }
            checkLogWhereDecades(c);
            if (c.name().matches(".*-value(-[0-9]+)?") && a.run().partKind() != PartKind.RESISTOR) {
                // Cs or Ls: the axis covers the part's value well below resonance, not the rise near it
                ValueAxis y = c.chart().getXYPlot().getRangeAxis();
                assertTrue(y.getUpperBound() / y.getLowerBound() < 1.5, c.name() + ": value axis "
                        + y.getLowerBound() + " .. " + y.getUpperBound());
            }
        }
        PartKind kind = a.run().partKind();
        assertTrue(kinds.containsAll(List.of("impedance", "rx", "value", kind == PartKind.CAPACITOR ? "d" : "q")),
                kind + ": " + kinds);
        if (kind != PartKind.TRANSFORMER) {
            assertTrue(kinds.contains("bias"), kind + " sequence sweeps DC bias: " + kinds);
        }
    }

    private static void checkLabels(Plots.Named c, int width, int height) {
        ChartRenderingInfo info = new ChartRenderingInfo();
        String svg = Plots.svg(c.chart(), width, height, info);
        Rectangle2D data = info.getPlotInfo().getDataArea();
        String where = c.name() + " at " + width + "x" + height;
        Map<String, List<Label>> axes = new LinkedHashMap<>();
        List<Label> all = new ArrayList<>();
        List<String> axisTitles = new ArrayList<>();
        BufferedImage img = new BufferedImage(1, 1, BufferedImage.TYPE_INT_RGB);
        Matcher m = TEXT.matcher(svg);
        while (m.find()) {
            String fill = m.group(3) + "," + m.group(4) + "," + m.group(5);
            double size = Double.parseDouble(m.group(6));
            String text = unescape(m.group(7));
            if (size == 13.0) {
                axisTitles.add(text);
            }
            if (!fill.equals(TICK_FILL) || text.isEmpty()) {
                continue;
            }
            FontMetrics fm = img.getGraphics().getFontMetrics(new Font(Font.SANS_SERIF, Font.PLAIN, (int) size));
            Label l = new Label(text, Double.parseDouble(m.group(1)), Double.parseDouble(m.group(2)),
                    fm.stringWidth(text), fm.getAscent(), fm.getDescent());
            String axis;
            if (l.y() - l.ascent() >= data.getMaxY() - 1) {
                axis = "domain";
            } else if (l.x() + l.w() <= data.getMinX() + 1) {
                axis = "left";
            } else if (l.x() >= data.getMaxX() - 1) {
                axis = "right";
            } else {
                fail(where + ": tick label '" + text + "' inside the data area");
                return;
            }
            axes.computeIfAbsent(axis, k -> new ArrayList<>()).add(l);
            all.add(l);
        }
        assertTrue(axes.containsKey("domain") && axes.containsKey("left"), where + ": tick labels on both axes " + axes);
        for (Map.Entry<String, List<Label>> e : axes.entrySet()) {
            List<String> texts = e.getValue().stream().map(Label::text).toList();
            assertEquals(texts.size(), new HashSet<>(texts).size(), where + ", " + e.getKey() + " axis repeats: " + texts);
            assertTrue(texts.size() >= 2, where + ", " + e.getKey() + " axis has fewer than 2 labels: " + texts);
        }
        for (int i = 0; i < all.size(); i++) {
            for (int j = i + 1; j < all.size(); j++) {
                assertFalse(all.get(i).box().intersects(all.get(j).box()),
                        where + ": '" + all.get(i).text() + "' overlaps '" + all.get(j).text() + "'");
            }
        }
        // every axis title names its unit in brackets, except the dimensionless D and Q (the vertical
        // titles are drawn as outlines in the SVG, so they are read from the chart)
        XYPlot plot = c.chart().getXYPlot();
        for (int i = 0; i < plot.getRangeAxisCount(); i++) {
            axisTitles.add(plot.getRangeAxis(i).getLabel());
        }
        assertTrue(axisTitles.size() >= 2, where + ": axis titles " + axisTitles);
        for (String t : axisTitles) {
            assertTrue(t.matches(".*\\(.+\\)") || t.startsWith("D = ") || t.startsWith("Q = "),
                    where + ": axis title without a unit: " + t);
        }
    }

    /** |Z|, |R| and |X|, D or Q spanning a decade or more are on log axes; the frequency axis always here. */
    private static void checkLogWhereDecades(Plots.Named c) {
        XYPlot p = c.chart().getXYPlot();
        if (c.name().matches(".*-(impedance|rx|value|d|q)(-[0-9]+)?")) {
            assertInstanceOf(LogAxis.class, p.getDomainAxis(), c.name() + ": frequency axis");
        }
        if (c.name().matches(".*-(impedance|rx|d|q)(-[0-9]+)?")) {
            double lo = Double.POSITIVE_INFINITY;
            double hi = 0;
            for (int s = 0; s < p.getDataset(0).getSeriesCount(); s++) {
                for (int i = 0; i < p.getDataset(0).getItemCount(s); i++) {
                    double v = p.getDataset(0).getYValue(s, i);
                    lo = Math.min(lo, v);
                    hi = Math.max(hi, v);
                }
            }
            ValueAxis y = p.getRangeAxis();
            if (hi / lo >= 10) {
                assertInstanceOf(LogAxis.class, y, c.name() + ": values span " + lo + " .. " + hi);
            }
        }
    }

    private static String unescape(String s) {
        return s.replace("&lt;", "<").replace("&gt;", ">").replace("&quot;", "\"").replace("&apos;", "'")
                .replace("&amp;", "&");
    }
}
