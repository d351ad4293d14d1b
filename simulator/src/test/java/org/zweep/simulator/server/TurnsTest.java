package org.zweep.simulator.server;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;

/** Who gets the next turn to execute a message. */
class TurnsTest {
    private static final long LONG = TimeUnit.SECONDS.toNanos(30);

    @Test
    void streamingMessagesLeaveOneTurnForClientsThatWait() {
        Turns t = new Turns(2);
        assertTrue(t.take(false, 0));
        assertFalse(t.take(false, 0), "a second streaming message waits although a turn is free");
        assertTrue(t.take(true, 0), "the free turn goes to a client that waits");
    }

    @Test
    void aSingleTurnIsSharedByBoth() {
        Turns t = new Turns(1);
        assertTrue(t.take(false, 0));
        assertFalse(t.take(true, 0));
        t.give(false);
        assertTrue(t.take(true, 0));
    }

    @Test
    void aTurnGivenBackGoesToAWaitingClientBeforeEarlierStreamingMessages() throws InterruptedException {
        Turns t = new Turns(1);
        assertTrue(t.take(true, 0));
        List<String> order = new CopyOnWriteArrayList<>();
        Thread streaming = waiter(t, false, "streaming", order);
        awaitParked(streaming);
        Thread waiting = waiter(t, true, "waiting", order);
        awaitParked(waiting);
        t.give(true);
        streaming.join(10_000);
        waiting.join(10_000);
        assertEquals(List.of("waiting", "streaming"), order);
    }

    @Test
    void aMessageWhoseTurnDoesNotComeGoesOnWithoutOneAndLeavesNoTrace() {
        Turns t = new Turns(1);
        assertTrue(t.take(true, 0));
        assertFalse(t.take(true, TimeUnit.MILLISECONDS.toNanos(1)));
        t.give(true);
        assertTrue(t.take(false, 0), "the turn given back was free, not handed to the one that gave up");
    }

    @Test
    void anInterruptedWaitGivesUpAndKeepsTheInterrupt() {
        Turns t = new Turns(1);
        assertTrue(t.take(true, 0));
        Thread.currentThread().interrupt();
        try {
            assertFalse(t.take(true, LONG));
            assertTrue(Thread.currentThread().isInterrupted());
        } finally {
            Thread.interrupted();
        }
    }

    /** Takes a turn, records its name, gives the turn back. */
    private static Thread waiter(Turns t, boolean waitingClient, String name, List<String> order) {
        Thread th = new Thread(() -> {
            if (t.take(waitingClient, LONG)) {
                order.add(name);
                t.give(waitingClient);
            }
        }, name);
        th.start();
        return th;
    }

    private static void awaitParked(Thread th) throws InterruptedException {
        while (th.getState() != Thread.State.WAITING && th.getState() != Thread.State.TIMED_WAITING) {
            Thread.onSpinWait();
            if (!th.isAlive()) {
                throw new AssertionError(th.getName() + " ended before waiting");
            }
        }
    }
}
