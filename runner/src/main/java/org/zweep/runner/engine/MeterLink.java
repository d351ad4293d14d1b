package org.zweep.runner.engine;

import java.util.Optional;
import org.zweep.driver.MeterException;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.uncertainty.MeterAccuracy;

/**
 * The connection to one meter, which can be re-opened after it broke.
 *
 * <p>Used by one thread at a time, except that {@link #meter()} may be called from a shutdown
 * hook to turn bias off.
 */
public interface MeterLink extends AutoCloseable {

    /** The address, as the user wrote it (for messages). */
    String address();

    /** The meter on the current connection. */
    Meter meter();

    /**
     * Closes the current connection (quietly) and opens a new one.
     *
     * @return the meter on the new connection
     * @throws MeterException when the meter cannot be reached
     */
    Meter reconnect();

    /**
     * Whether {@code e} means the link broke or timed out (worth reconnecting), as opposed to an
     * error the meter reported or a reply that made no sense.
     */
    boolean isLinkFailure(MeterException e);

    /**
     * Whether the meter takes real time, so that host-side waits (bias ramp steps, settling, delays,
     * reconnect back-off) are waited out. Only a bench without timing, as whoever opened the link
     * built it, says no; a meter over a real link always says yes.
     */
    default boolean timed() {
        return true;
    }

    /** What the meter itself can switch in its fixture (see {@link Meter#fixture()}), on the current connection. */
    default Optional<org.zweep.driver.meter.FixtureControl> fixtureControl() {
        return meter().fixture();
    }

    /** The accuracy the meter's dialect states; empty when it states none. */
    default Optional<MeterAccuracy> accuracy() {
        return Optional.empty();
    }

    /** Turns bias off (best effort) and closes the connection; never throws. */
    @Override
    void close();
}
