package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CheckCommandTest {
    @TempDir
    Path dir;

    private final StringWriter out = new StringWriter();
    private final StringWriter err = new StringWriter();

    private int check(Path file) {
        return Cli.run(new String[] {"check", file.toString()}, new PrintWriter(out), new PrintWriter(err));
    }

    @Test
    void validSequencePrintsOneSummaryLineAndExitsZero() {
        Path file = Path.of("..", "sequences", "incoming-kp-c0805-104.yaml");
        assertEquals(ExitCode.OK, check(file));
        String[] lines = out.toString().split("\n");
        assertEquals(1, lines.length);
        assertTrue(lines[0].startsWith(file + ": ok, sequence 'incoming-kp-c0805-104': 2 steps, 66 points, 3 checks, about "),
                lines[0]); // 55 frequencies (100 Hz..20 MHz, 10/decade, stop appended) + 11 bias values
        assertEquals("", err.toString());
    }

    @Test
    void invalidSequencePrintsOneErrorLineWithPositionAndExitsTwo() throws IOException {
        Files.writeString(dir.resolve("b.bench.yaml"), "# placeholder\n");
        Path file = dir.resolve("bad.yaml");
        Files.writeString(file, """
                format: zweep-sequence/1
                meter: {bench: b.bench.yaml}
                safety: {}
                part: {kind: capacitor, nominal: 1 nF}
                steps: [{name: s, frequency: 1 kHz, levl: 1 V}]
                """);
        assertEquals(ExitCode.USAGE, check(file));
        assertEquals("", out.toString());
        assertEquals("zweep: " + file + ":5:37: unknown key 'levl' in step 's' (did you mean 'level'?); expected one of: "
                + "name, prompt, quantity, wiring, frequency, level, bias, order, averaging, integration, repeats, "
                + "delay, range, derating\n", err.toString().replace(System.lineSeparator(), "\n"));
    }

    @Test
    void missingFileIsAUsageError() {
        Path file = dir.resolve("nowhere.yaml");
        assertEquals(ExitCode.USAGE, check(file));
        assertEquals("zweep: " + file + ": cannot read: no such file\n", err.toString().replace(System.lineSeparator(), "\n"));
    }
}
