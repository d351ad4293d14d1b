package org.zweep.simulator.scpi;

import java.util.concurrent.locks.LockSupport;

/** Waits out a point's duration; replaced in unit tests so that nothing sleeps. */
@FunctionalInterface
interface Sleeper {
    /** Waits {@code seconds}; interruptible (ABORt cancels a running measurement). */
    void sleep(double seconds) throws InterruptedException;

    /**
     * Parks until a deadline on the monotonic clock. {@code Thread.sleep(millis, nanos)} on JDK 17
     * rounds the nanoseconds to a whole millisecond, which made every simulated point up to 1 ms
     * longer than the timing model says.
     */
    Sleeper THREAD = seconds -> {
        if (seconds <= 0) {
            return;
        }
        long deadline = System.nanoTime() + (long) (seconds * 1e9);
        for (long left = deadline - System.nanoTime(); left > 0; left = deadline - System.nanoTime()) {
            LockSupport.parkNanos(left);
            if (Thread.interrupted()) {
                throw new InterruptedException("measurement aborted");
            }
        }
    };
}
