package org.zweep.runner.engine;

import org.zweep.runner.plan.Wiring;

/**
 * What only the simulator offers: switching what the fixture holds and how a transformer's second
 * winding is connected (so that operator prompts pass by themselves), and keying the noise of the
 * next point so that a run is reproducible point by point. Each call blocks until sent, except
 * {@link #setNoiseKey}, which may travel with the next message to the meter.
 */
public interface SimulatorControl {

    /** What can be fitted to the simulated fixture. */
    enum Slot { OPEN, SHORT, LOAD, DEVICE }

    /** Fits {@code slot} to the fixture. */
    void setSlot(Slot slot);

    /** Connects the second winding as {@code wiring} ({@link Wiring#NONE} leaves it as it is). */
    void setWiring(Wiring wiring);

    /**
     * Makes the noise of the next point (or list) depend only on the seed and {@code key}; may be
     * sent with the next message (the trigger's) rather than on its own.
     */
    void setNoiseKey(long key);

    /** Sets the seed all noise is drawn from. */
    void setSeed(long seed);

    /** The seed all noise is drawn from now. */
    long seed();

    /** Whether the simulator waits for its meter's measuring time ({@code timing real}). */
    boolean realTiming();
}
