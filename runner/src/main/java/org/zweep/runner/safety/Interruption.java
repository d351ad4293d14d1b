package org.zweep.runner.safety;

import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;

/**
 * A request to stop a run early (first Ctrl-C, a termination signal, JVM shutdown), shared
 * between the thread that asks and the engine that obeys at the next safe place. Thread-safe.
 */
public final class Interruption {
    private volatile String reason;
    private final CountDownLatch stopped = new CountDownLatch(1);

    /** Asks the run to stop after (or instead of) the point in progress. Idempotent. */
    public void request(String why) {
        if (reason == null) {
            reason = why;
        }
    }

    /** Whether a stop was requested. */
    public boolean requested() {
        return reason != null;
    }

    /** Why the stop was requested, or {@code null}. */
    public String reason() {
        return reason;
    }

    /** Called by the run when it has stopped: bias is off and everything is written. */
    public void markStopped() {
        stopped.countDown();
    }

    /** Whether the run has stopped. */
    public boolean isStopped() {
        return stopped.getCount() == 0;
    }

    /** Waits up to {@code millis} for the run to stop; returns whether it did. */
    public boolean awaitStopped(long millis) {
        try {
            return stopped.await(millis, TimeUnit.MILLISECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return isStopped();
        }
    }
}
