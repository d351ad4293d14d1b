package org.zweep.simulator.scpi;

import java.util.concurrent.locks.LockSupport;

/** The clock points are timed on and the wait for their end; replaced in unit tests so that nothing sleeps. */
interface Sleeper {
    /** The monotonic clock, in nanoseconds ({@link System#nanoTime()} outside tests). */
    long nanoTime();

    /**
     * Waits until {@link #nanoTime()} reaches {@code deadlineNanos} (returns at once if it has);
     * interruptible (ABORt cancels a running measurement).
     */
    void sleepUntil(long deadlineNanos) throws InterruptedException;

    /**
     * Parks until a deadline on {@link System#nanoTime()}. {@code Thread.sleep(millis, nanos)} on
     * JDK 17 rounds the nanoseconds to a whole millisecond, which made every simulated point up to
     * 1 ms longer than the timing model says.
     */
    Sleeper THREAD = new Sleeper() {
        @Override
        public long nanoTime() {
            return System.nanoTime();
        }

        @Override
        public void sleepUntil(long deadlineNanos) throws InterruptedException {
            for (long left = deadlineNanos - System.nanoTime(); left > 0; left = deadlineNanos - System.nanoTime()) {
                LockSupport.parkNanos(left);
                if (Thread.interrupted()) {
                    throw new InterruptedException("measurement aborted");
                }
            }
        }
    };
}
