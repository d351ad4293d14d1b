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
 * @see #builder()
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

    /** A builder with nothing set (steps and checks empty). */
    public static Builder builder() {
        return new Builder();
    }

    /** A builder holding this plan's fields, to change some of them. */
    public Builder toBuilder() {
        return new Builder().name(name).source(source).meter(meter).safety(safety).fixture(fixture).part(part)
                .steps(steps).checks(checks);
    }

    /** Builds a {@link Plan} by field name. */
    public static final class Builder {
        private String name;
        private Path source;
        private MeterChoice meter;
        private SafetyLimits safety;
        private FixturePlan fixture;
        private Part part;
        private List<PlannedStep> steps = List.of();
        private List<CheckLimit> checks = List.of();

        private Builder() {
        }

        /** @see Plan#name() */
        public Builder name(String v) {
            name = v;
            return this;
        }

        /** @see Plan#source() */
        public Builder source(Path v) {
            source = v;
            return this;
        }

        /** @see Plan#meter() */
        public Builder meter(MeterChoice v) {
            meter = v;
            return this;
        }

        /** @see Plan#safety() */
        public Builder safety(SafetyLimits v) {
            safety = v;
            return this;
        }

        /** @see Plan#fixture() */
        public Builder fixture(FixturePlan v) {
            fixture = v;
            return this;
        }

        /** @see Plan#part() */
        public Builder part(Part v) {
            part = v;
            return this;
        }

        /** @see Plan#steps() */
        public Builder steps(List<PlannedStep> v) {
            steps = v;
            return this;
        }

        /** @see Plan#checks() */
        public Builder checks(List<CheckLimit> v) {
            checks = v;
            return this;
        }

        /** The plan. */
        public Plan build() {
            return new Plan(name, source, meter, safety, fixture, part, steps, checks);
        }
    }
}
