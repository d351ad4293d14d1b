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
 */
public record PlannedStep(int index, String name, String prompt, BiasControl bias, List<PlannedPoint> points) {
    public PlannedStep {
        points = List.copyOf(points);
    }
}
