package org.zweep.runner.results;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.HashSet;
import java.util.Set;
import java.util.UUID;
import org.junit.jupiter.api.Test;

class RunIdTest {
    @Test
    void layoutMatchesTheRfcExampleOfAVersion7Uuid() {
        // RFC 9562, Appendix A.6 (Example of a UUIDv7 Value): Unix time 0x017F22E279B0 ms
        // (2022-02-22T19:22:22Z), rand_a 0xCC3, rand_b 0x18C4DC0C0C07398F
        UUID u = RunId.of(0x017F22E279B0L, 0xCC3L, 0x18C4DC0C0C07398FL);
        assertEquals("017f22e2-79b0-7cc3-98c4-dc0c0c07398f", u.toString());
        assertEquals(7, u.version());
        assertEquals(2, u.variant()); // the RFC variant, bits 10
        assertEquals(Instant.parse("2022-02-22T19:22:22Z"), RunId.time(u.toString()));
    }

    @Test
    void idsAreUniqueAndSortByTheTimeTheRunStarted() {
        Set<String> seen = new HashSet<>();
        Instant t = Instant.parse("2026-01-01T00:00:00Z");
        String previous = "";
        for (int i = 0; i < 1000; i++) {
            String id = RunId.next(t.plusMillis(i));
            assertTrue(seen.add(id), "duplicate " + id);
            assertTrue(id.compareTo(previous) > 0, id + " sorts before " + previous);
            assertEquals(t.plusMillis(i), RunId.time(id));
            previous = id;
        }
        assertNotEquals(RunId.next(t), RunId.next(t), "ids made at the same millisecond differ");
    }

    @Test
    void timeOfSomethingElseIsUnknown() {
        assertNull(RunId.time("not-an-id"));
        assertNull(RunId.time(UUID.nameUUIDFromBytes(new byte[] {1}).toString()));
    }
}
