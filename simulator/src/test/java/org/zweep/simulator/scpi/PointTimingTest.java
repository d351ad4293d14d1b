package org.zweep.simulator.scpi;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

/** When simulated points end: timed from the trigger, each sweep point's end from the sweep's start. */
class PointTimingTest {
    /** A clock that stands still unless a wait moves it to its deadline plus a late wake-up. */
    private static final class ManualSleeper implements Sleeper {
        private final long lateNanos;
        private final List<Long> deadlines = new ArrayList<>();
        private volatile long now = 1_000_000_000L;

        ManualSleeper(long lateNanos) {
            this.lateNanos = lateNanos;
        }

        @Override
        public long nanoTime() {
            return now;
        }

        @Override
        public synchronized void sleepUntil(long deadlineNanos) {
            deadlines.add(deadlineNanos);
            now = Math.max(now, deadlineNanos + lateNanos);
        }

        synchronized List<Long> deadlines() {
            return List.copyOf(deadlines);
        }
    }

    // TestBench: each point takes averages × aperture; 2 × 5 ms = 10 ms here
    private final ManualSleeper clock = new ManualSleeper(300_000L);
    private final Console c = new Console(TestBench.resistor(), InstrumentOptions.defaults(), clock);

    @AfterEach
    void close() {
        c.close();
    }

    @Test
    void aPointEndsItsModelledDurationAfterTheTriggerArrived() {
        c.send("SENS:AVER:COUN 2;:SENS:IMP:APER 5E-3");
        long trigger = clock.nanoTime();
        c.send("READ?");
        // 2 averages × 5 ms aperture, TestBench's timing
        assertEquals(List.of(trigger + 10_000_000L), clock.deadlines());
    }

    @Test
    void aLateWakeUpInAListSweepDoesNotDelayTheLaterPoints() {
        c.send("SENS:AVER:COUN 2;:SENS:IMP:APER 5E-3;:SOUR:LIST:FREQ 100,1000,10000;:SOUR:FREQ:MODE LIST");
        long trigger = clock.nanoTime();
        c.send("READ?");
        // every wake-up is 0.3 ms late, yet point i ends (i+1) × 10 ms after the trigger
        assertEquals(List.of(trigger + 10_000_000L, trigger + 20_000_000L, trigger + 30_000_000L), clock.deadlines());
    }
}
