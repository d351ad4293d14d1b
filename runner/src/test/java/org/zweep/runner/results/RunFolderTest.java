package org.zweep.runner.results;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.ZoneOffset;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.InvalidInputException;

class RunFolderTest {
    @TempDir
    Path dir;

    @Test
    void freshFolderIsNamedAfterSequenceAndTimeAndHoldsTheCopy() throws Exception {
        Path seq = dir.resolve("s.yaml");
        Files.writeString(seq, "abc");
        Instant t = Instant.parse("2024-05-01T10:02:03Z");
        RunFolder a = RunFolder.createUnder(dir.resolve("results"), "incoming kp", t, ZoneOffset.UTC, seq);
        RunFolder b = RunFolder.createUnder(dir.resolve("results"), "incoming kp", t, ZoneOffset.UTC, seq);
        assertEquals("incoming-kp-20240501-100203", a.dir().getFileName().toString());
        assertEquals("incoming-kp-20240501-100203-2", b.dir().getFileName().toString());
        assertEquals("abc", Files.readString(a.sequenceCopy()));
    }

    @Test
    void sha256OfAbcIsTheFips180Value() throws Exception {
        Path f = dir.resolve("abc");
        Files.writeString(f, "abc");
        // FIPS 180-2, Appendix B.1: SHA-256("abc")
        assertEquals("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", RunFolder.sha256(f));
    }

    @Test
    void outFolderThatIsNotEmptyIsRefused() throws Exception {
        Path seq = dir.resolve("s.yaml");
        Files.writeString(seq, "abc");
        Path out = dir.resolve("out");
        Files.createDirectories(out);
        Files.writeString(out.resolve("x"), "");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> RunFolder.createAt(out, seq));
        assertTrue(e.getMessage().contains("not empty"), e.getMessage());
    }

    @Test
    void resumeNeedsManifestAndSequenceCopy() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> RunFolder.existing(dir));
        assertTrue(e.getMessage().contains("no run.json"), e.getMessage());
    }
}
