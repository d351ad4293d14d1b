package org.zweep.runner.safety;

import java.util.ArrayList;
import java.util.List;

/**
 * Plans a DC-bias ramp: the values to apply, one after another, and the wait after each, so that
 * the bias never changes faster than the allowed rate. The one planner behind every bias change
 * of {@code zweep run} and {@code zweep measure}, up and down. Pure; thread-safe.
 */
public final class BiasRamp {
    /** The longest wait between two values of a ramp, in seconds. */
    public static final double MAX_STEP_S = 0.1;

    /**
     * One value of a ramp.
     *
     * @param value the bias to apply, in V or A
     * @param waitS how long to wait after applying it, in seconds
     */
    public record Step(double value, double waitS) {
    }

    private BiasRamp() {
    }

    /**
     * The steps from {@code from} (already applied) to {@code to}, equally spaced, each held
     * {@code |to - from| / ratePerS / n} seconds with {@code n} the fewest steps whose wait is at
     * most {@code maxStepS}. The last step is exactly {@code to}. Empty when {@code from == to};
     * one step without a wait when the rate is not a positive finite number (no limit).
     *
     * @param ratePerS the fastest change allowed, in V/s or A/s
     * @param maxStepS the longest wait between two values, in seconds (positive)
     */
    public static List<Step> plan(double from, double to, double ratePerS, double maxStepS) {
        if (from == to) {
            return List.of();
        }
        if (!(Double.isFinite(ratePerS) && ratePerS > 0)) {
            return List.of(new Step(to, 0.0));
        }
        double total = Math.abs(to - from) / ratePerS;
        int n = Math.max(1, (int) Math.ceil(total / maxStepS - 1e-9));
        List<Step> steps = new ArrayList<>(n);
        for (int k = 1; k <= n; k++) {
            steps.add(new Step(k == n ? to : from + (to - from) * k / n, total / n));
        }
        return steps;
    }

    /** {@link #plan(double, double, double, double)} with steps of at most {@link #MAX_STEP_S}. */
    public static List<Step> plan(double from, double to, double ratePerS) {
        return plan(from, to, ratePerS, MAX_STEP_S);
    }

    /** How long a ramp from {@code from} to {@code to} at {@code ratePerS} takes, in seconds (0 without a limit). */
    public static double durationS(double from, double to, double ratePerS) {
        if (!(Double.isFinite(ratePerS) && ratePerS > 0)) {
            return 0.0;
        }
        return Math.abs(to - from) / ratePerS;
    }
}
