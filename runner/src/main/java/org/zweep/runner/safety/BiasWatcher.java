package org.zweep.runner.safety;

import org.zweep.driver.meter.MeasurementSetting;

/**
 * Hears of every DC bias change the run makes, before the command is sent: the guard
 * process keeps the last one so that it can ramp the bias down if the run's process dies.
 * Called from the run's thread and, for {@link #off()}, from a shutdown hook; implementations
 * must be thread-safe and must not throw.
 */
public interface BiasWatcher {
    /** Hears nothing. */
    BiasWatcher NONE = new BiasWatcher() {
        @Override
        public void applying(MeasurementSetting s, double rampPerS) {
        }

        @Override
        public void off() {
        }
    };

    /**
     * {@code s} is about to be applied.
     *
     * @param rampPerS the fastest change allowed for its bias, in V/s or A/s (infinite for no limit)
     */
    void applying(MeasurementSetting s, double rampPerS);

    /** Bias is off (confirmed by the meter). */
    void off();
}
