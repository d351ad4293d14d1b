package org.zweep.simulator.bench;

/** How long the simulated meter says each point takes ({@link PointResult#durationS()}). */
public enum Timing {
    /**
     * Like a real meter: a fixed overhead per point, then for each of the averages one
     * integration of the aperture (at least two periods of the test frequency), plus a settling
     * time when the DC bias differs from the previous point's.
     */
    REAL,
    /** Every point takes no time. */
    NONE
}
