package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class RoundTripStatsTest {

    @Test
    void oneToOneHundredMicroseconds() {
        long[] nanos = new long[100];
        for (int i = 0; i < 100; i++) {
            nanos[99 - i] = (i + 1) * 1000L;
        }
        RoundTripStats s = RoundTripStats.ofNanos(nanos);
        assertEquals(100, s.count());
        assertEquals(1.0, s.minUs());
        assertEquals(50.5, s.medianUs()); // median of an even count: mean of the middle two (NIST e-Handbook §1.3.5.1)
        assertEquals(99.0, s.p99Us()); // nearest rank: ceil(0.99 * 100) = rank 99 (common practice, no source)
        assertEquals(100.0, s.maxUs());
        assertEquals(100 / 5050e-6, s.perS(), 1e-6); // 100 queries in 5050 µs in total
    }

    @Test
    void oddCountTakesTheMiddleValue() {
        RoundTripStats s = RoundTripStats.ofNanos(new long[] {3000, 1000, 2000});
        assertEquals(2.0, s.medianUs()); // NIST e-Handbook §1.3.5.1
        assertEquals(3.0, s.p99Us()); // nearest rank ceil(2.97) = 3 (common practice, no source)
    }
}
