package org.zweep.runner.plan;

/**
 * How DC bias changes are made within a step.
 *
 * @param rampPerS the fastest bias change allowed, in V/s or A/s (same unit as the bias);
 *     {@code Double.POSITIVE_INFINITY} for no limit
 * @param settleS the wait after a bias change before measuring, in seconds
 */
public record BiasControl(double rampPerS, double settleS) {
    /** No ramp limit, no settling wait. */
    public static final BiasControl NONE = new BiasControl(Double.POSITIVE_INFINITY, 0.0);
}
