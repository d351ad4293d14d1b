package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.results.Json;
import org.zweep.runner.store.Capability;
import org.zweep.runner.store.ControlChart;
import org.zweep.runner.store.ResultsStore;
import org.zweep.runner.store.Trend;
import org.zweep.runner.text.ParameterTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep trend PART --check NAME}: one check's values across runs, with mean, σ and Cpk. */
@Command(name = "trend", mixinStandardHelpOptions = true,
        description = {"One check's values across the completed runs of a part (its name or a serial) in the"
                + " results index, oldest first.",
            "Prints their mean, standard deviation (n - 1) and Cpk = min(USL - mean, mean - LSL) / (3 sigma)"
                + " against the check's limits (ISO 22514-2), and draws a control chart (--chart FILE.png or"
                + " FILE.svg)."},
        footer = ExitCode.HELP_LIST)
public final class TrendCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    StoreOptions store;

    @Parameters(index = "0", paramLabel = "PART", description = "the part's name (as in the sequence) or a serial")
    String part;

    @Option(names = "--check", required = true, paramLabel = "NAME", description = "the check's name")
    String check;

    @Mixin
    JsonOption json;

    @Option(names = "--chart", paramLabel = "FILE", description = "write the control chart (PNG, or SVG for *.svg)")
    Path chart;

    @Override
    public Integer call() throws Exception {
        Trend t;
        try (ResultsStore s = store.open()) {
            t = Trend.of(s, part, check);
        }
        if (t.points().isEmpty()) {
            throw new InvalidInputException("no completed run of '" + part + "' with a check '" + check
                    + "' in the results index (zweep runs --part " + part + " lists its runs)");
        }
        if (chart != null) {
            ControlChart.write(t, chart);
        }
        PrintWriter out = spec.commandLine().getOut();
        Capability c = t.capability();
        if (json.on()) {
            out.print(Json.text(new TrendJson(t.part(), t.check(), t.parameter(), t.points(), c.n(), c.mean(),
                    c.sigma(), c.lsl(), c.usl(), c.cpk(), c.lcl(), c.ucl())));
            return ExitCode.OK;
        }
        Unit unit = ParameterTable.unit(t.parameter());
        out.printf(Locale.ROOT, "%s, check %s (%s): %d completed run%s%n", t.part(), t.check(), t.parameter(),
                t.points().size(), t.points().size() == 1 ? "" : "s");
        String fmt = "%-30s  %-10s  %-8s  %-12s  %s%n";
        out.printf(Locale.ROOT, fmt, "started", "serial", "lot", "value", "result");
        for (Trend.Point p : t.points()) {
            out.printf(Locale.ROOT, fmt, p.started(), p.serial() == null ? "-" : p.serial(),
                    p.lot() == null ? "-" : p.lot(), text(p.value(), unit), p.result() == null ? "-" : p.result());
        }
        out.printf(Locale.ROOT, "n = %d, mean = %s, sigma = %s, LSL = %s, USL = %s, Cpk = %s%n", c.n(),
                text(c.mean(), unit), text(c.sigma(), unit), text(c.lsl(), unit), text(c.usl(), unit),
                Double.isFinite(c.cpk()) ? String.format(Locale.ROOT, "%.3f", c.cpk())
                        : "not defined" + (c.n() < 2 ? " (fewer than two values)" : !(c.sigma() > 0) ? " (sigma = 0)"
                                : " (the check has no limit)"));
        if (chart != null) {
            out.println("chart: " + chart);
        }
        return ExitCode.OK;
    }

    /** {@code zweep trend --json}: the check's values run by run, then the capability figures. */
    record TrendJson(String part, String check, String parameter, java.util.List<Trend.Point> runs, int n,
            double mean, double sigma, double lsl, double usl, double cpk, double lcl, double ucl) {
    }

    private static String text(double v, Unit unit) {
        return Double.isFinite(v) ? Quantities.formatShort(v, unit, 5) : "-";
    }
}
