package org.zweep.simulator.scpi;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.concurrent.Semaphore;
import java.util.concurrent.TimeUnit;

/** A {@link Sleeper} that waits for the test instead of the clock: nothing really sleeps. */
final class GatedSleeper implements Sleeper {
    private final Semaphore gate = new Semaphore(0);
    private final Semaphore entered = new Semaphore(0);

    @Override
    public long nanoTime() {
        return System.nanoTime();
    }

    @Override
    public void sleepUntil(long deadlineNanos) throws InterruptedException {
        entered.release();
        gate.acquire();
    }

    /** Waits until the measurement worker is inside a point's duration. */
    void awaitPointStarted() throws InterruptedException {
        assertTrue(entered.tryAcquire(5, TimeUnit.SECONDS), "no point started");
    }

    /** Lets {@code n} points finish. */
    void release(int n) {
        gate.release(n);
    }
}
