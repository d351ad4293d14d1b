package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The real {@code zweep} process given a mistyped option (a new user's {@code --tmeout}, and a
 * mistyped required option, which picocli would report as missing): one line with the option it
 * is near, exit 2, no stack trace, nothing measured.
 */
class MistypedOptionIT {
    @TempDir
    Path dir;

    private String zweep(int expectedCode, String... args) throws Exception {
        Path log = Files.createTempFile(dir, "zweep", ".log");
        Process p = Children.zweep(log, args);
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "zweep did not end");
        String output = Files.readString(log);
        assertEquals(expectedCode, p.exitValue(), output);
        return output;
    }

    @Test
    void mistypedOptionsAreOneLineWithTheNearOptionAndExitTwo() throws Exception {
        Path seq = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");
        Path out = dir.resolve("run");
        assertEquals("zweep: unknown option '--tmeout' (did you mean --timeout?); see 'zweep run --help'\n",
                zweep(2, "run", "--tmeout", "3s", seq.toString(), "--out", out.toString(), "--no-index"));
        assertTrue(Files.notExists(out), "nothing was started");
        assertEquals("zweep: unknown option '--frequncy' (did you mean --frequency?); see 'zweep measure --help'\n",
                zweep(2, "measure", "--frequncy", "1k", "sim:x.bench.yaml"));
    }
}
