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
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.Derating;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.analysis.Sweep;

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

    /** The charts of {@code a}, in report order, before rendering. */
    public static List<Named> charts(AnalysisResult a) {
        String kind = a.run().partKind();
        String symbol = switch (kind) {
            case "capacitor" -> "Cs";
            case "resistor" -> "Rs";
            default -> "Ls";
        };
        String unit = switch (kind) {
            case "capacitor" -> "F";
            case "resistor" -> "Ω";
            default -> "H";
        };
        List<Named> out = new ArrayList<>();
        for (StepResult s : a.steps()) {
            String stem = safe(s.name());
            StepResult.SweepFit sf = s.primaryFit();
            List<Sweep> sweeps = sf != null ? List.of(sf.sweep())
                    : Sweep.of(a.run().rows()).stream().filter(w -> w.stepIndex() == s.index() && w.frequencies() > 1)
                            .limit(1).toList();
            for (Sweep w : sweeps) {
                String t = s.name() + " (" + w.describe() + ")";
                out.add(new Named(stem + "-impedance", Charts.impedance("|Z| and θ, " + t, w.points())));
                out.add(new Named(stem + "-rx", Charts.resistanceReactance("R and X, " + t, w.points())));
                out.add(new Named(stem + "-value", Charts.seriesValue(symbol + " with fitted model, " + t, symbol, unit,
                        w.points(), sf == null ? null : sf.fit())));
                boolean d = "capacitor".equals(kind);
                out.add(new Named(stem + "-" + (d ? "d" : "q"), Charts.loss((d ? "D, " : "Q, ") + t, d, w.points())));
            }
            int i = 0;
            for (Derating d : s.derating()) {
                String t = ("cs_f".equals(d.quantity()) ? "C vs DC bias" : "L vs bias current") + ", " + s.name() + " at "
                        + org.zweep.runner.analysis.Si.format(d.frequencyHz(), "Hz");
                out.add(new Named(stem + "-bias" + (i++ == 0 ? "" : "-" + i), Charts.derating(t, d)));
            }
        }
        return out;
    }

    /** A chart and its file stem. */
    public record Named(String name, JFreeChart chart) {
    }

    /** Renders every chart of {@code a} to {@code DIR/plots/NAME.png} and {@code .svg}. */
    public static List<Rendered> write(AnalysisResult a) {
        if (System.getProperty("java.awt.headless") == null) {
            System.setProperty("java.awt.headless", "true");
        }
        Path dir = a.run().folder().dir().resolve("plots");
        List<Rendered> out = new ArrayList<>();
        try {
            Files.createDirectories(dir);
            int n = 0;
            for (Named c : charts(a)) {
                Path png = dir.resolve(c.name() + ".png");
                ChartUtils.saveChartAsPNG(png.toFile(), c.chart(), WIDTH, HEIGHT);
                SVGGraphics2D g = new SVGGraphics2D(WIDTH, HEIGHT);
                g.setDefsKeyPrefix("z" + (n++) + "_");
                c.chart().draw(g, new java.awt.geom.Rectangle2D.Double(0, 0, WIDTH, HEIGHT));
                String svg = g.getSVGElement(null, true, new org.jfree.svg.ViewBox(0, 0, WIDTH, HEIGHT), null, null);
                Files.writeString(dir.resolve(c.name() + ".svg"), g.getSVGDocument(), StandardCharsets.UTF_8);
                out.add(new Rendered(c.name(), c.chart().getTitle().getText(), svg, png));
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write plots under " + dir + ": " + e.getMessage(), e);
        }
        return out;
    }

    private static String safe(String s) {
        String out = s.replaceAll("[^A-Za-z0-9._-]+", "-");
        return out.isEmpty() ? "step" : out;
    }
}
