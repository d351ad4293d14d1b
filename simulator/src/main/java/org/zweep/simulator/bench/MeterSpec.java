package org.zweep.simulator.bench;

/**
 * The meter's front end.
 *
 * @param limits frequency, level, bias and range limits, and the source resistance
 * @param noiseRel relative 1σ noise of a mid-range reading at 1 V drive and 10 ms of integration
 * @param timing the timing model
 * @param pointOverheadS time per point besides the integration, in s
 * @param biasSettlingS extra time for a point whose DC bias differs from the previous one, in s
 * @param accuracy the accuracy the meter states, or null for none (then {@code noiseRel} applies)
 */
record MeterSpec(MeterLimits limits, double noiseRel, Timing timing, double pointOverheadS,
        double biasSettlingS, StatedAccuracy accuracy) {

    static final double[] DEFAULT_RANGES_OHM =
            {0.1, 1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8};

    static MeterSpec defaults() {
        return new MeterSpec(new MeterLimits(10, 20e6, 5e-3, 2, 50e-6, 20e-3, 40, 5, 201,
                DEFAULT_RANGES_OHM, 100), 1e-4, Timing.REAL, 2e-3, 50e-3, null);
    }

    MeterSpec withNoiseRel(double noise) {
        return new MeterSpec(limits, noise, timing, pointOverheadS, biasSettlingS, accuracy);
    }

    MeterSpec withTiming(Timing t) {
        return new MeterSpec(limits, noiseRel, t, pointOverheadS, biasSettlingS, accuracy);
    }
}
