package org.zweep.runner.analysis;

import java.util.List;

/**
 * The analysis of one step.
 *
 * @param name the step's name
 * @param index the step's index
 * @param fits one fit per frequency sweep in the step (per level, bias and wiring)
 * @param derating one derating per frequency and level where the step sweeps DC bias
 * @param repeats statistics of points read more than once
 * @param notes explanations for people
 */
public record StepResult(String name, int index, List<SweepFit> fits, List<Derating> derating,
        List<RepeatStats> repeats, List<String> notes) {
    public StepResult {
        fits = List.copyOf(fits);
        derating = List.copyOf(derating);
        repeats = List.copyOf(repeats);
        notes = List.copyOf(notes);
    }

    /** This result with every fit's sweep reduced to its conditions (no measured points). */
    StepResult withoutPoints() {
        return new StepResult(name, index, fits.stream().map(f -> new SweepFit(f.sweep().withoutPoints(), f.fit()))
                .toList(), derating, repeats, notes);
    }

    /** The first fit made, or null when the step has no sweep that could be fitted. */
    public SweepFit primaryFit() {
        return fits.stream().filter(f -> f.fit() != null).findFirst().orElse(null);
    }

    /**
     * A sweep and its fit.
     *
     * @param sweep the data
     * @param fit the fitted circuit; null when the sweep has too few frequencies to fit
     */
    public record SweepFit(Sweep sweep, CircuitFit fit) {
    }
}
