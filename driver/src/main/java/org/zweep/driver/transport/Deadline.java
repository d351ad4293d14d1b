package org.zweep.driver.transport;

/**
 * A point on the monotonic clock ({@link System#nanoTime()}) by which a wait must end; the one
 * deadline arithmetic of the transports. Immutable.
 *
 * @param atNanos the {@link System#nanoTime()} value at which the time is up
 */
public record Deadline(long atNanos) {

    /** The deadline {@code timeoutMillis} from now; at least 1 ms, so a zero timeout still polls once. */
    public static Deadline after(long timeoutMillis) {
        return new Deadline(System.nanoTime() + Math.max(1, timeoutMillis) * 1_000_000L);
    }

    /** Whether the time is up. */
    public boolean passed() {
        return System.nanoTime() - atNanos >= 0;
    }

    /** Nanoseconds left; zero or negative once passed. */
    public long nanosLeft() {
        return atNanos - System.nanoTime();
    }

    /**
     * Whole milliseconds left, rounded up and at least 1: for a blocking call with a millisecond
     * timeout, which would otherwise give up a fraction early (and where 0 means "forever").
     */
    public long millisLeftRoundedUp() {
        return Math.max(1, (nanosLeft() + 999_999L) / 1_000_000L);
    }

    /** Whole milliseconds left, rounded down; zero or negative when (nearly) passed. */
    public long millisLeft() {
        return nanosLeft() / 1_000_000L;
    }
}
