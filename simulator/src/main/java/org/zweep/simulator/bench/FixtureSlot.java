package org.zweep.simulator.bench;

/** What is inserted across the fixture's terminals. */
public enum FixtureSlot {
    /** Nothing: the terminals are open. */
    OPEN,
    /** A shorting bar across the terminals. */
    SHORT,
    /** The known load standard. */
    LOAD,
    /** The device under test. */
    DEVICE
}
