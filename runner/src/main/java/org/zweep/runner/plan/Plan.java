package org.zweep.runner.plan;

import java.nio.file.Path;
import java.util.List;

/**
 * A validated sequence, expanded: everything the engine needs to run it and nothing it must
 * look up elsewhere.
 *
 * @param name the sequence's name
 * @param source the sequence file it came from
 * @param meter the meter to use (an override from the command line is applied by the caller)
 * @param safety limits checked before any command is sent
 * @param fixture terminal configuration and compensation
 * @param part the component under test
 * @param steps the steps in order
 * @param checks pass/fail limits
 */
public record Plan(String name, Path source, MeterChoice meter, SafetyLimits safety, FixturePlan fixture, Part part,
        List<PlannedStep> steps, List<CheckLimit> checks) {
    public Plan {
        steps = List.copyOf(steps);
        checks = List.copyOf(checks);
    }

    /** Every point of every step, in measuring order. */
    public List<PlannedPoint> points() {
        return steps.stream().flatMap(s -> s.points().stream()).toList();
    }
}
