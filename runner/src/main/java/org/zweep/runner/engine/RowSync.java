package org.zweep.runner.engine;

/**
 * When a run's rows reach the storage device, and so what a power cut (or an operating-system
 * crash) can lose; the device cache is trusted to honour {@code fdatasync}. Killing the process
 * ({@code kill -9}, a JVM crash) loses in either mode only rows not yet handed to the operating
 * system: the trigger in progress and, with {@link #BEHIND}, the one whose rows were being written.
 */
public enum RowSync {
    /**
     * The run-folder contract (the default): a trigger's rows are built, judged, written and synced
     * on the engine's writing thread while the meter measures the next trigger, and are durable
     * before the trigger after next is sent. A power cut loses at most the point (or list sweep) in
     * progress and the one before it.
     */
    BEHIND,
    /**
     * A trigger's rows are durable before the next trigger is sent; a power cut loses at most the
     * point (or list sweep) in progress. The host's work on each row then adds to the meter's time.
     */
    BEFORE_NEXT;

    /** How many triggers may be measured past the last durable one, not counting the one being sent. */
    int triggersBehind() {
        return this == BEHIND ? 1 : 0;
    }
}
