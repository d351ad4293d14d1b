package org.zweep.simulator.bench;

/**
 * A simulated bench: meter front end, fixture and the device in it. The SCPI server holds the
 * meter's settings and asks the bench for each point.
 *
 * <p>Implementations are thread-safe: several server connections may share one bench.
 */
public interface Bench {

    /** The meter's limits. */
    MeterLimits limits();

    /**
     * Measures one point as the meter's front end would, before meter-side correction: the
     * device in the fixture (or the standard in the slot), fixture residuals, lead resistance in
     * a 2-terminal connection, the source resistance, level-dependent parts and noise drawn from
     * the seed and {@code request.noiseKey()}. Does not sleep; the caller applies the duration.
     */
    PointResult measure(PointRequest request);

    /** What the fixture holds now. */
    FixtureSlot slot();

    /** Fits {@code slot} to the fixture. */
    void setSlot(FixtureSlot slot);

    /** How a transformer's second winding is connected (ignored for other devices). */
    Wiring wiring();

    /** Connects a transformer's second winding as {@code wiring}. */
    void setWiring(Wiring wiring);

    /** The seed all noise is drawn from. */
    long seed();

    /** Sets the seed all noise is drawn from. */
    void setSeed(long seed);
}
