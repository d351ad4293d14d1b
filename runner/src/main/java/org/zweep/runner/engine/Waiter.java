package org.zweep.runner.engine;

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
                try {
                    Thread.sleep(Math.min(50, Math.max(1, left / 1_000_000)), 0);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
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
