package org.zweep.runner.it;

/**
 * One made-up meter accuracy, written as a dialect's and as a bench's {@code accuracy:} section,
 * for the coverage tests: the simulated meter's errors follow the bench's declaration and zweep's
 * uncertainty the dialect's, so the two must state the same figures.
 */
final class DeclaredAccuracy {
    /** The dialect's {@code accuracy:} section (top level). */
    static final String DIALECT = """
            accuracy:
              distribution: normal-k2
              bands:
                low: 10 .. 2e7 Hz; 0.05 .. 0.15 V; 0 s; 0.5 %; 2e-3 ohm; 2e-9 S; phase 0.004 rad
                high: 10 .. 2e7 Hz; 0.3 .. 2 V; 0 s; 0.2 %; 1e-3 ohm; 1e-9 S; phase 0.002 rad
            """;

    /** The bench's {@code accuracy:} section (indented under the bench's meter). */
    static final String BENCH = """
              accuracy:
                distribution: normal-k2
                bands:
                  - {frequency_hz: [10, 2.0e7], level_vrms: [0.05, 0.15], integration_min_s: 0,
                     basic: 0.005, short_ohm: 2.0e-3, open_s: 2.0e-9, phase_rad: 0.004}
                  - {frequency_hz: [10, 2.0e7], level_vrms: [0.3, 2], integration_min_s: 0,
                     basic: 0.002, short_ohm: 1.0e-3, open_s: 1.0e-9, phase_rad: 0.002}
            """;

    private DeclaredAccuracy() {
    }
}
