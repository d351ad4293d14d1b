package org.zweep.driver.transport;

import java.time.Duration;
import java.util.Objects;

/**
 * How a transport is opened. Per-read timeouts are passed to each {@link Transport#read} instead.
 *
 * @param connectTimeout the longest wait to open the link (TCP connect); positive, never infinite
 * @param writeTimeout the longest wait for a write to be accepted; used by serial ports (TCP writes
 *     go to the kernel buffer and are not timed); positive
 * @param replySpin how long a TCP read keeps polling for a reply that has not arrived yet before
 *     it parks in the operating system's timed wait; zero parks at once. A short spin saves the
 *     wake-up cost of the JDK's timed socket read (a non-blocking read, then {@code poll}) on fast
 *     links, at the price of that much CPU per read; default 50 µs
 */
public record TransportOptions(Duration connectTimeout, Duration writeTimeout, Duration replySpin) {

    /** The default reply spin: long enough for a loopback or LAN reply, short against a meter's point time. */
    public static final Duration DEFAULT_REPLY_SPIN = Duration.ofNanos(50_000);

    /** The defaults: 5 s connect timeout, 5 s write timeout, 50 µs reply spin. */
    public static final TransportOptions DEFAULT = new TransportOptions(Duration.ofSeconds(5), Duration.ofSeconds(5));

    /** Checks that both timeouts are positive and the spin is not negative. */
    public TransportOptions {
        Objects.requireNonNull(connectTimeout, "connectTimeout");
        Objects.requireNonNull(writeTimeout, "writeTimeout");
        Objects.requireNonNull(replySpin, "replySpin");
        if (connectTimeout.isNegative() || connectTimeout.isZero() || writeTimeout.isNegative()
                || writeTimeout.isZero()) {
            throw new IllegalArgumentException("timeouts must be positive: " + connectTimeout + ", " + writeTimeout);
        }
        if (replySpin.isNegative()) {
            throw new IllegalArgumentException("replySpin must not be negative: " + replySpin);
        }
    }

    /** Options with the given timeouts and the default reply spin. */
    public TransportOptions(Duration connectTimeout, Duration writeTimeout) {
        this(connectTimeout, writeTimeout, DEFAULT_REPLY_SPIN);
    }

    /** These options with another connect timeout. */
    public TransportOptions withConnectTimeout(Duration timeout) {
        return new TransportOptions(timeout, writeTimeout, replySpin);
    }

    /** These options with another reply spin ({@link Duration#ZERO} for none). */
    public TransportOptions withReplySpin(Duration spin) {
        return new TransportOptions(connectTimeout, writeTimeout, spin);
    }
}
