package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Issue 17, item 2: hostile sequence, bench and netlist files gave stack traces, an integer
 * overflow or ran out of memory. Each is now one line naming the file (and line:column where
 * there is one) and the limit, with exit 2. The timeout only catches a hang; the figures are in
 * README, section "Limits on input files".
 */
class HostileInputTest {
    private static final Duration HANG = Duration.ofSeconds(20);

    @TempDir
    Path dir;

    private final StringWriter out = new StringWriter();
    private final StringWriter err = new StringWriter();

    private int zweep(String... args) {
        return assertTimeoutPreemptively(HANG, () -> Cli.run(args, new PrintWriter(out), new PrintWriter(err)));
    }

    /** The one line on stderr, checked to be one line without a stack trace. */
    private String oneLine() {
        String e = err.toString().replace(System.lineSeparator(), "\n");
        assertTrue(e.endsWith("\n") && e.indexOf('\n') == e.length() - 1, "one line: " + e);
        assertTrue(!e.contains("Exception") && !e.contains("Error:") && !e.contains("\tat "), e);
        return e.strip();
    }

    private static String nested(int levels) {
        StringBuilder b = new StringBuilder("format: zweep-sequence/1\ndescription:\n");
        for (int i = 0; i < levels; i++) {
            b.append("- ");
        }
        return b.append("x\n").toString();
    }

    @Test
    void aSequenceNestedFiveThousandLevelsDeepIsRefusedAtTheLevelPastTheLimitNotWithAStackOverflow() throws IOException {
        Path file = dir.resolve("deep.yaml");
        Files.writeString(file, nested(5000));
        assertEquals(ExitCode.USAGE, zweep("check", file.toString()));
        // the top mapping is level 1, so the 64th "- " (line 3, column 1 + 2 * 63) is level 65
        assertEquals("zweep: " + file + ":3:127: nested deeper than 64 levels (the limit)", oneLine());
    }

    @Test
    void aSequenceFileLargerThanTheLimitIsRefusedNamingIt() throws IOException {
        Path file = dir.resolve("long.yaml");
        Files.writeString(file, "format: zweep-sequence/1\ndescription: " + "x".repeat(8 << 20) + "\n");
        assertEquals(ExitCode.USAGE, zweep("check", file.toString()));
        assertEquals("zweep: " + file + ": larger than 262144 bytes, the limit for a sequence file", oneLine());
    }

    @Test
    void devZeroAsASequenceFileIsRefusedAfterReadingTheLimitOnly() {
        assertEquals(ExitCode.USAGE, zweep("check", "/dev/zero"));
        assertEquals("zweep: /dev/zero: larger than 262144 bytes, the limit for a sequence file", oneLine());
    }

    @Test
    void aBillionLaughsOfAliasesIsRefusedAtTheAliasPastTheLimit() throws IOException {
        StringBuilder b = new StringBuilder("a0: &a0 [x, x, x, x, x, x, x, x, x]\n");
        for (int i = 1; i < 10; i++) {
            b.append("a").append(i).append(": &a").append(i).append(" [");
            for (int k = 0; k < 9; k++) {
                b.append(k > 0 ? ", " : "").append("*a").append(i - 1);
            }
            b.append("]\n");
        }
        Path file = dir.resolve("laughs.yaml");
        Files.writeString(file, b.toString());
        assertEquals(ExitCode.USAGE, zweep("check", file.toString()));
        // the 65th alias: 7 full lines of 9 (lines 2-8), then the 2nd on line 9 at column 15
        assertEquals("zweep: " + file + ":9:15: more than 64 aliases (the limit)", oneLine());
    }

    @Test
    void aSecondDocumentIsRefusedWhereItStarts() throws IOException {
        Path file = dir.resolve("two.yaml");
        Files.writeString(file, "format: zweep-sequence/1\n---\nformat: zweep-sequence/1\n");
        assertEquals(ExitCode.USAGE, zweep("check", file.toString()));
        assertEquals("zweep: " + file + ":2:1: expected one YAML document, found another", oneLine());
    }

