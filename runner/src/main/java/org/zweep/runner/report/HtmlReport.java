package org.zweep.runner.report;

import com.github.mustachejava.DefaultMustacheFactory;
import com.github.mustachejava.Mustache;
import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.Function;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.Bins;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.Derating;
import org.zweep.runner.analysis.RepeatStats;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.analysis.Sweep;
import org.zweep.runner.analysis.TransformerResult;
import org.zweep.runner.plot.Plots;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.text.Figures;
import org.zweep.runner.text.ParameterTable;
import org.zweep.runner.verdict.CheckOutcome;
import org.zweep.runner.verdict.CheckText;

/**
 * Writes {@code DIR/report.html}: part and verdict first, then fitted and derived values with
 * uncertainties, checks, bins, plots (inline SVG), settings, compensation, meter identity and the
 * manifest. The page is the Mustache template {@code report.mustache} beside this class, filled
 * with the figures as text; the template engine HTML-escapes every value (only the plots' SVG,
 * written by JFreeSVG, is inserted as markup). The page references nothing outside itself.
 * Blocking file I/O.
 */
public final class HtmlReport {
    /** The report's file name in a run folder. */
    public static final String FILE = "report.html";
    private static final Mustache TEMPLATE =
            new DefaultMustacheFactory("org/zweep/runner/report").compile("report.mustache");

    private HtmlReport() {
    }

