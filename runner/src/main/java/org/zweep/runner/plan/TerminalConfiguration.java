package org.zweep.runner.plan;

/** How the fixture connects the part to the meter: its terminal configuration. */
public enum TerminalConfiguration {
    /** Two terminals: lead resistance is in series with the part. */
    TWO_TERMINAL,
    /** Four terminals (Kelvin): the voltage is sensed at the part. */
    FOUR_TERMINAL
}
