package org.zweep.simulator.bench;

/** How the second winding of a transformer under test is connected while the first is measured. */
public enum Wiring {
    /** Second winding left open (open-circuit, magnetising inductance). */
    SECONDARY_OPEN,
    /** Second winding shorted (short-circuit, leakage inductance). */
    SECONDARY_SHORTED
}