    /** Renders the plots and writes the report; returns its path. */
    public static Path write(AnalysisResult a) {
        List<Plots.Rendered> plots = Plots.write(a);
        Path file = a.run().folder().dir().resolve(FILE);
        try {
            Files.writeString(file, html(a, plots), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
        return file;
    }

    /** The report's HTML for {@code a} with {@code plots} embedded. */
    static String html(AnalysisResult a, List<Plots.Rendered> plots) {
        StringWriter w = new StringWriter(64 * 1024);
        TEMPLATE.execute(w, page(a, plots));
        return w.toString();
    }

    // ---- what the template shows: text only, escaped by the template engine ----------------------

    record Page(String partName, String verdictClass, String verdictText, String sequence, String outcome,
            String started, String ended, String nominal, List<Fit> fits, List<Check> checks, Table bins,
            TransformerTable transformer, List<DeratingTable> derating, List<Plot> plots, List<Repeat> repeats,
            List<Setting> settings, Compensation compensation, List<Row> meter, String manifest, List<String> notes) {
    }

    record Row(String key, String value) {
    }

    record Table(List<Row> rows) {
    }

    record Fit(String heading, List<FitRow> rows, String summary, List<String> notes) {
    }

    record FitRow(String label, String value, String sigma) {
    }

    record Check(boolean first, boolean last, String name, String label, String step, String at, String min,
            String max, String measured, String rule, String expandedU, String probability, String result,
            String resultClass) {
    }

    record TransformerTable(List<Figure> rows, List<String> notes) {
    }

    record Figure(String figure, String value, String how) {
    }

    record DeratingTable(String heading, List<Drop> rows, List<String> notes) {
    }

    record Drop(String drop, String bias) {
    }

    record Plot(String name, String svg, String title) {
    }

    record Repeat(boolean first, boolean last, String step, String frequency, int count, String label, String mean,
            String std, String spread) {
    }

    record Setting(String step, String conditions, int count, String range, int repeats) {
    }

    record Compensation(String mode, String standards, String data) {
    }

    static Page page(AnalysisResult a, List<Plots.Rendered> plots) {
        RunManifest m = a.run().manifest();
        RunManifest.PartInfo part = m.part();
        String partName = part == null ? "unknown part" : part.name() + " (" + part.kind() + ")";
        String nominal = null;
        if (part != null) {
            nominal = "Nominal " + (part.nominal() == null ? "—" : Figures.format(part.nominal(), Figures.unit(part.unit())))
                    + (part.tolerancePercent() == null ? "" : " ± " + Figures.number(part.tolerancePercent(), 6) + " %")
                    + (part.turnsRatio() == null ? "" : ", turns ratio N1:N2 " + TransformerResult.ratioText(part.turnsRatio()));
        }
        List<Row> meter = new ArrayList<>();
        if (m.meter() != null) {
            meter.add(new Row("identity", m.meter().identity()));
            meter.add(new Row("address", m.meter().address()));
            meter.add(new Row("dialect", m.meter().dialect()));
        }
        if (m.software() != null) {
            meter.add(new Row("software", m.software().name() + " " + m.software().version()));
        }
        meter.add(new Row("host", m.host()));
        RunManifest.CompensationInfo c = m.compensation();
        Compensation compensation = c == null ? null : new Compensation(c.mode(),
                c.standards() == null || c.standards().isEmpty() ? null : String.join(", ", c.standards()), c.data());
        String verdict = a.verdict();
        return new Page(partName, verdict.replace(' ', '-'), verdict.toUpperCase(Locale.ROOT),
                m.sequence() == null ? "" : m.sequence().name(), m.outcome(), Figures.time(m.started()),
                Figures.time(m.ended()), nominal, fits(a), checks(a), bins(a.bins()), transformer(a.transformer()),
                derating(a), plots.stream().map(p -> new Plot(p.name(), inlineSvg(p.svg()), p.title())).toList(),
                repeats(a), settings(a), compensation, meter, m.toJson(), a.notes());
    }

    private static List<Fit> fits(AnalysisResult a) {
        List<Fit> out = new ArrayList<>();
        for (StepResult s : a.steps()) {
            for (StepResult.SweepFit sf : s.fits()) {
                CircuitFit f = sf.fit();
                List<FitRow> rows = new ArrayList<>();
                for (Map.Entry<String, Double> e : f.parameters().entrySet()) {
                    String k = e.getKey();
                    rows.add(new FitRow(ParameterTable.label(k),
                            e.getValue() == null ? "not resolved" : Figures.of(k, e.getValue(), 6),
                            e.getValue() == null ? "—" : Figures.of(k, f.sigma().get(k), 2)));
                }
                rows.add(new FitRow("SRF (from the fitted model)", f.srfHz() == null ? "not resolved"
                        : Figures.format(f.srfHz(), Unit.HERTZ, 6), f.srfHz() == null || !Double.isFinite(f.srfU()) ? ""
                        : Figures.format(f.srfU(), Unit.HERTZ, 2)));
                rows.add(new FitRow("SRF (where the measured X changes sign)", f.srfDataHz() == null ? "not in sweep"
                        : Figures.format(f.srfDataHz(), Unit.HERTZ, 6), f.srfDataHz() == null
                        || !Double.isFinite(f.srfDataU()) ? "" : Figures.format(f.srfDataU(), Unit.HERTZ, 2)));
                rows.add(new FitRow("residual RMS (relative)", Figures.number(f.residualRms(), 3), ""));
                if (f.weighted()) {
                    rows.add(new FitRow("reduced χ² (weighted by u)", Figures.number(f.reducedChiSquared(), 3), ""));
                }
                String summary = "model " + f.model().id() + ", " + f.points() + " frequencies, " + f.iterations()
                        + " iterations, " + (f.converged() ? "converged" : "NOT converged");
                out.add(new Fit(s.name() + ": " + sf.sweep().describe(), rows, summary, f.notes()));
            }
        }
        return out;
    }

    private static List<Check> checks(AnalysisResult a) {
        Function<String, CheckText.StepUnits> units = a.stepUnits();
        List<CheckOutcome> checks = a.checks();
        List<Check> out = new ArrayList<>();
        for (int i = 0; i < checks.size(); i++) {
            CheckOutcome c = checks.get(i);
            Unit unit = c.unit();
            String at = CheckText.selection(c, units.apply(c.step()));
            String measured = c.values().isEmpty() ? "" : String.join(", ",
                    c.values().stream().map(v -> Figures.format(v, unit, 6)).toList());
            if (!c.note().isEmpty()) {
                measured += (c.values().isEmpty() ? "" : " — ") + c.note();
            }
            out.add(new Check(i == 0, i == checks.size() - 1, c.name(), CheckText.label(c), c.step(),
                    at.isEmpty() ? "sweep" : at, Figures.format(c.min(), unit, 6), Figures.format(c.max(), unit, 6),
                    measured, c.limit().rule().text(), Figures.format(c.expandedU(), unit, 3),
                    Double.isNaN(c.probability()) ? "—" : String.format(Locale.ROOT, "%.4f", c.probability()),
                    c.result(), c.result().replace(' ', '-')));
        }
        return out;
    }

    private static Table bins(Bins bins) {
        if (bins == null) {
            return null;
        }
        Unit unit = Figures.unit(bins.unit());
        List<Row> rows = new ArrayList<>();
        rows.add(new Row("measured", Figures.format(bins.measured(), unit, 6) + " (" + bins.source() + ")"));
        rows.add(new Row("nominal", Figures.format(bins.nominal(), unit, 6)));
        rows.add(new Row("deviation", Double.isFinite(bins.deviationPercent())
                ? String.format(Locale.ROOT, "%+.3f %%", bins.deviationPercent()) : "—"));
        rows.add(new Row("IEC 60062 tolerance letter", bins.letter() == null ? "none" : bins.letter()));
        rows.add(new Row("measured value against the stated tolerance (a bin, not a check)", bins.tolerance() == null
                ? "no tolerance stated" : bins.tolerance().decision().word() + " " + bins.tolerance().how(unit)));
        if (!bins.versusChecks().isEmpty()) {
            rows.add(new Row("versus the checks", bins.versusChecks()));
        }
        bins.nearest().forEach((k, v) -> rows.add(new Row("nearest " + k + " (IEC 60063)", Figures.format(v, unit, 3))));
        return new Table(rows);
    }

    private static TransformerTable transformer(TransformerResult t) {
        if (t == null) {
            return null;
        }
        String at = Figures.format(t.frequencyHz(), Unit.HERTZ);
        return new TransformerTable(List.of(
                new Figure("turns ratio N1:N2", t.turnsRatioText(), "derived: k × measured V1/V2 (symmetric-leakage model)"),
                new Figure("voltage ratio V1:V2", t.voltageRatioText(), "measured: primary driven, secondary open, mean over"
                        + " the ratio step's frequencies"),
                new Figure("primary inductance L_oc", Figures.format(t.openH(), Unit.HENRY),
                        "measured: primary, secondary open, at " + at),
                new Figure("leakage inductance L_sc (referred to the primary)", Figures.format(t.leakageH(), Unit.HENRY),
                        "measured: primary, secondary shorted, at " + at),
                new Figure("coupling k", Figures.number(t.k(), 4), "derived: √(1 − L_sc/L_oc)"),
                new Figure("mutual inductance M", Figures.format(t.mutualH(), Unit.HENRY), "derived: k·L_oc·N2/N1"),
                new Figure("magnetizing inductance", Figures.format(t.magnetizingH(), Unit.HENRY), "derived: k·L_oc")),
                t.notes());
    }

    private static List<DeratingTable> derating(AnalysisResult a) {
        List<DeratingTable> out = new ArrayList<>();
        for (StepResult s : a.steps()) {
            for (Derating d : s.derating()) {
                List<Drop> rows = new ArrayList<>();
                d.drops().forEach((pct, at) -> rows.add(new Drop(pct + " %",
                        at == null ? "not reached" : Figures.format(at, Figures.unit(d.biasMode()), 5)
                                + (Double.isFinite(d.dropsU().get(pct))
                                        ? " ± " + Figures.format(d.dropsU().get(pct), Figures.unit(d.biasMode()), 2)
                                        : ""))));
                out.add(new DeratingTable(s.name() + " at " + Figures.format(d.frequencyHz(), Unit.HERTZ), rows,
                        d.notes()));
            }
        }
        return out;
    }

    private static List<Repeat> repeats(AnalysisResult a) {
        List<Repeat> out = new ArrayList<>();
        for (StepResult s : a.steps()) {
            for (RepeatStats r : s.repeats()) {
                for (String k : r.mean().keySet()) {
                    out.add(new Repeat(out.isEmpty(), false, s.name(), Figures.format(r.frequencyHz(), Unit.HERTZ),
                            r.count(), ParameterTable.label(k), Figures.of(k, r.mean().get(k), 6),
                            Figures.of(k, r.std().get(k), 3), Figures.number(r.relativeSpread().get(k), 3)));
                }
            }
        }
        if (!out.isEmpty()) {
            Repeat l = out.get(out.size() - 1);
            out.set(out.size() - 1, new Repeat(l.first(), true, l.step(), l.frequency(), l.count(), l.label(), l.mean(),
                    l.std(), l.spread()));
        }
        return out;
    }

    private static List<Setting> settings(AnalysisResult a) {
        List<Setting> out = new ArrayList<>();
        for (Sweep s : a.sweeps()) {
            List<Impedance> p = s.points();
            out.add(new Setting(s.step(), s.describe(), p.size(), Figures.format(p.get(0).frequencyHz(), Unit.HERTZ)
                    + " – " + Figures.format(p.get(p.size() - 1).frequencyHz(), Unit.HERTZ), s.repeats()));
        }
        return out;
    }

    /** The SVG element without namespace declarations (not needed inline in HTML; keeps the page free of URLs). */
    public static String inlineSvg(String svg) {
        return svg.replaceAll("\\s+xmlns(:[A-Za-z]+)?=(\"[^\"]*\"|'[^']*')", "")
                .replaceAll("\\s+jfreesvg:[A-Za-z]+=(\"[^\"]*\"|'[^']*')", "");
    }
}
