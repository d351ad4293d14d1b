package org.zweep.runner.lot;

import com.github.mustachejava.DefaultMustacheFactory;
import com.github.mustachejava.Mustache;
import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import org.zweep.runner.plot.Histogram;
import org.zweep.runner.plot.Plots;
import org.zweep.runner.text.Figures;
import org.zweep.runner.text.ParameterTable;

/**
 * The lot report ({@code lot.html}): the yield, a histogram per checked parameter with the
 * check's limits, and a table of the parts, failing parts first. One file, the plots inline SVG;
 * the Mustache template {@code lot.mustache} escapes every value, only the plots' SVG is markup.
 */
public final class LotReport {
    /** The report's file name in a lot folder. */
    public static final String FILE = "lot.html";
    private static final Mustache TEMPLATE =
            new DefaultMustacheFactory("org/zweep/runner/lot").compile("lot.mustache");

    private LotReport() {
    }

    /** Writes {@code lotDir/lot.html} for {@code t}; returns its path. */
    public static Path write(LotTable t, Path lotDir) {
        if (System.getProperty("java.awt.headless") == null) {
            System.setProperty("java.awt.headless", "true");
        }
        Path file = lotDir.resolve(FILE);
        try {
            Files.writeString(file, html(t), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
        return file;
    }

    /** The report's HTML. */
    static String html(LotTable t) {
        StringWriter w = new StringWriter(64 * 1024);
        TEMPLATE.execute(w, page(t));
        return w.toString();
    }

    record Page(String lot, String yield, String yieldClass, long parts, long completed, long passed, long failed,
            long unfinished, List<Stat> stats, List<String> checkHeads, List<PartRow> rows) {
    }

    record Stat(String name, String label, String summary, String svg) {
    }

    record PartRow(int index, String serial, String verdict, String verdictClass, String outcome, String folder,
            List<Cell> cells) {
    }

    record Cell(String value, String resultClass) {
    }

    static Page page(LotTable t) {
        List<Stat> stats = new ArrayList<>();
        for (LotTable.CheckStats s : t.checkStats()) {
            var unit = ParameterTable.unit(s.parameter());
            String label = ParameterTable.label(s.parameter());
            var c = s.capability();
            String summary = String.format(Locale.ROOT, "%d of %d passed; n = %d, mean %s, σ %s, lowest %s, highest %s,"
                    + " limits %s … %s, Cpk %s", s.passed(), s.judged(), c.n(), Figures.format(c.mean(), unit),
                    Figures.format(c.sigma(), unit), Figures.format(s.lowest(), unit), Figures.format(s.highest(), unit),
                    Figures.format(c.lsl(), unit), Figures.format(c.usl(), unit),
                    Double.isFinite(c.cpk()) ? Figures.number(c.cpk(), 3) : "not defined");
            var chart = Histogram.of(s.name() + ": " + label + ", " + s.values().size() + " parts", label,
                    unit.symbol(), s.values(), c.lsl(), c.usl());
            stats.add(new Stat(s.name(), label, summary,
                    org.zweep.runner.report.HtmlReport.inlineSvg(Plots.svg(chart, Plots.WIDTH, 360, null))));
        }
        List<String> checks = t.checkNames();
        List<LotTable.Part> ordered = new ArrayList<>(t.parts());
        // failing parts first, then unfinished ones, then the rest; each group in lot order
        ordered.sort(Comparator.comparingInt((LotTable.Part p) -> p.failed() ? 0 : !p.completed() ? 1 : 2)
                .thenComparingInt(LotTable.Part::index));
        List<PartRow> rows = new ArrayList<>();
        for (LotTable.Part p : ordered) {
            List<Cell> cells = new ArrayList<>();
            for (String name : checks) {
                LotTable.Check c = p.checks().get(name);
                cells.add(c == null ? new Cell("—", "none")
                        : new Cell(Figures.of(c.parameter(), c.value()) + " " + c.result(), cssClass(c.result())));
            }
            String verdict = p.completed() ? p.verdict() : p.outcome();
            rows.add(new PartRow(p.index(), p.serial(), verdict.toUpperCase(Locale.ROOT),
                    p.completed() ? cssClass(p.verdict()) : "none", p.outcome(), p.folder().getFileName().toString(),
                    cells));
        }
        double y = t.yield();
        String yield = Double.isFinite(y) ? String.format(Locale.ROOT, "%.1f %%", 100 * y) : "—";
        long unfinished = t.parts().size() - t.completed();
        return new Page(t.lot(), yield, t.failed() == 0 && t.completed() > 0 ? "pass" : t.completed() == 0 ? "none"
                : "fail", t.parts().size(), t.completed(), t.passed(), t.failed(), unfinished, stats, checks, rows);
    }

    private static String cssClass(String result) {
        return "pass".equals(result) ? "pass" : "none".equals(result) || "not evaluated".equals(result) ? "none" : "fail";
    }
}
