package org.zweep.runner.engine;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;

/**
 * The engine's writing thread: the work that follows a trigger's readings (building, judging,
 * writing and syncing its rows, telling the progress listener) runs here, in the order handed
 * over, while the engine's own thread has the meter measure the next trigger. The engine waits
 * ({@link #awaitBehind}) before each trigger, so that the rows on disk never lag further behind
 * the meter than its {@link RowSync} allows. A failure of the work (a full disk) stops the work
 * handed over after it and is thrown on the engine's thread by the next wait. Used by one engine
 * thread; not reusable after {@link #close()}.
 */
final class RowWritingThread implements AutoCloseable {
    private final ExecutorService thread = Executors.newSingleThreadExecutor(r -> {
        Thread t = new Thread(r, "zweep-rows");
        t.setDaemon(true);
        return t;
    });
    private final Object lock = new Object();
    /** Triggers handed over (the engine's thread only). */
    private long handed;
    /** Triggers whose work has finished, written and synced or failed (guarded by {@code lock}). */
    private long finished;
    /** The first failure of the work (guarded by {@code lock}). */
    private RuntimeException failure;

    /** Hands over the work on one trigger's readings. */
    void trigger(Runnable rows) {
        handed++;
        run(rows, true);
    }

    /** Hands over work that is no trigger's (a note kept in order with the rows around it). */
    void then(Runnable work) {
        run(work, false);
    }

    private void run(Runnable work, boolean counts) {
        thread.execute(() -> {
            try {
                if (failed() == null) {
                    work.run();
                }
            } catch (RuntimeException e) {
                fail(e);
            } catch (Error e) {
                fail(new IllegalStateException("writing the rows failed: " + e, e));
                throw e;
            } finally {
                synchronized (lock) {
                    if (counts) {
                        finished++;
                    }
                    lock.notifyAll(); // a waiter wakes for a finished trigger or a failure
                }
            }
        });
    }

    /** Keeps the work's first failure. */
    private void fail(RuntimeException e) {
        synchronized (lock) {
            if (failure == null) {
                failure = e;
            }
        }
    }

    private RuntimeException failed() {
        synchronized (lock) {
            return failure;
        }
    }

    /**
     * Waits, uninterruptibly, until at most {@code triggers} of those handed over are unfinished;
     * throws the work's failure, if any.
     */
    void awaitBehind(int triggers) {
        boolean interrupted = false;
        synchronized (lock) {
            while (handed - finished > triggers && failure == null) {
                try {
                    lock.wait();
                } catch (InterruptedException e) {
                    interrupted = true;
                }
            }
        }
        rethrow(interrupted);
    }

    /** Waits for all the work handed over (notes included), ends the thread and throws the work's failure, if any. */
    @Override
    public void close() {
        thread.shutdown();
        boolean interrupted = false;
        while (!thread.isTerminated()) {
            try {
                thread.awaitTermination(1, java.util.concurrent.TimeUnit.DAYS);
            } catch (InterruptedException e) {
                interrupted = true;
            }
        }
        rethrow(interrupted);
    }

    /** Restores the interrupt swallowed by a wait, then throws the work's failure, if any. */
    private void rethrow(boolean interrupted) {
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
        RuntimeException f = failed();
        if (f != null) {
            throw f;
        }
    }
}
