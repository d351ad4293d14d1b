package org.zweep.runner.plan;

/** How a transformer's second winding is connected while a point is measured. */
public enum Wiring {
    /** Not a transformer measurement, or nothing to say. */
    NONE,
    /** Second winding open: open-circuit (magnetising) inductance. */
    SECONDARY_OPEN,
    /** Second winding shorted: short-circuit (leakage) inductance. */
    SECONDARY_SHORTED
}
