package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code zweep lot}'s refusals: one line each, exit 2, nothing measured and no lot folder left. */
class LotCommandTest {
    static final Path SEQ = Path.of("..", "sequences", "incoming-kp-c0805-104.yaml").toAbsolutePath().normalize();

    @TempDir
    Path dir;

    record Result(int code, String out, String err) {
    }

    static Result zweep(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Cli.run(args, new PrintWriter(out), new PrintWriter(err));
        return new Result(code, out.toString(), err.toString());
    }

    @Test
    void aLotNeedsItsNameAndWhereItsPartsComeFrom() {
        Result r = zweep("lot", SEQ.toString(), "--count", "3", "--out", dir.resolve("l").toString());
        assertEquals(2, r.code());
        assertEquals("zweep: --lot LOT is needed: the lot's name\n", r.err());
        r = zweep("lot", SEQ.toString(), "--lot", "L", "--out", dir.resolve("l").toString());
        assertEquals(2, r.code());
        assertEquals("zweep: say which parts: --count N, --serials FILE or --scan\n", r.err());
        r = zweep("lot", SEQ.toString(), "--lot", "L", "--count", "3", "--scan");
        assertEquals(2, r.code(), "--count and --scan exclude each other");
        assertEquals("zweep: --count=N, --scan are mutually exclusive (specify only one); see 'zweep lot --help'\n",
                r.err());
        assertFalse(Files.exists(dir.resolve("l")));
    }

    @Test
    void aRepeatedSerialIsRefusedWithItsLine() throws Exception {
        Path serials = dir.resolve("serials.txt");
        Files.writeString(serials, "# lot L9\nA-1\n\nA-2\nA-1\n");
        Result r = zweep("lot", SEQ.toString(), "--lot", "L9", "--serials", serials.toString(), "--out",
                dir.resolve("l").toString());
        assertEquals(2, r.code());
        assertEquals("zweep: " + serials + ":5:1: serial 'A-1' is given twice (first on line 2)\n", r.err());
        assertFalse(Files.exists(dir.resolve("l")));
    }

    @Test
    void scanningNeedsSomeoneToScan() {
        Result r = zweep("lot", SEQ.toString(), "--lot", "L", "--scan", "--fixture", "meter", "--out",
                dir.resolve("l").toString());
        assertEquals(2, r.code());
        assertTrue(r.err().startsWith("zweep: --scan needs someone to type or scan each serial"), r.err());
    }

    @Test
    void resumeTakesOnlyTheFolder() {
        Result r = zweep("lot", "--resume", dir.toString(), "--lot", "X");
        assertEquals(2, r.code());
        assertTrue(r.err().contains("--resume takes only the lot folder"), r.err());
        r = zweep("lot", "--resume", dir.toString());
        assertEquals(2, r.code());
        assertEquals("zweep: " + dir + ": not a lot folder (no lot.json)\n", r.err());
    }
}
