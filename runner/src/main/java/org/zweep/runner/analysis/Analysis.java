package org.zweep.runner.analysis;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.PartKind;
import org.zweep.driver.impedance.ToleranceCode;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.conformance.Conformance;
import org.zweep.runner.conformance.DecisionRule;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.text.Figures;
import org.zweep.runner.text.ParameterTable;
import org.zweep.runner.verdict.CheckEvaluator;
import org.zweep.runner.verdict.CheckOutcome;
import org.zweep.runner.verdict.SweepFigures;

/**
 * The analysis of a run folder: fits, derating, transformer parameters, repeats, checks and
 * bins. Stateless and thread-safe; every method blocks for its computation (fits take well under
 * a second for any sweep a meter can make).
 */
public final class Analysis {
    /**
     * The most frequencies one fit takes: a longer sweep (a bench run of 100,000 points) is fitted
     * on this many, evenly spread, so the Jacobian stays a few megabytes (a meter's own sweeps
     * have at most a few thousand points and are fitted whole).
     */
    static final int MAX_FIT_FREQUENCIES = 5000;

    private Analysis() {
    }

    /** Reads and analyses the run folder {@code dir} with the model chosen by the part kind. */
    public static AnalysisResult analyze(Path dir) {
        return analyze(RunData.read(dir), null);
    }

    /**
     * Analyses {@code run}, reading its {@code points.csv} once as a stream (rows are folded into
     * per-step sums, never all held).
     *
     * @param model the circuit to fit to every frequency sweep; null to choose from the part kind
     */
    public static AnalysisResult analyze(RunData run, CircuitModel model) {
        return analyze(run, model, true);
    }

    /**
     * As {@link #analyze(RunData, CircuitModel)}; without {@code keepSweeps} the result holds no
     * measured points (its {@link AnalysisResult#sweeps()} is empty and each fit's sweep keeps only
     * its conditions): what judging the whole-sweep checks needs, in the least memory.
     */
    private static AnalysisResult analyze(RunData run, CircuitModel model, boolean keepSweeps) {
        CircuitModel chosen = model != null ? model : modelFor(run);
        String column = mainColumn(run.partKind());
        List<RunManifest.CheckInfo> infos = run.manifest().checks() == null ? List.of() : run.manifest().checks();
        CheckEvaluator evaluator = new CheckEvaluator(infos.stream().map(RunManifest.CheckInfo::toLimit).toList());
        TransformerResult.Collector transformerRows = new TransformerResult.Collector();
        FirstValue firstValue = new FirstValue(column);
        List<Sweep> sweeps = new ArrayList<>();
        StepData.Read<StepResult> read = StepData.read(run, column, r -> {
            evaluator.judge(r);
            transformerRows.add(r);
            firstValue.add(r);
        }, d -> {
            if (keepSweeps) {
                sweeps.addAll(d.sweeps());
            }
            StepResult s = step(run, d, chosen, column);
            return keepSweeps ? s : s.withoutPoints();
        });
        List<StepResult> steps = read.steps();
        TransformerResult transformer = run.partKind() == PartKind.TRANSFORMER || transformerRows.seen()
                ? transformerRows.result(nominalTurns(run.manifest()))
                : null;
        List<CheckOutcome> checks = evaluator.outcomes(figures(run, steps, transformer));
        return new AnalysisResult(run, steps, sweeps, transformer, checks, bins(run, steps, checks, firstValue),
                read.notes());
    }

    /**
     * The whole-sweep figures of {@code run} ({@code srf_hz}, {@code saturation}, fitted and
     * transformer figures), for the run engine to judge its whole-sweep checks at the end of a run
     * exactly as {@code zweep analyze} does.
     */
    public static SweepFigures sweepFigures(RunData run) {
        AnalysisResult a = analyze(run, null, false);
        return figures(run, a.steps(), a.transformer());
    }

    /**
     * Every frequency sweep of {@code run} (step, level, bias, wiring; repeats averaged), in step
     * order, from one streamed pass over {@code points.csv}, without fitting them.
     */
    public static List<Sweep> sweeps(RunData run) {
        List<Sweep> out = new ArrayList<>();
        StepData.read(run, mainColumn(run.partKind()), r -> { }, d -> out.addAll(d.sweeps()));
        return out;
    }

    /** The first impedance row's value of the part's main column: the bins' value when nothing was fitted. */
    private static final class FirstValue {
        final String column;
        PointRow row;

        FirstValue(String column) {
            this.column = column;
        }

