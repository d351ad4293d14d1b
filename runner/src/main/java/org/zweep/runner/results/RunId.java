package org.zweep.runner.results;

import java.security.SecureRandom;
import java.time.Instant;
import java.util.UUID;

/**
 * Run ids: UUID version 7 (RFC 9562, section 5.7), written as the usual 36-character lower-case
 * text. The first 48 bits are the Unix time in milliseconds, so ids sort by the time the run
 * started (as text too); the remaining 74 bits are random (a {@link SecureRandom}), so ids made
 * on different stations at the same millisecond still differ. Built on {@link java.util.UUID},
 * which formats and parses any version. Thread-safe.
 */
public final class RunId {
    private static final SecureRandom RANDOM = new SecureRandom();

    private RunId() {
    }

    /** A new id for a run starting at {@code start}. */
    public static String next(Instant start) {
        byte[] r = new byte[10];
        RANDOM.nextBytes(r);
        long randA = ((r[0] & 0xFFL) << 8 | (r[1] & 0xFFL)) & 0xFFF;
        long randB = 0;
        for (int i = 2; i < 10; i++) {
            randB = randB << 8 | (r[i] & 0xFFL);
        }
        return of(start.toEpochMilli(), randA, randB).toString();
    }

    /**
     * The version-7 UUID of a millisecond time and random bits.
     *
     * @param unixMillis the Unix time in ms (48 bits used)
     * @param randA 12 random bits (the low 12 of this value)
     * @param randB 62 random bits (the low 62 of this value)
     */
    static UUID of(long unixMillis, long randA, long randB) {
        long msb = (unixMillis & 0xFFFF_FFFF_FFFFL) << 16 | 0x7000L | (randA & 0xFFF);
        long lsb = 0x8000_0000_0000_0000L | (randB & 0x3FFF_FFFF_FFFF_FFFFL);
        return new UUID(msb, lsb);
    }

    /** The time a version-7 id was made at (millisecond resolution), or null when {@code id} is not one. */
    public static Instant time(String id) {
        try {
            UUID u = UUID.fromString(id);
            return u.version() == 7 ? Instant.ofEpochMilli(u.getMostSignificantBits() >>> 16) : null;
        } catch (IllegalArgumentException e) {
            return null;
        }
    }
}
