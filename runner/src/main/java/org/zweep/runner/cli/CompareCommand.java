package org.zweep.runner.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.jfree.chart.ChartUtils;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.analysis.Sweep;
import org.zweep.runner.compare.Comparison;
import org.zweep.runner.plot.Charts;
import org.zweep.runner.results.Json;
import org.zweep.runner.text.ParameterTable;
import org.zweep.runner.plot.Plots;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep compare RUN RUN...}: checks and fitted values side by side, with differences. */
@Command(name = "compare", mixinStandardHelpOptions = true,
        description = {"Compares two or more run folders: each check's value and each step's fitted elements per run,"
                + " with the difference from the first run and the relative change; --plots DIR overlays each"
                + " step's first sweep of every run (|Z| and θ).",
            "Given lot folders (zweep lot), compares the lots: per check each lot's n, passes, mean, σ, lowest,"
                + " highest and Cpk, with each mean's difference from the first lot's."},
        footer = ExitCode.HELP_LIST)
public final class CompareCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(arity = "2..*", paramLabel = "RUN", description = "run folders, or lot folders; the first is the reference")
    List<Path> folders;

    @Mixin
    JsonOption json;

    @Option(names = "--plots", paramLabel = "DIR", description = "write overlaid plots (PNG and SVG) into DIR")
    Path plots;

    @Override
    public Integer call() throws Exception {
        long lots = folders.stream().filter(org.zweep.runner.lot.LotManifest::isLot).count();
        if (lots > 0) {
            if (lots != folders.size()) {
                throw new InvalidInputException("compare either run folders or lot folders, not both");
            }
            if (plots != null) {
                throw new InvalidInputException("--plots overlays runs; compare two of the lots' part folders for that");
            }
            return compareLots(org.zweep.runner.lot.LotComparison.of(folders), spec.commandLine().getOut());
        }
        Comparison c = Comparison.of(folders);
        List<Path> written = plots == null ? List.of() : plot(c, plots);
        PrintWriter out = spec.commandLine().getOut();
        if (json.on()) {
            List<RunJson> runs = c.runs().stream().map(r -> new RunJson(r.folder().toString(), r.label(),
                    r.manifest().id(), r.manifest().identityOrNone().serial(), r.manifest().identityOrNone().lot(),
                    r.manifest().verdict())).toList();
            List<RowJson> rows = new ArrayList<>();
            for (Comparison.Row row : c.rows()) {
                List<Double> d = new ArrayList<>();
                List<Double> rel = new ArrayList<>();
                for (int i = 0; i < row.values().size(); i++) {
                    d.add(row.difference(i));
                    rel.add(row.relative(i));
                }
                rows.add(new RowJson(row.kind(), row.name(), row.parameter(), row.values(), d, rel));
            }
            out.print(Json.text(new CompareJson(runs, rows, written.stream().map(Path::toString).toList())));
            return ExitCode.OK;
        }
        for (int i = 0; i < c.runs().size(); i++) {
            Comparison.Run r = c.runs().get(i);
            out.printf(Locale.ROOT, "%s %s: %s (verdict %s)%n", i == 0 ? "reference" : "run " + (i + 1), r.label(),
                    r.folder(), r.manifest().verdict());
        }
        StringBuilder head = new StringBuilder(String.format(Locale.ROOT, "%-34s", "quantity"));
        for (int i = 0; i < c.runs().size(); i++) {
            head.append(String.format(Locale.ROOT, "  %-13s", clip(c.runs().get(i).label(), 13)));
            if (i > 0) {
                head.append(String.format(Locale.ROOT, "  %-13s  %-8s", "difference", "change"));
            }
        }
        out.println(head.toString().stripTrailing());
        for (Comparison.Row row : c.rows()) {
            Unit unit = ParameterTable.unit(row.parameter());
            StringBuilder b = new StringBuilder(String.format(Locale.ROOT, "%-34s",
                    clip(row.kind() + " " + row.name(), 34)));
            for (int i = 0; i < row.values().size(); i++) {
                b.append(String.format(Locale.ROOT, "  %-13s", text(row.values().get(i), unit)));
                if (i > 0) {
                    double rel = row.relative(i);
                    b.append(String.format(Locale.ROOT, "  %-13s  %-8s", text(row.difference(i), unit),
                            Double.isFinite(rel) ? String.format(Locale.ROOT, "%+.3f %%", 100 * rel) : "-"));
                }
            }
            out.println(b.toString().stripTrailing());
        }
        written.forEach(f -> out.println("plot: " + f));
        return ExitCode.OK;
    }

    /** Lots side by side: per check, each lot's figures and the difference of each mean from the first lot's. */
    private int compareLots(org.zweep.runner.lot.LotComparison c, PrintWriter out) throws Exception {
        if (json.on()) {
            List<LotJson> lots = c.lots().stream().map(l -> new LotJson(l.folder().toString(), l.table().lot(),
                    l.table().parts().size(), l.table().completed(), l.table().passed(), l.table().failed(),
                    l.table().yield())).toList();
            List<LotCheckJson> checks = new ArrayList<>();
            for (var row : c.checks()) {
                LotCheckJson n = new LotCheckJson(row.name(), row.parameter(), new ArrayList<>(), new ArrayList<>(),
                        new ArrayList<>(), new ArrayList<>(), new ArrayList<>(), new ArrayList<>(), new ArrayList<>(),
                        new ArrayList<>(), new ArrayList<>());
                for (int i = 0; i < c.lots().size(); i++) {
                    var s = row.stats().get(i);
                    var cap = row.capability(i);
                    n.n().add(cap.n());
                    n.passed().add(s == null ? 0 : s.passed());
                    n.mean().add(cap.mean());
                    n.sigma().add(cap.sigma());
                    n.lowest().add(s == null ? Double.NaN : s.lowest());
                    n.highest().add(s == null ? Double.NaN : s.highest());
                    n.cpk().add(cap.cpk());
                    n.meanDifference().add(row.meanDifference(i));
                    n.meanRelative().add(row.meanRelative(i));
                }
                checks.add(n);
            }
            out.print(Json.text(new LotsJson(lots, checks)));
            return ExitCode.OK;
        }
        for (int i = 0; i < c.lots().size(); i++) {
            var t = c.lots().get(i).table();
            out.printf(Locale.ROOT, "%s %s: %s (%d parts, %d passed, %d failed, yield %s)%n",
                    i == 0 ? "reference" : "lot " + (i + 1), t.lot(), c.lots().get(i).folder(), t.parts().size(),
                    t.passed(), t.failed(), Double.isFinite(t.yield())
                            ? String.format(Locale.ROOT, "%.1f %%", 100 * t.yield()) : "-");
        }
        for (var row : c.checks()) {
            Unit unit = ParameterTable.unit(row.parameter());
            out.println();
            out.printf(Locale.ROOT, "check %s (%s)%n", row.name(), row.parameter());
            out.printf(Locale.ROOT, "  %-14s %5s %7s  %-12s %-12s %-12s %-12s %-8s %-12s %-8s%n", "lot", "n", "passed",
                    "mean", "sigma", "lowest", "highest", "Cpk", "difference", "change");
            for (int i = 0; i < c.lots().size(); i++) {
                var s = row.stats().get(i);
                var cap = row.capability(i);
                double rel = row.meanRelative(i);
                out.println(String.format(Locale.ROOT, "  %-14s %5d %7s  %-12s %-12s %-12s %-12s %-8s %-12s %-8s",
                        clip(c.lots().get(i).table().lot(), 14), cap.n(), s == null ? "-" : s.passed() + "/" + s.judged(),
                        text(cap.mean(), unit), text(cap.sigma(), unit), text(s == null ? Double.NaN : s.lowest(), unit),
                        text(s == null ? Double.NaN : s.highest(), unit),
                        Double.isFinite(cap.cpk()) ? String.format(Locale.ROOT, "%.2f", cap.cpk()) : "-",
                        i == 0 ? "" : text(row.meanDifference(i), unit),
                        i == 0 || !Double.isFinite(rel) ? "" : String.format(Locale.ROOT, "%+.3f %%", 100 * rel))
                        .stripTrailing());
            }
        }
        return ExitCode.OK;
    }

    /** One chart per step of the reference: the first sweep of each run that has the step, overlaid. */
    static List<Path> plot(Comparison c, Path dir) {
        if (System.getProperty("java.awt.headless") == null) {
            System.setProperty("java.awt.headless", "true");
        }
        List<Path> written = new ArrayList<>();
        try {
            Files.createDirectories(dir);
            for (StepResult step : c.runs().get(0).analysis().steps()) {
                List<Charts.Trace> traces = new ArrayList<>();
                for (Comparison.Run r : c.runs()) {
                    if (traces.size() == Charts.MAX_TRACES) {
                        break;
                    }
                    Sweep s = r.analysis().sweeps().stream()
                            .filter(w -> w.step().equals(step.name()) && w.frequencies() > 1).findFirst().orElse(null);
                    StepResult rs = r.analysis().step(step.name());
                    if (s != null) {
                        traces.add(new Charts.Trace(r.label(), s.points(),
                                rs == null || rs.primaryFit() == null ? null : rs.primaryFit().fit()));
                    }
                }
                if (traces.size() < 2) {
                    continue;
                }
                var chart = Charts.impedance("|Z| and θ, " + step.name() + ", " + traces.size() + " runs", traces);
                Path png = dir.resolve(Sweep.fileStem(step.name()) + "-impedance.png");
                ChartUtils.saveChartAsPNG(png.toFile(), chart, Plots.WIDTH, Plots.HEIGHT);
                Path svg = dir.resolve(Sweep.fileStem(step.name()) + "-impedance.svg");
                Files.writeString(svg, Plots.svg(chart, Plots.WIDTH, Plots.HEIGHT, null));
                written.add(png);
                written.add(svg);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write plots under " + dir + ": " + e.getMessage(), e);
        }
        if (written.isEmpty()) {
            throw new InvalidInputException("no step has a frequency sweep in two of the runs: nothing to overlay");
        }
        return written;
    }

    /** {@code zweep compare --json}: the runs, one row per compared quantity, the plots written. */
    record CompareJson(List<RunJson> runs, List<RowJson> rows, List<String> plots) {
    }

    /** {@code zweep compare --json} on lot folders. */
    record LotsJson(List<LotJson> lots, List<LotCheckJson> checks) {
    }

    /** One lot's counts and yield. */
    record LotJson(String folder, String lot, int parts, long completed, long passed, long failed, double yield) {
    }

    /** One check across the lots: each lot's figures, and each mean's difference from the first lot's. */
    record LotCheckJson(String name, String parameter, List<Integer> n, List<Integer> passed, List<Double> mean,
            List<Double> sigma, List<Double> lowest, List<Double> highest, List<Double> cpk,
            List<Double> meanDifference, List<Double> meanRelative) {
    }

    /** One compared run. */
    record RunJson(String folder, String label, String runId, String serial, String lot, String verdict) {
    }

    /** One quantity: its value in each run, and each run's difference and relative change from the first. */
    record RowJson(String kind, String name, String parameter, List<Double> values, List<Double> differences,
            List<Double> relative) {
    }

    private static String clip(String s, int n) {
        return s.length() <= n ? s : s.substring(0, n - 1) + "…";
    }

    private static String text(double v, Unit unit) {
        return Double.isFinite(v) ? Quantities.formatShort(v, unit, 4) : "-";
    }
}