    @Test
    void aBenchNestedFiveThousandLevelsDeepIsRefusedNotWithAStackOverflow() throws IOException {
        Path file = dir.resolve("deep.bench.yaml");
        Files.writeString(file, nested(5000).replace("format: zweep-sequence/1\n", ""));
        assertEquals(ExitCode.USAGE, zweep("sim", "--port", "0", "--bench", file.toString()));
        assertEquals("zweep: " + file + ":2:127: nested deeper than 64 levels (the limit)", oneLine());
    }

    @Test
    void aBenchWhoseNetlistFileIsDevZeroIsRefusedNotWithOutOfMemory() throws IOException {
        Path file = dir.resolve("zero.bench.yaml");
        Files.writeString(file, "device:\n  netlist_file: /dev/zero\n");
        assertEquals(ExitCode.USAGE, zweep("sim", "--port", "0", "--bench", file.toString()));
        assertEquals("zweep: " + file + ":2:17: /dev/zero: larger than 1048576 bytes, the limit for a netlist file",
                oneLine());
    }

    private static String chain(int resistors) {
        StringBuilder b = new StringBuilder();
        for (int i = 1; i <= resistors; i++) {
            b.append('R').append(i).append(' ').append(i == 1 ? "hi" : "n" + (i - 1)).append(' ')
                    .append(i == resistors ? "lo" : "n" + i).append(" 1\n");
        }
        return b.toString();
    }

    @Test
    void aTwentyThousandResistorChainFileIsRefusedAtTheElementPastTheLimitNotWithOutOfMemory() throws IOException {
        Path file = dir.resolve("chain.cir");
        Files.writeString(file, chain(20_000));
        assertEquals(ExitCode.USAGE, zweep("sim", "--port", "0", "--device", file.toString()));
        assertEquals("zweep: " + file + ":201:1: more than 200 elements (the limit)", oneLine());
    }

    @Test
    void aSixtyThousandResistorChainInlineIsRefusedNotWithAnIntegerOverflow() {
        String inline = chain(60_000).replace("\n", "\\n");
        assertEquals(ExitCode.USAGE, zweep("sim", "--port", "0", "--device", inline));
        assertEquals("zweep: --device: the netlist is longer than 1048576 characters (the limit)", oneLine());
    }

    @Test
    void aNetlistWithMoreNodesThanTheLimitIsRefusedAtTheFirstNodePastIt() throws IOException {
        Path file = dir.resolve("nodes.cir");
        Files.writeString(file, chain(200)); // 200 elements, 201 nodes: hi, n1..n199, lo
        assertEquals(ExitCode.USAGE, zweep("sim", "--port", "0", "--device", file.toString()));
        assertEquals("zweep: " + file + ":200:11: more than 200 nodes (the limit)", oneLine());
    }

    @Test
    void aYamlErrorThatQuotesALineEndStaysOnOneLine() throws IOException {
        // found by InputFuzzIT: the parser quotes the unexpected character as it is, here a line end
        Path file = dir.resolve("directive.yaml");
        Files.writeString(file, "%\nformat: zweep-sequence/1\n");
        assertEquals(ExitCode.USAGE, zweep("check", file.toString()));
        assertTrue(oneLine().startsWith("zweep: " + file + ":1:2: YAML syntax: expected alphabetic or numeric character, "
                + "but found \\n(10)"), err.toString());
    }

    @Test
    void aBenchDirThatIsNotAFolderIsRefusedBeforeTheServerStarts() throws IOException {
        Path file = Files.writeString(dir.resolve("not-a-folder"), "x");
        assertEquals(ExitCode.USAGE, zweep("sim", "--port", "0", "--bench-dir", file.toString()));
        assertEquals("zweep: --bench-dir: " + file + " is not a folder", oneLine());
    }
}
