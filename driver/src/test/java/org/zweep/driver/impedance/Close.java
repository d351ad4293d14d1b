package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;

/** Relative-tolerance assertion shared by the impedance tests. */
final class Close {
    private Close() {
    }

    /** Asserts |actual − expected| ≤ relative·|expected|. */
    static void assertRel(double expected, double actual, double relative) {
        assertEquals(expected, actual, Math.abs(expected) * relative);
    }
}
