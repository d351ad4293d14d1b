package org.zweep.simulator.bench;

/** Whether the simulated meter's drive or bias source is set as a voltage or as a current. */
public enum SourceKind {
    VOLTAGE,
    CURRENT
}
