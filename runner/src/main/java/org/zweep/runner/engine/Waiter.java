package org.zweep.runner.engine;

import java.util.concurrent.locks.LockSupport;

/**
 * Waits on the host side (bias ramp steps, settling, delays, reconnect back-off). Tests and
 * simulator runs without timing use one that does not sleep.
 */
public interface Waiter {

    /**
     * Waits {@code seconds} (nothing when 0 or less).
     *
     * @throws RunInterruptedException when the run is asked to stop while waiting
     */
    void waitS(double seconds);

    /** A waiter that sleeps, waking early when {@code interruption} is requested. */
    static Waiter sleeping(Interruption interruption) {
        return seconds -> {
            long end = System.nanoTime() + (long) (seconds * 1e9);
            while (true) {
                if (interruption.requested()) {
                    throw new RunInterruptedException(interruption.reason());
                }
                long left = end - System.nanoTime();
                if (left <= 0) {
                    return;
                }
                // parks to the deadline: Thread.sleep would round every wait up to a whole millisecond
                LockSupport.parkNanos(Math.min(50_000_000L, left));
                if (Thread.currentThread().isInterrupted()) {
                    throw new RunInterruptedException("interrupted");
                }
            }
        };
    }

    /** A waiter that only checks for a stop request and never sleeps. */
    static Waiter none(Interruption interruption) {
        return seconds -> {
            if (interruption.requested()) {
                throw new RunInterruptedException(interruption.reason());
            }
        };
    }
}
