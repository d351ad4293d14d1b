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
import org.zweep.driver.impedance.ToleranceCode;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;

/**
 * The analysis of a run folder: fits, derating, transformer parameters, repeats, checks and
 * bins. Stateless and thread-safe; every method blocks for its computation (fits take well under
 * a second for any sweep a meter can make).
 */
public final class Analysis {
    private Analysis() {
    }

    /** Reads and analyses the run folder {@code dir} with the model chosen by the part kind. */
    public static AnalysisResult analyze(Path dir) {
        return analyze(RunData.read(dir), null);
    }

    /**
     * Analyses {@code run}.
     *
     * @param model the circuit to fit to every frequency sweep; null to choose from the part kind
     */
    public static AnalysisResult analyze(RunData run, CircuitModel model) {
        CircuitModel chosen = model != null ? model : modelFor(run.partKind());
        List<StepResult> steps = new ArrayList<>();
        TreeMap<Integer, List<PointRow>> byStep = new TreeMap<>();
        for (PointRow r : run.rows()) {
            byStep.computeIfAbsent(r.stepIndex(), k -> new ArrayList<>()).add(r);
        }
        for (List<PointRow> rows : byStep.values()) {
            steps.add(step(run, rows, chosen));
        }
        TransformerResult transformer = "transformer".equals(run.partKind())
                || run.rows().stream().anyMatch(r -> !"none".equals(r.wiring()) || "voltage_ratio".equals(r.quantity()))
                ? TransformerResult.of(run.rows(), nominalTurns(run.manifest()))
                : null;
        List<CheckOutcome> checks = evaluate(run, steps, transformer);
        return new AnalysisResult(run, steps, transformer, checks, bins(run, steps), run.notes());
    }

    /**
     * Evaluates every check of the run's manifest, including whole-sweep figures such as
     * {@code srf_hz} that need a fit; for the run engine to call at the end of a run.
     */
    public static List<CheckOutcome> evaluateChecks(RunData run) {
        return analyze(run, null).checks();
    }

    /** The default model for a part kind: capacitor, inductor (also for a transformer) or resistor. */
    public static CircuitModel modelFor(String partKind) {
        return switch (partKind.toLowerCase(Locale.ROOT)) {
            case "capacitor" -> CircuitModel.CAPACITOR;
            case "inductor", "transformer" -> CircuitModel.INDUCTOR;
            case "resistor" -> CircuitModel.RESISTOR;
            default -> throw new InvalidInputException("part kind '" + partKind + "' has no default model; use --model");
        };
    }

    /** The series parameter that stands for the part's value: Cs (capacitor), Rs (resistor) or Ls (others). */
    public static DerivedParameter mainParameter(String partKind) {
        return switch (partKind) {
            case "capacitor" -> DerivedParameter.CS;
            case "resistor" -> DerivedParameter.RS;
            default -> DerivedParameter.LS;
        };
    }

    /** The points.csv column of the part's main series value: cs_f, ls_h or rs_ohm. */
    static String mainColumn(String partKind) {
        return mainParameter(partKind).key();
    }

    private static StepResult step(RunData run, List<PointRow> rows, CircuitModel model) {
        PointRow first = rows.get(0);
        List<String> notes = new ArrayList<>();
        List<StepResult.SweepFit> fits = new ArrayList<>();
        for (Sweep s : Sweep.of(rows)) {
            if (s.frequencies() < model.keys().size() + 1) {
                continue;
            }
            fits.add(new StepResult.SweepFit(s, EquivalentCircuitFit.fit(model, s.points())));
        }
        long noValue = rows.stream().filter(r -> !"ok".equals(r.status())).count();
        if (noValue > 0) {
            notes.add(noValue + " point(s) without a value left out");
        }
        String column = mainColumn(run.partKind());
        List<Derating> derating = new ArrayList<>();
        if (!"rs_ohm".equals(column)) {
            Map<DeratingKey, Map<Double, double[]>> groups = new LinkedHashMap<>();
            for (PointRow r : rows) {
                if ("ok".equals(r.status()) && "impedance".equals(r.quantity())) {
                    DeratingKey key = new DeratingKey(r.frequencyHz(), r.level(), r.wiring(), r.biasMode());
                    double[] acc = groups.computeIfAbsent(key, k -> new TreeMap<>())
                            .computeIfAbsent(r.bias(), b -> new double[2]);
                    acc[0] += PointValues.of(r, column);
                    acc[1]++;
                }
            }
            for (Map.Entry<DeratingKey, Map<Double, double[]>> g : groups.entrySet()) {
                if (g.getValue().size() < 2) {
                    continue;
                }
                double[] biases = g.getValue().keySet().stream().mapToDouble(Double::doubleValue).toArray();
                double[] values = g.getValue().values().stream().mapToDouble(a -> a[0] / a[1]).toArray();
                derating.add(Derating.of(column, g.getKey().frequencyHz(), g.getKey().biasMode(), biases, values,
                        "cs_f".equals(column) ? Derating.CAPACITOR_DROPS : Derating.INDUCTOR_DROPS));
            }
        }
        List<RepeatStats> repeats = RepeatStats.of(rows, List.of("r_ohm", "x_ohm", column));
        return new StepResult(first.step(), first.stepIndex(), fits, derating, repeats, notes);
    }