        void add(PointRow r) {
            if (row == null && r.okImpedance() && Double.isFinite(r.value(column))) {
                row = r;
            }
        }
    }

    /** The default model for the run's part kind: capacitor, inductor (also for a transformer) or resistor. */
    private static CircuitModel modelFor(RunData run) {
        PartKind kind = run.partKind();
        if (kind == null) {
            throw new InvalidInputException("part kind '" + run.partKindWord() + "' has no default model; use --model");
        }
        return switch (kind) {
            case CAPACITOR -> CircuitModel.CAPACITOR;
            case INDUCTOR, TRANSFORMER -> CircuitModel.INDUCTOR;
            case RESISTOR -> CircuitModel.RESISTOR;
        };
    }

    /**
     * The series parameter that stands for the part's value: Cs (capacitor), Rs (resistor) or Ls
     * (others, and a part of unknown kind, {@code null}).
     */
    public static DerivedParameter mainParameter(PartKind partKind) {
        if (partKind == PartKind.CAPACITOR) {
            return DerivedParameter.CS;
        }
        return partKind == PartKind.RESISTOR ? DerivedParameter.RS : DerivedParameter.LS;
    }

    /** The points.csv column of the part's main series value: cs_f, ls_h or rs_ohm. */
    static String mainColumn(PartKind partKind) {
        return mainParameter(partKind).key();
    }

    private static StepResult step(RunData run, StepData data, CircuitModel model, String column) {
        List<String> notes = new ArrayList<>();
        List<StepResult.SweepFit> fits = new ArrayList<>();
        for (Sweep s : data.sweeps()) {
            if (s.frequencies() < model.keys().size() + 1) {
                continue;
            }
            Sweep fitted = s.thinned(MAX_FIT_FREQUENCIES);
            if (fitted != s) {
                notes.add(String.format(Locale.ROOT, "%s: fitted on %d of its %d frequencies, evenly spread (a fit"
                        + " needs no more; it bounds the fit's time and memory)", s.describe(), fitted.frequencies(),
                        s.frequencies()));
            }
            fits.add(new StepResult.SweepFit(s, fitted.hasUncertainties()
                    ? EquivalentCircuitFit.fitWeighted(model, fitted.uncertainties(), commonError(run))
                    : EquivalentCircuitFit.fit(model, fitted.points())));
        }
        if (data.noValue() > 0) {
            notes.add(data.noValue() + " point(s) without a value left out");
        }
        List<Derating> derating = new ArrayList<>();
        for (Map.Entry<StepData.DeratingKey, TreeMap<Double, double[]>> g : data.derating().entrySet()) {
            double[] biases = g.getValue().keySet().stream().mapToDouble(Double::doubleValue).toArray();
            double[] values = g.getValue().values().stream().mapToDouble(a -> a[0] / a[1]).toArray();
            double[] us = g.getValue().values().stream().mapToDouble(StepData::deratingU).toArray();
            derating.add(Derating.of(column, g.getKey().frequencyHz(), g.getKey().level(), g.getKey().biasMode(),
                    biases, values, us, dropsFor(run, data.name(), column)));
        }
        return new StepResult(data.name(), data.index(), fits, derating, data.repeats(), notes);
    }

    /** The error common to every point of the run: its load standard's stated uncertainty, if any. */
    static CommonError commonError(RunData run) {
        RunManifest.CompensationInfo c = run.manifest().compensation();
        return c == null || c.load() == null ? CommonError.NONE : CommonError.ofLoadStandard(c.load().stated());
    }

    private static double nominalTurns(RunManifest m) {
        return m.part() == null || m.part().turnsRatio() == null ? Double.NaN : m.part().turnsRatio();
    }

    /** The whole-sweep figures of a run already analysed into {@code steps} and {@code transformer}. */
    private static SweepFigures figures(RunData run, List<StepResult> steps, TransformerResult transformer) {
        return c -> {
            if (CheckLimit.SATURATION.equals(c.parameter())) {
                return saturation(c, steps);
            }
            double[] v = wholeSweepFigure(c, steps, transformer);
            return new SweepFigures.Figure(v[0], ParameterTable.unit(c.parameter()), "", v[1]);
        };
    }

