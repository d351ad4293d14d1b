package org.zweep.simulator.scpi;

/** How long a simulated point takes. */
public enum TimingModel {
    /** Each point takes the bench's {@code PointResult.durationS()}, as on a real meter. */
    REAL,
    /** As fast as possible: no waiting. */
    NONE
}
