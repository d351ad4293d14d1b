package org.zweep.runner.report;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.Bins;
import org.zweep.runner.verdict.CheckOutcome;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.Derating;
import org.zweep.runner.analysis.RepeatStats;
import org.zweep.runner.analysis.Si;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.analysis.Sweep;
import org.zweep.runner.analysis.TransformerResult;
import org.zweep.runner.plot.Plots;
import org.zweep.runner.results.RunManifest;

/**
 * Writes {@code DIR/report.html}: part and verdict first, then fitted and derived values with
 * uncertainties, checks, bins, plots (inline SVG), settings, compensation, meter identity and the
 * manifest. The page references nothing outside itself. Blocking file I/O.
 */
public final class HtmlReport {
    /** The report's file name in a run folder. */
    public static final String FILE = "report.html";

    private static final String CSS = """
            body{font-family:"DejaVu Sans",Arial,sans-serif;color:#1a1a1a;background:#fff;margin:2em auto;max-width:64em;\
            padding:0 1em;line-height:1.45}
            h1{font-size:1.6em;margin:0 0 .2em}h2{font-size:1.2em;border-bottom:2px solid #0072b2;padding-bottom:.2em;\
            margin-top:2em}h3{font-size:1.05em}
            table{border-collapse:collapse;margin:.5em 0 1em;font-size:.92em}th,td{border:1px solid #ccc;\
            padding:.3em .6em;text-align:left;vertical-align:top}th{background:#f2f5f8}
            td.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
            .verdict{display:inline-block;padding:.25em .8em;border-radius:.3em;font-weight:bold;color:#fff}
            .pass{background:#007a55}.fail{background:#c0392b}.none{background:#666}
            figure{margin:1em 0;page-break-inside:avoid}figure svg{width:100%;height:auto;max-width:800px;\
            border:1px solid #eee}figcaption{font-size:.85em;color:#555}
            pre{background:#f7f7f7;border:1px solid #ddd;padding:.8em;overflow-x:auto;font-size:.8em}
            .note{color:#555;font-size:.9em}
            @media print{body{margin:0;max-width:none}h2{page-break-after:avoid}}
            """;

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
        RunManifest m = a.run().manifest();
        RunManifest.PartInfo part = m.part();
        StringBuilder b = new StringBuilder(64 * 1024);
        String partName = part == null ? "unknown part" : part.name() + " (" + part.kind() + ")";
        b.append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">")
                .append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">")
                .append("<title>").append(esc("zweep report: " + partName)).append("</title><style>").append(CSS)
                .append("</style></head><body>\n");
        b.append("<h1>").append(esc(partName)).append("</h1>\n");
        String verdict = a.verdict();
        b.append("<p>Verdict: <span class=\"verdict ").append(verdict.replace(' ', '-')).append("\">").append(verdict.toUpperCase(Locale.ROOT))
                .append("</span> &nbsp; sequence <b>").append(esc(m.sequence() == null ? "" : m.sequence().name()))
                .append("</b>, run ").append(esc(m.outcome())).append(", ").append(esc(Si.time(m.started())))
                .append(" to ").append(esc(Si.time(m.ended()))).append("</p>\n");
        if (part != null) {
            b.append("<p>Nominal ").append(esc(part.nominal() == null ? "—" : Si.format(part.nominal(), Si.unitOfSymbol(part.unit()))))
                    .append(part.tolerancePercent() == null ? "" : " ± " + esc(fmt(part.tolerancePercent())) + " %")
                    .append(part.turnsRatio() == null ? "" : ", turns ratio N1:N2 "
                            + esc(org.zweep.runner.analysis.TransformerResult.ratioText(part.turnsRatio()))).append("</p>\n");
        }
        summary(b, a);
        checks(b, a.checks());
        bins(b, a.bins());
        transformer(b, a.transformer());
        derating(b, a);
        b.append("<h2>Plots</h2>\n");
        for (Plots.Rendered p : plots) {
            b.append("<figure id=\"plot-").append(esc(p.name())).append("\">").append(inlineSvg(p.svg()))
                    .append("<figcaption>").append(esc(p.title())).append(" (plots/").append(esc(p.name()))
                    .append(".png, .svg)</figcaption></figure>\n");
        }
        repeats(b, a);
        settings(b, a);
        b.append("<h2>Compensation</h2>\n<p>");
        RunManifest.CompensationInfo c = m.compensation();
        if (c == null) {
            b.append("not recorded");
        } else {
            b.append("mode <b>").append(esc(c.mode())).append("</b>");
            if (c.standards() != null && !c.standards().isEmpty()) {
                b.append(", standards ").append(esc(String.join(", ", c.standards())));
            }
            if (c.data() != null) {
                b.append(", data ").append(esc(c.data()));
            }
        }
        b.append("</p>\n<h2>Meter</h2>\n<table>");
        if (m.meter() != null) {
            row(b, "identity", m.meter().identity());
            row(b, "address", m.meter().address());
            row(b, "dialect", m.meter().dialect());
        }
        if (m.software() != null) {
            row(b, "software", m.software().name() + " " + m.software().version());
        }
        row(b, "host", m.host());
        b.append("</table>\n<h2>Manifest (run.json)</h2>\n<pre>").append(esc(m.toJson())).append("</pre>\n");
        for (String n : a.notes()) {
            b.append("<p class=\"note\">").append(esc(n)).append("</p>\n");
        }
        b.append("</body></html>\n");
        return b.toString();
    }

    private static void summary(StringBuilder b, AnalysisResult a) {
        b.append("<h2>Fitted equivalent circuits</h2>\n");
        boolean any = false;
        for (StepResult s : a.steps()) {
            for (StepResult.SweepFit sf : s.fits()) {
                any = true;
                CircuitFit f = sf.fit();
                b.append("<h3>").append(esc(s.name() + ": " + sf.sweep().describe())).append("</h3>\n<table><tr><th>")
                        .append("parameter</th><th>value</th><th>uncertainty (1σ)</th></tr>");
                for (Map.Entry<String, Double> e : f.parameters().entrySet()) {
                    Unit unit = Si.unitOf(e.getKey());
                    b.append("<tr><td>").append(esc(Si.label(e.getKey()))).append("</td><td class=\"num\">")
                            .append(e.getValue() == null ? "not resolved" : esc(Si.format(e.getValue(), unit, 6)))
                            .append("</td><td class=\"num\">")
                            .append(e.getValue() == null ? "—" : esc(Si.format(f.sigma().get(e.getKey()), unit, 2)))
                            .append("</td></tr>");
                }
                b.append("<tr><td>SRF (from the fitted model)</td><td class=\"num\">")
                        .append(f.srfHz() == null ? "not resolved" : esc(Si.format(f.srfHz(), Unit.HERTZ, 6)))
                        .append("</td><td class=\"num\">").append(f.srfHz() == null || !Double.isFinite(f.srfU()) ? ""
                                : esc(Si.format(f.srfU(), Unit.HERTZ, 2)))
                        .append("</td></tr><tr><td>SRF (where the measured X changes sign)</td><td class=\"num\">")
                        .append(f.srfDataHz() == null ? "not in sweep" : esc(Si.format(f.srfDataHz(), Unit.HERTZ, 6)))
                        .append("</td><td class=\"num\">").append(f.srfDataHz() == null || !Double.isFinite(f.srfDataU())
                                ? "" : esc(Si.format(f.srfDataU(), Unit.HERTZ, 2)))
                        .append("</td></tr><tr><td>residual RMS (relative)</td><td class=\"num\">")
                        .append(esc(String.format(Locale.ROOT, "%.3g", f.residualRms())))
                        .append(f.weighted() ? "</td><td></td></tr><tr><td>reduced χ² (weighted by u)</td><td class=\"num\">"
                                + esc(String.format(Locale.ROOT, "%.3g", f.reducedChiSquared())) : "")
                        .append("</td><td></td></tr></table>\n<p class=\"note\">model ").append(esc(f.model().id()))
                        .append(", ").append(f.points()).append(" frequencies, ").append(f.iterations())
                        .append(" iterations, ").append(f.converged() ? "converged" : "NOT converged").append("</p>\n");
                for (String n : f.notes()) {
                    b.append("<p class=\"note\">").append(esc(n)).append("</p>\n");
                }
            }
        }
        if (!any) {
            b.append("<p>No frequency sweep to fit.</p>\n");
        }
    }

    private static void checks(StringBuilder b, List<CheckOutcome> checks) {
        b.append("<h2>Checks</h2>\n");
        if (checks.isEmpty()) {
            b.append("<p>The sequence has no checks.</p>\n");
            return;
        }
        b.append("<table><tr><th>check</th><th>parameter</th><th>step</th><th>at</th><th>min</th><th>max</th>")
                .append("<th>measured</th><th>rule</th><th>U (k = 2)</th><th>p(conformance)</th><th>result</th></tr>");
        for (CheckOutcome c : checks) {
            Unit unit = c.unit();
            b.append("<tr><td>").append(esc(c.name())).append("</td><td>").append(esc(c.parameter())).append("</td><td>")
                    .append(esc(c.step())).append("</td><td class=\"num\">")
                    .append(esc(selection(c)))
                    .append("</td><td class=\"num\">").append(esc(Double.isNaN(c.min()) ? "—" : Si.format(c.min(), unit, 6)))
                    .append("</td><td class=\"num\">").append(esc(Double.isNaN(c.max()) ? "—" : Si.format(c.max(), unit, 6)))
                    .append("</td><td class=\"num\">");
            if (!c.values().isEmpty()) {
                b.append(esc(String.join(", ", c.values().stream().map(v -> Si.format(v, unit, 6)).toList())));
            }
            if (!c.note().isEmpty()) {
                b.append(c.values().isEmpty() ? "" : " — ").append(esc(c.note()));
            }
            b.append("</td><td>").append(esc(c.limit().rule().text())).append("</td><td class=\"num\">")
                    .append(esc(Double.isNaN(c.expandedU()) ? "—" : Si.format(c.expandedU(), unit, 3)))
                    .append("</td><td class=\"num\">")
                    .append(esc(Double.isNaN(c.probability()) ? "—" : String.format(Locale.ROOT, "%.4f", c.probability())))
                    .append("</td><td><span class=\"verdict ").append(c.result().replace(' ', '-')).append("\">")
                    .append(c.result())
                    .append("</span></td></tr>");
        }
        b.append("</table>\n");
    }

    /** Which points a check judges, for people: {@code 100 kHz, bias 0 A} or {@code sweep}. */
    private static String selection(CheckOutcome c) {
        CheckLimit.Selection s = c.limit().selection();
        List<String> parts = new java.util.ArrayList<>();
        if (!Double.isNaN(s.frequencyHz())) {
            parts.add(Si.format(s.frequencyHz(), Unit.HERTZ));
        }
        if (!Double.isNaN(s.bias())) {
            parts.add("bias " + Si.format(s.bias(), Unit.NONE));
        }
        if (!Double.isNaN(s.level())) {
            parts.add("level " + Si.format(s.level(), Unit.NONE));
        }
        if (!Double.isNaN(c.limit().dropPercent())) {
            parts.add(Si.format(c.limit().dropPercent(), Unit.NONE) + " % drop");
        }
        return parts.isEmpty() ? "sweep" : String.join(", ", parts);
    }

    private static void bins(StringBuilder b, Bins bins) {
        if (bins == null) {
            return;
        }
        b.append("<h2>Bins</h2>\n<table>");
        row(b, "measured", Si.format(bins.measured(), Si.unitOfSymbol(bins.unit()), 6) + " (" + bins.source() + ")");
        row(b, "nominal", Si.format(bins.nominal(), Si.unitOfSymbol(bins.unit()), 6));
        row(b, "deviation", Double.isFinite(bins.deviationPercent())
                ? String.format(Locale.ROOT, "%+.3f %%", bins.deviationPercent()) : "—");
        row(b, "IEC 60062 tolerance letter", bins.letter() == null ? "none" : bins.letter());
        row(b, "measured value against the stated tolerance (a bin, not a check)", bins.tolerance() == null
                ? "no tolerance stated" : bins.tolerance().decision().word() + " "
                        + bins.tolerance().how(Si.unitOfSymbol(bins.unit())));
        if (!bins.versusChecks().isEmpty()) {
            row(b, "versus the checks", bins.versusChecks());
        }
        bins.nearest().forEach((k, v) -> row(b, "nearest " + k + " (IEC 60063)", Si.format(v, Si.unitOfSymbol(bins.unit()), 3)));
        b.append("</table>\n");
    }

    private static void transformer(StringBuilder b, TransformerResult t) {
        if (t == null) {
            return;
        }
        String at = Si.format(t.frequencyHz(), Unit.HERTZ);
        b.append("<h2>Transformer</h2>\n<table><tr><th>figure</th><th>value</th><th>how it was obtained</th></tr>");
        row3(b, "turns ratio N1:N2", t.turnsRatioText(), "derived: k × measured V1/V2 (symmetric-leakage model)");
        row3(b, "voltage ratio V1:V2", t.voltageRatioText(), "measured: primary driven, secondary open, mean over"
                + " the ratio step's frequencies");
        row3(b, "primary inductance L_oc", Si.format(t.openH(), Unit.HENRY, 4), "measured: primary, secondary open, at " + at);
        row3(b, "leakage inductance L_sc (referred to the primary)", Si.format(t.leakageH(), Unit.HENRY, 4),
                "measured: primary, secondary shorted, at " + at);
        row3(b, "coupling k", Si.format(t.k(), Unit.NONE, 4), "derived: √(1 − L_sc/L_oc)");
        row3(b, "mutual inductance M", Si.format(t.mutualH(), Unit.HENRY, 4), "derived: k·L_oc·N2/N1");
        row3(b, "magnetizing inductance", Si.format(t.magnetizingH(), Unit.HENRY, 4), "derived: k·L_oc");
        b.append("</table>\n");
        t.notes().forEach(n -> b.append("<p class=\"note\">").append(esc(n)).append("</p>\n"));
    }

    private static void derating(StringBuilder b, AnalysisResult a) {
        for (StepResult s : a.steps()) {
            for (Derating d : s.derating()) {
                b.append("<h2>DC bias: ").append(esc(s.name() + " at " + Si.format(d.frequencyHz(), Unit.HERTZ)))
                        .append("</h2>\n<table><tr><th>drop</th><th>bias</th></tr>");
                d.drops().forEach((pct, at) -> b.append("<tr><td>").append(pct).append(" %</td><td class=\"num\">")
                        .append(at == null ? "not reached" : esc(Si.format(at, Si.unitOfSymbol(d.biasMode()), 5))).append("</td></tr>"));
                b.append("</table>\n");
                d.notes().forEach(n -> b.append("<p class=\"note\">").append(esc(n)).append("</p>\n"));
            }
        }
    }

    private static void repeats(StringBuilder b, AnalysisResult a) {
        boolean header = false;
        for (StepResult s : a.steps()) {
            for (RepeatStats r : s.repeats()) {
                if (!header) {
                    b.append("<h2>Repeats</h2>\n<table><tr><th>step</th><th>frequency</th><th>n</th><th>quantity</th>")
                            .append("<th>mean</th><th>std</th><th>relative spread</th></tr>");
                    header = true;
                }
                for (String k : r.mean().keySet()) {
                    b.append("<tr><td>").append(esc(s.name())).append("</td><td class=\"num\">")
                            .append(esc(Si.format(r.frequencyHz(), Unit.HERTZ))).append("</td><td class=\"num\">").append(r.count())
                            .append("</td><td>").append(esc(Si.label(k))).append("</td><td class=\"num\">")
                            .append(esc(Si.format(r.mean().get(k), Si.unitOf(k), 6))).append("</td><td class=\"num\">")
                            .append(esc(Si.format(r.std().get(k), Si.unitOf(k), 3))).append("</td><td class=\"num\">")
                            .append(esc(String.format(Locale.ROOT, "%.3g", r.relativeSpread().get(k)))).append("</td></tr>");
                }
            }
        }
        if (header) {
            b.append("</table>\n");
        }
    }

    private static void settings(StringBuilder b, AnalysisResult a) {
        b.append("<h2>Settings</h2>\n<table><tr><th>step</th><th>conditions</th><th>frequencies</th><th>range</th>")
                .append("<th>repeats</th></tr>");
        for (Sweep s : a.sweeps()) {
            List<org.zweep.driver.impedance.Impedance> p = s.points();
            b.append("<tr><td>").append(esc(s.step())).append("</td><td>").append(esc(s.describe())).append("</td><td class=\"num\">")
                    .append(p.size()).append("</td><td class=\"num\">")
                    .append(esc(Si.format(p.get(0).frequencyHz(), Unit.HERTZ) + " – " + Si.format(p.get(p.size() - 1).frequencyHz(), Unit.HERTZ)))
                    .append("</td><td class=\"num\">").append(s.repeats()).append("</td></tr>");
        }
        b.append("</table>\n");
    }

    /** The SVG element without namespace declarations (not needed inline in HTML; keeps the page free of URLs). */
    static String inlineSvg(String svg) {
        return svg.replaceAll("\\s+xmlns(:[A-Za-z]+)?=(\"[^\"]*\"|'[^']*')", "")
                .replaceAll("\\s+jfreesvg:[A-Za-z]+=(\"[^\"]*\"|'[^']*')", "");
    }

    private static void row3(StringBuilder b, String k, String v, String how) {
        b.append("<tr><th>").append(esc(k)).append("</th><td class=\"num\">").append(esc(v)).append("</td><td>")
                .append(esc(how)).append("</td></tr>");
    }

    private static void row(StringBuilder b, String k, String v) {
        b.append("<tr><th>").append(esc(k)).append("</th><td>").append(esc(v == null ? "" : v)).append("</td></tr>");
    }

    private static String fmt(double v) {
        return Si.format(v, Unit.NONE, 6);
    }


    static String esc(String s) {
        StringBuilder b = new StringBuilder(s.length());
        for (char c : s.toCharArray()) {
            switch (c) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                default -> b.append(c);
            }
        }
        return b.toString();
    }
}
