package org.zweep.runner.sequence;

import org.zweep.driver.meter.Bias;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.plan.PlannedStep;

/**
 * A rough duration of a plan on a meter: per point a fixed overhead, the point's delay, and the
 * averaging count times the integration time (at least two periods of the test frequency, as a
 * meter needs whole periods to integrate); per bias change the ramp time at the step's ramp limit
 * plus its settle time (including the ramp up from zero and back down at the end). Operator
 * prompts and compensation standards are not counted. Stateless.
 */
public final class PlanEstimate {
    /** The per-point overhead assumed by {@link #seconds(Plan)}: command exchange and meter set-up, in s. */
    public static final double DEFAULT_OVERHEAD_S = 0.005;

    /** The fewest periods of the test frequency one integration covers. */
    static final double MIN_PERIODS = 2.0;

    private PlanEstimate() {
    }

    /** The estimated run time in seconds with {@link #DEFAULT_OVERHEAD_S}. */
    public static double seconds(Plan plan) {
        return seconds(plan, DEFAULT_OVERHEAD_S);
    }

    /** The estimated run time in seconds with {@code overheadS} seconds of overhead per point. */
    public static double seconds(Plan plan, double overheadS) {
        double total = 0.0;
        double bias = 0.0;
        double lastRamp = Double.POSITIVE_INFINITY;
        for (PlannedStep step : plan.steps()) {
            for (PlannedPoint p : step.points()) {
                Bias b = p.setting().bias();
                double target = b.appliedValue();
                if (target != bias) {
                    total += rampS(target - bias, step.bias().rampPerS()) + step.bias().settleS();
                    bias = target;
                }
                double integration = Math.max(p.setting().integrationTimeS(), MIN_PERIODS / p.setting().frequencyHz());
                total += integration * p.setting().averagingCount() + overheadS + p.delayS();
            }
            lastRamp = step.bias().rampPerS();
        }
        return total + rampS(bias, lastRamp);
    }

    private static double rampS(double change, double ratePerS) {
        return Double.isInfinite(ratePerS) ? 0.0 : Math.abs(change) / ratePerS;
    }

    /** {@code seconds} for people: {@code 42 s}, {@code 3 min 5 s}, {@code 1 h 2 min}. */
    public static String format(double seconds) {
        long s = Math.round(seconds);
        if (s < 60) {
            return s + " s";
        }
        if (s < 3600) {
            return (s / 60) + " min " + (s % 60) + " s";
        }
        return (s / 3600) + " h " + ((s % 3600) / 60) + " min";
    }
}
