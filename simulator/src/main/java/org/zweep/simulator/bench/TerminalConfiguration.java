package org.zweep.simulator.bench;

/** How the fixture connects the meter to the device: its terminal configuration. */
enum TerminalConfiguration {
    /** Current and sense share the leads: the lead resistance is in series with the device. */
    TWO_TERMINAL,
    /** Kelvin: separate sense leads, so the lead resistance is not measured. */
    FOUR_TERMINAL
}
