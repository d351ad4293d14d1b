package org.zweep.runner.plot;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.svg.SVGGraphics2D;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.PartKind;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.Derating;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.analysis.Sweep;
import org.zweep.runner.text.Figures;

/**
 * Renders the charts of an analysis to PNG and SVG under {@code DIR/plots/}. Sets
 * {@code java.awt.headless=true} when no display was chosen. Blocking file I/O.
 */
public final class Plots {
    /** Pixel size of every chart. */
    public static final int WIDTH = 800;
    /** Pixel height of every chart. */
    public static final int HEIGHT = 480;

    /**
     * One rendered chart.
     *
     * @param name the file stem, e.g. {@code sweep-impedance}
     * @param title its title
     * @param svg the SVG element (no XML declaration), for inline use
     * @param png the PNG file
     */
    public record Rendered(String name, String title, String svg, Path png) {
    }

    private Plots() {
    }

    /**
     * The charts of {@code a}, in report order, before rendering. Every frequency sweep of a step
     * (one per level, bias and wiring) is drawn: overlaid with a legend, up to
     * {@link Charts#MAX_TRACES} per chart, further sweeps on further charts ({@code -2}, ...).
     */
    public static List<Named> charts(AnalysisResult a) {
        PartKind kind = a.run().partKind();
        DerivedParameter value = Analysis.mainParameter(kind);
        boolean dissipation = kind == PartKind.CAPACITOR;
        List<Sweep> all = a.sweeps();
        List<Named> out = new ArrayList<>();
        for (StepResult s : a.steps()) {
            String stem = Sweep.fileStem(s.name());
            List<Sweep> sweeps = all.stream().filter(w -> w.stepIndex() == s.index() && w.frequencies() > 1).toList();
            for (int from = 0; from < sweeps.size(); from += Charts.MAX_TRACES) {
                List<Sweep> group = sweeps.subList(from, Math.min(sweeps.size(), from + Charts.MAX_TRACES));
                boolean single = group.size() == 1;
                List<Charts.Trace> traces = group.stream()
                        .map(w -> new Charts.Trace(single ? "" : w.describe(), w.points(), fitOf(s, w))).toList();
                String t = s.name() + (single ? " (" + group.get(0).describe() + ")" : ", " + group.size() + " sweeps");
                String part = from == 0 ? "" : "-" + (from / Charts.MAX_TRACES + 1);
                out.add(new Named(stem + "-impedance" + part, Charts.impedance("|Z| and θ, " + t, traces)));
                out.add(new Named(stem + "-rx" + part, Charts.resistanceReactance("|R| and |X|, " + t, traces)));
                out.add(new Named(stem + "-value" + part, Charts.seriesValue(Charts.symbol(value)
                        + " with fitted model, " + t, value, traces)));
                out.add(new Named(stem + "-" + (dissipation ? "d" : "q") + part,
                        Charts.loss((dissipation ? "D, " : "Q, ") + t, dissipation, traces)));
            }
            int i = 0;
            for (Derating d : s.derating()) {
                String t = ("cs_f".equals(d.quantity()) ? "C vs DC bias" : "L vs bias current") + ", " + s.name() + " at "
                        + Figures.format(d.frequencyHz(), Unit.HERTZ);
                out.add(new Named(stem + "-bias" + (i++ == 0 ? "" : "-" + i), Charts.derating(t, d)));
            }
        }
        return out;
    }

    private static CircuitFit fitOf(StepResult step, Sweep sweep) {
        return step.fits().stream().filter(f -> f.sweep().conditionLabel().equals(sweep.conditionLabel()))
                .map(StepResult.SweepFit::fit).findFirst().orElse(null);
    }

    /** A chart and its file stem. */
    public record Named(String name, JFreeChart chart) {
    }

    /** Renders every chart of {@code a} to {@code DIR/plots/NAME.png} and {@code .svg}. */
    public static List<Rendered> write(AnalysisResult a) {
        if (System.getProperty("java.awt.headless") == null) {
            System.setProperty("java.awt.headless", "true");
        }
        requireFonts();
        Path dir = a.run().folder().dir().resolve("plots");
        List<Rendered> out = new ArrayList<>();
        try {
            Files.createDirectories(dir);
            int n = 0;
            for (Named c : charts(a)) {
                Path png = dir.resolve(c.name() + ".png");
                ChartUtils.saveChartAsPNG(png.toFile(), c.chart(), WIDTH, HEIGHT);
                SVGGraphics2D g = draw(c.chart(), WIDTH, HEIGHT, "z" + (n++) + "_", null);
                String svg = g.getSVGElement(null, true, new org.jfree.svg.ViewBox(0, 0, WIDTH, HEIGHT), null, null);
                Files.writeString(dir.resolve(c.name() + ".svg"), g.getSVGDocument(), StandardCharsets.UTF_8);
                out.add(new Rendered(c.name(), c.chart().getTitle().getText(), svg, png));
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write plots under " + dir + ": " + e.getMessage(), e);
        }
        return out;
    }

    /**
     * {@code chart} drawn as a standalone SVG document of {@code width} × {@code height} pixels, as
     * the files under {@code plots/} are; {@code info}, when not null, receives the areas drawn
     * (the data area among them).
     */
    public static String svg(JFreeChart chart, int width, int height, org.jfree.chart.ChartRenderingInfo info) {
        if (System.getProperty("java.awt.headless") == null) {
            System.setProperty("java.awt.headless", "true");
        }
        return draw(chart, width, height, "z_", info).getSVGDocument();
    }

    private static SVGGraphics2D draw(JFreeChart chart, int width, int height, String defsPrefix,
            org.jfree.chart.ChartRenderingInfo info) {
        SVGGraphics2D g = new SVGGraphics2D(width, height);
        g.setDefsKeyPrefix(defsPrefix);
        chart.draw(g, new java.awt.geom.Rectangle2D.Double(0, 0, width, height), info);
        return g;
    }

    /**
     * Fails with one clear line when Java finds no font to draw text with (a machine without any
     * font package; on Debian the JRE's fontconfig dependency normally brings fonts-dejavu-core).
     */
    static void requireFonts() {
        try {
            java.awt.Graphics2D g = new java.awt.image.BufferedImage(1, 1, java.awt.image.BufferedImage.TYPE_INT_RGB)
                    .createGraphics();
            g.getFontMetrics(Charts.TICK).stringWidth("0");
            g.dispose();
        } catch (InternalError | RuntimeException e) {
            throw new UncheckedIOException("cannot draw the plots: Java finds no usable font; install one, e.g."
                    + " the Debian package fonts-dejavu-core", new IOException(e.toString(), e));
        }
    }
}