    /**
     * The bias at which the step's value has fallen by the check's drop, at its frequency (and
     * level, when it names one), from the derating of the bias sweep there.
     */
    private static SweepFigures.Figure saturation(CheckLimit c, List<StepResult> steps) {
        StepResult step = steps.stream().filter(s -> s.name().equals(c.step())).findFirst().orElse(null);
        CheckLimit.Selection sel = c.selection();
        List<Derating> found = step == null ? List.of() : step.derating().stream()
                .filter(d -> CheckEvaluator.sameValue(sel.frequencyHz(), d.frequencyHz())
                        && CheckEvaluator.sameValue(sel.level(), d.level()))
                .toList();
        if (found.isEmpty()) {
            return new SweepFigures.Figure(Double.NaN, Unit.NONE, "no bias sweep measured at the selected points");
        }
        Derating d = found.get(0);
        Unit unit = Figures.unit(d.biasMode());
        Double at = d.biasAtDrop(c.dropPercent());
        String ref = "relative to " + Figures.format(d.referenceValue(), mainParameterOf(d.quantity()).unit()) + " at "
                + Figures.format(d.referenceBias(), unit);
        if (at == null) {
            double lowest = d.points().stream().mapToDouble(Derating.Point::percent).min().orElse(Double.NaN);
            return new SweepFigures.Figure(Double.NaN, unit, String.format(Locale.ROOT,
                    "never falls by %s %% up to %s (lowest %.1f %%, %s)", Figures.format(c.dropPercent(), Unit.NONE),
                    Figures.format(d.points().get(d.points().size() - 1).bias(), unit), lowest, ref));
        }
        return new SweepFigures.Figure(at, unit, ref, d.biasAtDropU(c.dropPercent()));
    }

    /**
     * The figure a whole-sweep check judges and its standard uncertainty: {value, u}, either NaN
     * when unknown. Fitted values carry the weighted fit's sigma, the self-resonance its
     * propagated u, transformer figures theirs ({@link TransformerResult}).
     */
    private static double[] wholeSweepFigure(CheckLimit c, List<StepResult> steps, TransformerResult transformer) {
        if (transformer != null) {
            switch (c.parameter()) {
                case "turns_ratio":
                    return new double[] {transformer.turnsRatio(), transformer.uTurnsRatio()};
                case "k":
                    return new double[] {transformer.k(), transformer.uK()};
                case "leakage_h":
                    return new double[] {transformer.leakageH(), transformer.uLeakageH()};
                case "mutual_h":
                    return new double[] {transformer.mutualH(), transformer.uMutualH()};
                default:
                    break;
            }
        }
        StepResult step = steps.stream().filter(s -> s.name().equals(c.step())).findFirst().orElse(null);
        StepResult.SweepFit sf = step == null ? null : step.primaryFit();
        if (sf == null) {
            return new double[] {Double.NaN, Double.NaN};
        }
        CircuitFit fit = sf.fit();
        if (CheckLimit.SRF.equals(c.parameter())) {
            if (fit.srfHz() != null) {
                return new double[] {fit.srfHz(), fit.weighted() ? fit.srfU() : Double.NaN};
            }
            return fit.srfDataHz() == null ? new double[] {Double.NaN, Double.NaN}
                    : new double[] {fit.srfDataHz(), fit.srfDataU()};
        }
        return new double[] {fit.value(c.parameter()), fit.standardUncertainty(c.parameter())};
    }

    private static DerivedParameter mainParameterOf(String column) {
        return "cs_f".equals(column) ? DerivedParameter.CS : DerivedParameter.LS;
    }

    /**
     * The drops to report for a step, ascending: the step's own ({@code derating} in the
     * sequence), else the defaults for the part, and the drop of every saturation check on it.
     */
    private static List<Integer> dropsFor(RunData run, String step, String column) {
        java.util.TreeSet<Integer> drops = new java.util.TreeSet<>();
        List<RunManifest.StepInfo> steps = run.manifest().steps() == null ? List.of() : run.manifest().steps();
        List<Integer> own = steps.stream().filter(s -> s.name().equals(step) && s.deratingDrops() != null)
                .map(RunManifest.StepInfo::deratingDrops).findFirst().orElse(null);
        drops.addAll(own != null ? own : "cs_f".equals(column) ? Derating.CAPACITOR_DROPS : Derating.INDUCTOR_DROPS);
        List<RunManifest.CheckInfo> checks = run.manifest().checks() == null ? List.of() : run.manifest().checks();
        for (RunManifest.CheckInfo c : checks) {
            if (CheckLimit.SATURATION.equals(c.parameter()) && step.equals(c.step()) && c.dropPercent() != null) {
                drops.add((int) Math.round(c.dropPercent()));
            }
        }
        return List.copyOf(drops);
    }

    /** The parameters whose checks judge the part's value itself (compared with the bin). */
    private static final List<String> VALUE_PARAMETERS = List.of("cs_f", "cp_f", "ls_h", "lp_h", "rs_ohm", "rp_ohm",
            "r_ohm", "z_ohm", "c_f", "l_h");

