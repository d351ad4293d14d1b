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

    private int check(Path file, String dialect) {
        return Cli.run(new String[] {"check", file.toString(), "--dialect", dialect}, new PrintWriter(out),
                new PrintWriter(err));
    }

    @Test
    void validSequencePrintsASummaryLineThenTheEstimatePerStepAndInTotal() {
        Path file = Path.of("..", "sequences", "incoming-kp-c0805-104.yaml");
        assertEquals(ExitCode.OK, check(file));
        String[] lines = out.toString().split("\n");
        assertEquals(6, lines.length, out.toString());
        assertTrue(lines[1].startsWith("  start (connect, identify, reset)"), lines[1]);
        assertTrue(lines[2].startsWith("  compensation (host, 2 standards)"), lines[2]);
        assertTrue(lines[3].startsWith("  step frequency-sweep, 55 points"), lines[3]);
        assertTrue(lines[4].startsWith("  step bias-derating, 11 points"), lines[4]);
        assertTrue(lines[5].startsWith("  total") && lines[5].contains("(dialect standard;"), lines[5]);
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
    void aSweepBeyondTheDialectsMaximumFrequencyIsRefusedAtTheStepsFrequency() throws IOException {
        // issue 9: check said ok for a 10 MHz sweep on a meter whose dialect declares a 5 MHz maximum
        Files.writeString(dir.resolve("b.bench.yaml"), "# placeholder\n");
        Files.writeString(dir.resolve("five.yaml"), Files.readString(Path.of("..", "driver", "src", "main",
                "resources", "org", "zweep", "driver", "dialect", "standard.yaml"))
                .replace("  frequency: 10 .. 20e6 Hz", "  frequency: 10 .. 5e6 Hz")
                .replace("  name: standard", "  name: five"));
        Path file = dir.resolve("wide.yaml");
        Files.writeString(file, """
                format: zweep-sequence/1
                meter: {bench: b.bench.yaml, dialect: five.yaml}
                safety: {max_level_voltage: 1 V}
                part: {kind: capacitor, nominal: 1 nF}
                steps:
                  - name: sweep
                    frequency: [1 kHz, 1 MHz, 10 MHz]
                    level: 0.5 V
                """);
        assertEquals(ExitCode.USAGE, check(file));
        assertEquals("", out.toString());
        assertEquals("zweep: " + file + ":7:16: step 'sweep': frequency 10 MHz is above the maximum 5 MHz"
                + " of the meter (dialect five)\n", err.toString().replace(System.lineSeparator(), "\n"));
    }

    @Test
    void aDialectGivenOnTheCommandLineIsCheckedInstead() {
        // mz300 declares no current bias: the inductor's bias-current step cannot run on it
        Path file = Path.of("..", "sequences", "characterise-kp-l1210-100.yaml");
        assertEquals(ExitCode.USAGE, check(file, "mz300"));
        String e = err.toString();
        assertTrue(e.startsWith("zweep: " + file + ":"), e);
        assertTrue(e.contains("step 'frequency-sweep': frequency 2.51189 MHz is above the maximum 2 MHz"
                + " of the meter (dialect mz300)"), e); // the first point of 1 kHz..10 MHz, 10 per decade, above 2 MHz
        assertEquals("", out.toString());
    }

    @Test
    void missingFileIsAUsageError() {
        Path file = dir.resolve("nowhere.yaml");
        assertEquals(ExitCode.USAGE, check(file));
        assertEquals("zweep: " + file + ": cannot read: no such file\n", err.toString().replace(System.lineSeparator(), "\n"));
    }
}
