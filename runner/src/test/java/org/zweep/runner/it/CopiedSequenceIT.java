package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A shipped sequence copied away from its bench file (a new user's first step): {@code run},
 * {@code check} and {@code lot} with {@code --meter} never look at the sequence's own address;
 * without {@code --meter} each refuses it in one line at the address's {@code file:line:column},
 * suggesting {@code --meter}, with exit code 2. The real {@code zweep} process.
 */
class CopiedSequenceIT {
    @TempDir
    Path dir;

    private record Ran(int code, String output) {
    }

    private Ran zweep(String... args) throws Exception {
        Path log = Files.createTempFile(dir, "zweep", ".log");
        Process p = Children.zweep(log, args);
        assertTrue(p.waitFor(120, TimeUnit.SECONDS), "zweep did not end: " + String.join(" ", args));
        return new Ran(p.exitValue(), Files.readString(log));
    }

    @Test
    void copiedSequenceRunsChecksAndLotsWithMeterAndIsRefusedAtItsBenchKeyWithout() throws Exception {
        Path shipped = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");
        Path copy = Files.createDirectories(dir.resolve("elsewhere")).resolve(shipped.getFileName());
        Files.copy(shipped, copy);
        String meter = "sim:" + Sims.benchOf(shipped) + "?timing=none";

        Ran run = zweep("run", copy.toString(), "--meter", meter, "--out", dir.resolve("r1").toString(), "--quiet",
                "--no-index");
        assertEquals(0, run.code(), run.output());
        assertTrue(run.output().contains("points: 66 of 66 measured (completed)"), run.output());

        Ran check = zweep("check", copy.toString(), "--meter", meter);
        assertEquals(0, check.code(), check.output());

        Ran lot = zweep("lot", copy.toString(), "--lot", "L1", "--count", "1", "--meter", meter, "--out",
                dir.resolve("lot").toString(), "--no-index");
        assertEquals(0, lot.code(), lot.output());

        // the shipped file's line 20, column 10: `  bench: benches/kp-c0805-104.bench.yaml`
        String refusal = "zweep: " + copy + ":20:10: bench file not found: benches/kp-c0805-104.bench.yaml (looked for "
                + copy.getParent().resolve("benches/kp-c0805-104.bench.yaml") + "); put it there, or give the meter"
                + " with --meter ADDRESS\n";
        Ran bare = zweep("run", copy.toString(), "--out", dir.resolve("r2").toString(), "--no-index");
        assertEquals(2, bare.code(), bare.output());
        assertEquals(refusal, bare.output());
        assertFalse(Files.exists(dir.resolve("r2")), "a refused run leaves no folder");
        Ran bareCheck = zweep("check", copy.toString());
        assertEquals(2, bareCheck.code(), bareCheck.output());
        assertEquals(refusal, bareCheck.output());
        Ran bareLot = zweep("lot", copy.toString(), "--lot", "L2", "--count", "1", "--out",
                dir.resolve("lot2").toString(), "--no-index");
        assertEquals(2, bareLot.code(), bareLot.output());
        assertEquals(refusal, bareLot.output());
    }
}
