package org.zweep.simulator.server;

import java.util.ArrayDeque;
import java.util.concurrent.locks.LockSupport;

/**
 * Turns to execute a message, as many at once as there are permits. A waiting message of a client
 * that waits for its reply (nothing more from it is buffered) gets the next turn before the
 * messages of clients that stream more, and streaming messages hold at most all permits but one
 * (when there are two or more): one processor stays for the clients that wait, for accepting and
 * for reading. Each kind is served in arrival order. A message that waits longer than its limit
 * goes on without a turn. Thread-safe.
 */
final class Turns {
    private final ArrayDeque<Waiter> waiting = new ArrayDeque<>();
    private final ArrayDeque<Waiter> streaming = new ArrayDeque<>();
    private final int streamingPermits;
    private int free; // guarded by this
    private int streamingHeld; // guarded by this

    private static final class Waiter {
        final Thread thread = Thread.currentThread();
        final boolean streaming;
        boolean granted; // guarded by Turns.this

        Waiter(boolean streaming) {
            this.streaming = streaming;
        }
    }

    Turns(int permits) {
        this.free = permits;
        this.streamingPermits = Math.max(1, permits - 1);
    }

    /**
     * Waits at most {@code limitNanos} for a turn.
     *
     * @param waitingClient whether the client waits for this message's reply (it goes first)
     * @return whether a turn was taken (give it back with {@link #give(boolean)}); false after the limit
     *     or when the thread is interrupted (its interrupt status is kept)
     */
    boolean take(boolean waitingClient, long limitNanos) {
        Waiter w;
        synchronized (this) {
            if (free > 0 && (waitingClient || streamingHeld < streamingPermits)) {
                free--;
                if (!waitingClient) {
                    streamingHeld++;
                }
                return true;
            }
            w = new Waiter(!waitingClient);
            (waitingClient ? waiting : streaming).addLast(w);
        }
        long end = System.nanoTime() + limitNanos;
        while (true) {
            long left = end - System.nanoTime();
            synchronized (this) {
                if (w.granted) {
                    return true;
                }
                if (left <= 0 || Thread.currentThread().isInterrupted()) {
                    waiting.remove(w);
                    streaming.remove(w);
                    return false;
                }
            }
            LockSupport.parkNanos(this, left);
        }
    }

    /**
     * Gives a turn back: to the first waiting client's message, else the first streaming one if
     * streaming messages hold fewer than their share.
     *
     * @param waitingClient as given to {@link #take(boolean, long)}
     */
    void give(boolean waitingClient) {
        Waiter next;
        synchronized (this) {
            if (!waitingClient) {
                streamingHeld--;
            }
            next = waiting.pollFirst();
            if (next == null && streamingHeld < streamingPermits) {
                next = streaming.pollFirst();
            }
            if (next == null) {
                free++;
                return;
            }
            next.granted = true;
            if (next.streaming) {
                streamingHeld++;
            }
        }
        LockSupport.unpark(next.thread);
    }
}
