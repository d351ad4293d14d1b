package org.zweep.driver.meter;

/**
 * What the fixture holds, or how a transformer's second winding is connected: the states an
 * operator, a motorised fixture or a handler is asked to bring about.
 */
public enum FixtureState {
    /** The part under test is in the fixture. */
    PART,
    /** The fixture's terminals are open (nothing inserted). */
    OPEN,
    /** The fixture's terminals are shorted (a shorting bar inserted). */
    SHORT,
    /** The load standard is in the fixture. */
    LOAD,
    /** The transformer's second winding is left open. */
    SECONDARY_OPEN,
    /** The transformer's second winding is shorted. */
    SECONDARY_SHORTED
}
