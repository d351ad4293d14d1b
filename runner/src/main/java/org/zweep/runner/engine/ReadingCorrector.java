package org.zweep.runner.engine;

import org.zweep.driver.meter.Reading;
import org.zweep.driver.uncertainty.MeterAccuracy;
import org.zweep.driver.uncertainty.UncertainImpedance;

/** Turns a raw reading into a fixture-corrected one (host-side compensation). */
@FunctionalInterface
public interface ReadingCorrector {
    /** No correction. */
    ReadingCorrector NONE = r -> r;

    /** The corrected reading; voltage-ratio and no-value readings pass unchanged. */
    Reading correct(Reading raw);

    /**
     * The standard uncertainty of the corrected reading, given the raw reading's {@code rawU}
     * and the meter's stated accuracy (for the standards' readings); null when unknown. Without
     * a host-side correction it is the raw reading's own.
     */
    default UncertainImpedance uncertainty(Reading raw, UncertainImpedance rawU, MeterAccuracy accuracy) {
        return rawU;
    }
}
