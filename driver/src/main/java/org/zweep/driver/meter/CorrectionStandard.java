package org.zweep.driver.meter;

/** The fixture-compensation standards: the terminals left open, shorted, or closed by a known load. */
public enum CorrectionStandard {
    OPEN,
    SHORT,
    LOAD
}
