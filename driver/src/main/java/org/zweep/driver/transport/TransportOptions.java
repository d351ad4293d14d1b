package org.zweep.driver.transport;

import java.time.Duration;
import java.util.Objects;

/**
 * How a transport is opened. Per-read timeouts are passed to each {@link Transport#read} instead.
 *
 * @param connectTimeout the longest wait to open the link (TCP connect); positive, never infinite
 * @param writeTimeout the longest wait for a write to be accepted; used by serial ports (TCP writes
 *     go to the kernel buffer and are not timed); positive
 */
public record TransportOptions(Duration connectTimeout, Duration writeTimeout) {

    /** The defaults: 5 s connect timeout, 5 s write timeout. */
    public static final TransportOptions DEFAULT = new TransportOptions(Duration.ofSeconds(5), Duration.ofSeconds(5));

    /** Checks that both timeouts are positive. */
    public TransportOptions {
        Objects.requireNonNull(connectTimeout, "connectTimeout");
        Objects.requireNonNull(writeTimeout, "writeTimeout");
        if (connectTimeout.isNegative() || connectTimeout.isZero() || writeTimeout.isNegative()
                || writeTimeout.isZero()) {
            throw new IllegalArgumentException("timeouts must be positive: " + connectTimeout + ", " + writeTimeout);
        }
    }
}
