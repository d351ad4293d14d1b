package org.zweep.runner.analysis;

import java.util.List;
import org.zweep.runner.verdict.CheckOutcome;

/**
 * Everything {@code zweep analyze} finds in a run folder.
 *
 * @param run the data analysed
 * @param steps one result per step that has measured points, in step order
 * @param sweeps every frequency sweep (step, level, bias, wiring; repeats averaged), in step order,
 *     those too short to fit included
 * @param transformer transformer parameters, or null for other parts
 * @param checks every check of the manifest, evaluated
 * @param bins the measured value against the nominal, or null when there is no main value
 * @param notes explanations for people
 */
public record AnalysisResult(RunData run, List<StepResult> steps, List<Sweep> sweeps, TransformerResult transformer,
        List<CheckOutcome> checks, Bins bins, List<String> notes) {
    public AnalysisResult {
        steps = List.copyOf(steps);
        sweeps = List.copyOf(sweeps);
        checks = List.copyOf(checks);
        notes = List.copyOf(notes);
    }

    /** {@code pass} when every check passed, {@code fail} when one failed, {@code none} without checks. */
    public String verdict() {
        if (checks.isEmpty()) {
            return "none";
        }
        return CheckOutcome.verdictOf(checks);
    }

    /** The step named {@code name}, or null. */
    public StepResult step(String name) {
        return steps.stream().filter(s -> s.name().equals(name)).findFirst().orElse(null);
    }

    /** The units of each step's DC bias and drive level, from its sweeps, to show the checks' selections with them. */
    public java.util.function.Function<String, org.zweep.runner.verdict.CheckText.StepUnits> stepUnits() {
        java.util.Map<String, org.zweep.runner.verdict.CheckText.StepUnits> byStep = new java.util.HashMap<>();
        for (Sweep s : sweeps) {
            byStep.putIfAbsent(s.step(), new org.zweep.runner.verdict.CheckText.StepUnits(
                    org.zweep.runner.text.Figures.unit(s.biasMode()), org.zweep.runner.text.Figures.unit(s.driveMode())));
        }
        return step -> byStep.getOrDefault(step, org.zweep.runner.verdict.CheckText.StepUnits.UNKNOWN);
    }
}
