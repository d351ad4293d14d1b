package org.zweep.driver.transport;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class DeadlineTest {

    @Test
    void aZeroTimeoutStillLeavesOneMillisecond() {
        Deadline d = Deadline.after(0);
        assertTrue(d.atNanos() - System.nanoTime() <= 1_000_000L);
        assertEquals(1, d.millisLeftRoundedUp()); // never 0: a socket timeout of 0 waits forever
    }

    @Test
    void roundedUpNeverGivesUpAFractionEarlyAndRoundedDownNeverOverstates() {
        Deadline d = new Deadline(System.nanoTime() + 299_500_000L); // 299.5 ms
        long before = d.nanosLeft();
        long up = d.millisLeftRoundedUp();
        long down = d.millisLeft();
        long after = d.nanosLeft();
        assertTrue(up * 1_000_000L >= after, up + " ms is less than the " + after + " ns left");
        assertTrue((up - 1) * 1_000_000L < before, up + " ms is a whole millisecond more than the " + before + " ns left");
        assertTrue(down * 1_000_000L <= before, down + " ms is more than the " + before + " ns left");
        assertFalse(d.passed());
    }

    @Test
    void aPastDeadlineHasPassedAndNoTimeLeft() {
        Deadline d = new Deadline(System.nanoTime() - 5_000_000L);
        assertTrue(d.passed());
        assertTrue(d.millisLeft() <= -5);
        assertTrue(d.nanosLeft() < 0);
        assertEquals(1, d.millisLeftRoundedUp());
    }
}