    /** The points of one bias sweep: same frequency, level, wiring and bias mode. */
    private record DeratingKey(double frequencyHz, double level, String wiring, String biasMode) {
    }

    private static double nominalTurns(RunManifest m) {
        return m.part() == null || m.part().turnsRatio() == null ? Double.NaN : m.part().turnsRatio();
    }

    private static List<CheckOutcome> evaluate(RunData run, List<StepResult> steps, TransformerResult transformer) {
        List<CheckOutcome> out = new ArrayList<>();
        List<RunManifest.CheckInfo> checks = run.manifest().checks() == null ? List.of() : run.manifest().checks();
        for (RunManifest.CheckInfo c : checks) {
            double min = c.min() == null ? Double.NaN : c.min();
            double max = c.max() == null ? Double.NaN : c.max();
            double f = c.frequencyHz() == null ? Double.NaN : c.frequencyHz();
            List<Double> values = new ArrayList<>();
            String note = "";
            if (Double.isFinite(f)) {
                for (PointRow r : run.rows()) {
                    if (r.step().equals(c.step()) && "ok".equals(r.status()) && Math.abs(r.frequencyHz() - f) <= 1e-9 * f) {
                        values.add(PointValues.of(r, c.parameter()));
                    }
                }
                if (values.isEmpty()) {
                    note = "no measured point at this frequency";
                }
            } else {
                double v = wholeSweepFigure(c, steps, transformer);
                if (Double.isFinite(v)) {
                    values.add(v);
                } else {
                    note = c.parameter() + " not resolved by the data";
                }
            }
            boolean passed = !values.isEmpty() && values.stream().allMatch(v -> within(v, min, max));
            out.add(new CheckOutcome(c.name(), c.parameter(), c.step(), f, min, max, values, passed, note));
        }
        return out;
    }

    private static boolean within(double v, double min, double max) {
        return Double.isFinite(v) && (Double.isNaN(min) || v >= min) && (Double.isNaN(max) || v <= max);
    }

    private static double wholeSweepFigure(RunManifest.CheckInfo c, List<StepResult> steps,
            TransformerResult transformer) {
        if (transformer != null) {
            switch (c.parameter()) {
                case "turns_ratio":
                    return transformer.turnsRatio();
                case "k":
                    return transformer.k();
                case "leakage_h":
                    return transformer.leakageH();
                case "mutual_h":
                    return transformer.mutualH();
                default:
                    break;
            }
        }
        StepResult step = steps.stream().filter(s -> s.name().equals(c.step())).findFirst().orElse(null);
        StepResult.SweepFit sf = step == null ? null : step.primaryFit();
        if (sf == null) {
            return Double.NaN;
        }
        if ("srf_hz".equals(c.parameter())) {
            if (sf.fit().srfHz() != null) {
                return sf.fit().srfHz();
            }
            return sf.fit().srfDataHz() == null ? Double.NaN : sf.fit().srfDataHz();
        }
        return sf.fit().value(c.parameter());
    }

    private static Bins bins(RunData run, List<StepResult> steps) {
        RunManifest.PartInfo part = run.manifest().part();
        String kind = run.partKind();
        if (!List.of("capacitor", "inductor", "resistor").contains(kind)) {
            return null;
        }
        double measured = Double.NaN;
        String source = "";
        for (StepResult s : steps) {
            StepResult.SweepFit sf = s.primaryFit();
            if (sf != null) {
                measured = sf.fit().value(sf.fit().model().keys().get(0));
                source = "fit of step " + s.name() + " (" + sf.sweep().describe() + ")";
                break;
            }
        }
        if (!Double.isFinite(measured)) {
            String column = mainColumn(kind);
            for (PointRow r : run.rows()) {
                double v = PointValues.of(r, column);
                if ("ok".equals(r.status()) && "impedance".equals(r.quantity()) && Double.isFinite(v)) {
                    measured = v;
                    source = column + " of step " + r.step() + " at " + Si.format(r.frequencyHz(), Unit.HERTZ);
                    break;
                }
            }
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
        if (part != null && part.tolerancePercent() != null && Double.isFinite(nominal)) {
            within = Math.abs(deviation) <= part.tolerancePercent();
        }
        Map<String, Double> nearest = new LinkedHashMap<>();
        for (PreferredValues e : PreferredValues.values()) {
            nearest.put(e.name(), e.nearest(measured));
        }
        return new Bins(measured, source, nominal, unit, deviation, letter, within, nearest);
    }
}
