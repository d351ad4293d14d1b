package org.zweep.simulator.scpi;

/** Waits out a point's duration; replaced in unit tests so that nothing sleeps. */
@FunctionalInterface
interface Sleeper {
    /** Waits {@code seconds}; interruptible (ABORt cancels a running measurement). */
    void sleep(double seconds) throws InterruptedException;

    /** Thread.sleep with sub-millisecond precision. */
    Sleeper THREAD = seconds -> {
        if (seconds > 0) {
            long nanos = (long) (seconds * 1e9);
            Thread.sleep(nanos / 1_000_000, (int) (nanos % 1_000_000));
        }
    };
}
