package org.zweep.runner.engine;

import org.zweep.runner.safety.Interruption;
import java.util.concurrent.locks.LockSupport;

/**
 * Waits on the host side (bias ramp steps, settling, delays, reconnect back-off). Tests and
 * meters without timing ({@link MeterLink#timed()}) use one that does not sleep.
 */
public interface Waiter {

    /**
     * Waits {@code seconds} (nothing when 0 or less).
     *
     * @throws RunInterruptedException when the run is asked to stop while waiting
     */
    void waitS(double seconds);

    /**
     * Waits {@code seconds} even when the run was asked to stop: the waits of a bias ramp down,
     * which a first Ctrl-C or a termination signal must not cut short. Only the end of the
     * process ends it early. By default the same as {@link #waitS}.
     */
    default void waitThroughStopS(double seconds) {
        waitS(seconds);
    }

    /** A waiter that sleeps, waking early when {@code interruption} is requested. */
    static Waiter sleeping(Interruption interruption) {
        return new Waiter() {
            @Override
            public void waitS(double seconds) {
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
            }

            @Override
            public void waitThroughStopS(double seconds) {
                long end = System.nanoTime() + (long) (seconds * 1e9);
                for (long left = end - System.nanoTime(); left > 0; left = end - System.nanoTime()) {
                    LockSupport.parkNanos(left);
                }
            }
        };
    }

    /** A waiter that only checks for a stop request and never sleeps. */
    static Waiter none(Interruption interruption) {
        return new Waiter() {
            @Override
            public void waitS(double seconds) {
                if (interruption.requested()) {
                    throw new RunInterruptedException(interruption.reason());
                }
            }

            @Override
            public void waitThroughStopS(double seconds) {
                // no timing: nothing to wait for
            }
        };
    }
}
