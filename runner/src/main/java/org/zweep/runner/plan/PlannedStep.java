package org.zweep.runner.plan;

import java.util.List;

/**
 * One step of a sequence: its points in measuring order and how to move between them.
 *
 * @param index position in the sequence, from 0
 * @param name the step's name, unique within the sequence
 * @param prompt an instruction for the operator before the step ("fit the part", "short the
 *     secondary"); empty for none
 * @param bias how bias changes are ramped and settled
 * @param points the points in measuring order, slow changes outermost
 * @param deratingDrops the drops (whole percentages) the analysis reports for a bias sweep; empty
 *     for the defaults (20/50 % for a capacitor, 10/20/30 % otherwise)
 */
public record PlannedStep(int index, String name, String prompt, BiasControl bias, List<PlannedPoint> points,
        List<Integer> deratingDrops) {
    public PlannedStep {
        points = List.copyOf(points);
        deratingDrops = List.copyOf(deratingDrops);
    }

    /** A step with the default derating drops. */
    public PlannedStep(int index, String name, String prompt, BiasControl bias, List<PlannedPoint> points) {
        this(index, name, prompt, bias, points, List.of());
    }
}
