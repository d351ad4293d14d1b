package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisJson;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.verdict.CheckOutcome;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.CircuitModel;
import org.zweep.runner.analysis.Derating;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.analysis.TransformerResult;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import org.zweep.runner.text.Figures;
import org.zweep.runner.verdict.CheckText;
import org.zweep.runner.text.ParameterTable;

/** {@code zweep analyze DIR}: fits, derating, transformer figures, checks; writes {@code DIR/analysis.json}. */
@Command(name = "analyze", mixinStandardHelpOptions = true,
        description = {"Analyses a run folder and writes DIR/analysis.json.",
            "Equivalent-circuit fits, DC-bias derating, transformer parameters, repeat statistics, checks and bins."
                + " Exit code 1 when a check did not pass (a conditional pass is not a proven pass).",
            "With --json: the analysis.json document on standard output instead of the summary."},
        footer = ExitCode.HELP_LIST)
public final class AnalyzeCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "DIR", description = "the run folder")
    Path dir;

    @Mixin
    JsonOption json;

    @Option(names = "--model", paramLabel = "MODEL",
            description = "circuit to fit: capacitor, capacitor-leakage, capacitor-tan-delta, inductor, "
                    + "inductor-core-loss, resistor (default: from the part kind)")
    String model;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        CircuitModel m = model == null ? null : CircuitModel.byId(model);
        AnalysisResult a = Analysis.analyze(RunData.read(dir).requirePoints(), m);
        Path file = AnalysisJson.write(a);
        if (json.on()) {
            out.print(AnalysisJson.text(a));
        } else {
            summary(out, a);
            out.println("wrote " + file);
        }
        return CheckOutcome.failed(a.verdict()) ? ExitCode.CHECK_FAILED : ExitCode.OK;
    }

    /** {@code " ± u"}, or nothing when u is unknown. */
    private static String plusMinus(double u, Unit unit) {
        return Double.isFinite(u) ? " ± " + Figures.format(u, unit, 2) : "";
    }

    static void summary(PrintWriter out, AnalysisResult a) {
        var part = a.run().manifest().part();
        if (part != null) {
            out.printf(Locale.ROOT, "part %s (%s), verdict %s%n", part.name(), part.kind(), a.verdict());
        }
        for (StepResult s : a.steps()) {
            out.println("step " + s.name() + ":");
            for (StepResult.SweepFit sf : s.fits()) {
                CircuitFit f = sf.fit();
                StringBuilder b = new StringBuilder("  " + f.model().id() + " fit, " + sf.sweep().describe() + ":");
                String sep = " ";
                for (Map.Entry<String, Double> e : f.parameters().entrySet()) {
                    Unit unit = ParameterTable.unit(e.getKey());
                    b.append(sep).append(ParameterTable.label(e.getKey())).append(' ');
                    sep = ", ";
                    b.append(e.getValue() == null ? "not resolved"
                            : Figures.format(e.getValue(), unit) + " ± " + Figures.format(f.sigma().get(e.getKey()), unit, 2));
                }
                b.append(", SRF ").append(f.srfHz() == null ? "not resolved" : Figures.format(f.srfHz(), Unit.HERTZ)
                        + (f.weighted() && Double.isFinite(f.srfU()) ? " ± " + Figures.format(f.srfU(), Unit.HERTZ, 2) : ""));
                b.append(", residual ").append(Figures.number(f.residualRms(), 2));
                if (f.weighted()) {
                    b.append(String.format(Locale.ROOT, ", weighted by u, reduced chi-squared %.3g", f.reducedChiSquared()));
                }
                out.println(b);
                f.notes().stream().filter(n -> n.contains("does not fit")).forEach(n -> out.println("    " + n));
            }
            for (Derating d : s.derating()) {
                List<String> drops = new ArrayList<>();
                d.drops().forEach((pct, at) -> drops.add(at == null ? "never falls by " + pct + " %"
                        : pct + " % drop at " + Figures.format(at, Figures.unit(d.biasMode()))
                                + plusMinus(d.dropsU().get(pct), Figures.unit(d.biasMode()))));
                out.println("  derating at " + Figures.format(d.frequencyHz(), Unit.HERTZ) + ": " + String.join(", ", drops));
            }
        }
        TransformerResult t = a.transformer();
        if (t != null) {
            out.printf(Locale.ROOT, "transformer: turns ratio N1:N2 %s (k × measured V1:V2 %s), k %s, leakage L_sc %s"
                    + " (secondary shorted, at %s), mutual %s%n", t.turnsRatioText(), t.voltageRatioText(),
                    Figures.format(t.k(), Unit.NONE, 4) + plusMinus(t.uK(), Unit.NONE),
                    Figures.format(t.leakageH(), Unit.HENRY) + plusMinus(t.uLeakageH(), Unit.HENRY),
                    Figures.format(t.frequencyHz(), Unit.HERTZ), Figures.format(t.mutualH(), Unit.HENRY));
        }
        var units = a.stepUnits();
        for (CheckOutcome c : a.checks()) {
            out.println(CheckText.line(c, units.apply(c.step())));
        }
        if (a.bins() != null && a.bins().letter() != null) {
            var tol = a.bins().tolerance();
            out.printf(Locale.ROOT, "bin: %+.3f %% of nominal, tolerance letter %s%s%n", a.bins().deviationPercent(),
                    a.bins().letter(), tol == null ? "" : ", against the stated tolerance: " + tol.decision().word()
                            + " " + tol.how(Figures.unit(a.bins().unit())));
        }
        if (a.bins() != null && !a.bins().versusChecks().isEmpty()) {
            out.println("bin versus checks: " + a.bins().versusChecks());
        }

    }

}
