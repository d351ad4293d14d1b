package org.zweep.runner.engine;

import org.zweep.driver.meter.Reading;

/** Turns a raw reading into a fixture-corrected one (host-side compensation). */
@FunctionalInterface
public interface ReadingCorrector {
    /** No correction. */
    ReadingCorrector NONE = r -> r;

    /** The corrected reading; voltage-ratio and no-value readings pass unchanged. */
    Reading correct(Reading raw);
}