    private static Bins bins(RunData run, List<StepResult> steps, List<CheckOutcome> checks, FirstValue first) {
        RunManifest.PartInfo part = run.manifest().part();
        PartKind kind = run.partKind();
        if (kind == null || kind == PartKind.TRANSFORMER) {
            return null;
        }
        double measured = Double.NaN;
        double measuredU = Double.NaN;
        String source = "";
        for (StepResult s : steps) {
            StepResult.SweepFit sf = s.primaryFit();
            if (sf != null) {
                String key = sf.fit().model().keys().get(0);
                measured = sf.fit().value(key);
                measuredU = sf.fit().standardUncertainty(key);
                source = "fit of step " + s.name() + " (" + sf.sweep().describe() + ")";
                break;
            }
        }
        if (!Double.isFinite(measured) && first.row != null) {
            PointRow r = first.row;
            measured = r.value(first.column);
            measuredU = r.uncertainty().of(first.column);
            source = ParameterTable.label(first.column) + " of step " + r.step() + " at " + Figures.format(r.frequencyHz(), Unit.HERTZ);
        }
        if (!(measured > 0)) {
            return null;
        }
        String unit = mainParameter(kind).unit().symbol();
        double nominal = part == null || part.nominal() == null ? Double.NaN : part.nominal();
        double deviation = 100 * (measured - nominal) / nominal;
        String letter = Double.isFinite(nominal)
                ? ToleranceCode.classOf(measured, nominal, unit).map(c -> String.valueOf(c.letter())).orElse(null)
                : null;
        Boolean within = null;
        Conformance tolerance = null;
        if (part != null && part.tolerancePercent() != null && Double.isFinite(nominal)) {
            within = Math.abs(deviation) <= part.tolerancePercent();
            double t = part.tolerancePercent() / 100 * nominal;
            tolerance = binRule(checks).decide(measured, measuredU, nominal - t, nominal + t);
        }
        Map<String, Double> nearest = new LinkedHashMap<>();
        for (PreferredValues e : PreferredValues.values()) {
            nearest.put(e.name(), e.nearest(measured));
        }
        return new Bins(measured, source, nominal, unit, deviation, letter, within, nearest,
                versusChecks(tolerance, source, checks), measuredU, tolerance);
    }

    /** The rule of the first check on the part's value, else of the first check, else simple. */
    private static DecisionRule binRule(List<CheckOutcome> checks) {
        return checks.stream().filter(c -> VALUE_PARAMETERS.contains(c.parameter())).findFirst()
                .or(() -> checks.stream().findFirst()).map(c -> c.limit().rule()).orElse(DecisionRule.SIMPLE);
    }

    /**
     * What a reader must know when the bin's decision against the stated tolerance and a check on
     * the part's value differ: they judge different figures (a fitted element over the whole sweep,
     * or one point, against the stated tolerance; a check, its own points against its own limits).
     * Each side is named by its own decision word (a conditional pass is not a failure: the value
     * lies inside the limits, but within U of one, so conformance is not proven).
     */
    private static String versusChecks(Conformance tolerance, String source, List<CheckOutcome> checks) {
        if (tolerance == null) {
            return "";
        }
        List<String> disagree = new ArrayList<>();
        for (CheckOutcome c : checks) {
            if (VALUE_PARAMETERS.contains(c.parameter()) && c.verdict() != CheckOutcome.Verdict.NOT_EVALUATED
                    && !c.result().equals(tolerance.decision().word())) {
                disagree.add(c.name() + " (" + c.parameter() + "): " + c.result() + meaning(c.verdict()));
            }
        }
        if (disagree.isEmpty()) {
            return "";
        }
        return "check" + (disagree.size() > 1 ? "s " : " ") + String.join("; ", disagree) + "; the " + source
                + " against the stated tolerance: " + tolerance.decision().word() + " [" + tolerance.rule()
                + (Double.isNaN(tolerance.expandedU()) ? ", U unknown" : "") + "]."
                + " They differ because the bin judges that one figure against the part's tolerance and a check"
                + " judges its own selected points against its own limits (the verdict is the checks')";
    }

    /** What a decision word means, for the few that need it. */
    private static String meaning(CheckOutcome.Verdict v) {
        return switch (v) {
            case CONDITIONAL_PASS -> " (inside its limits, but within U of one: not a proven pass)";
            case CONDITIONAL_FAIL -> " (outside its limits, but within U of one: not a proven fail)";
            default -> "";
        };
    }
}
