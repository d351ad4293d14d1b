package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.PrintWriter;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

class ScpiCommandIT extends TinyMeterCliBase {

    @Test
    void sendsEachCommandInOrderAndPrintsEachReplyOnItsOwnLine() {
        int code = zweep("scpi", meter.address(), "*IDN?", "FREQ 2.5E+03", "FREQ?");
        assertEquals(0, code, err.toString());
        assertEquals(TinyMeter.IDN + "\n2.5E+03\n", out.toString().replace("\r\n", "\n"));
        assertEquals(List.of("*CLS", "*IDN?", "FREQ 2.5E+03", "FREQ?"), meter.received);
    }

    @Test
    void duplicatedReplyIsDiscardedAndDoesNotShiftTheLaterAnswers() {
        int code = zweep("scpi", meter.address(), "TWICE?", "FREQ?", "*IDN?");
        assertEquals(0, code, err.toString());
        assertEquals("twice\n1.000000E+03\n" + TinyMeter.IDN + "\n", out.toString().replace("\r\n", "\n"));
        assertEquals("zweep: discarded a reply no query asked for ('twice\\n') before 'FREQ?'; resynchronised with"
                + " the meter\n", err.toString().replace("\r\n", "\n"));
        assertEquals(List.of("*CLS", "TWICE?", "*OPC?", "FREQ?", "*IDN?"), meter.received);
    }

    @Test
    void binaryBlockRepliesArePrintedEscapedOnOneLine() {
        assertEquals(0, zweep("scpi", meter.address(), "DATA?"), err.toString());
        assertEquals("#14a\\n\\x01b\n", out.toString().replace("\r\n", "\n"));
    }

    @Test
    void readsCommandsFromStandardInputWhenItIsNotATerminal() {
        CommandLine cl = new CommandLine(new ScpiCommand(new ByteArrayInputStream(
                "FREQ 1E6\n\nFREQ?\n".getBytes(StandardCharsets.UTF_8))));
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        assertEquals(0, cl.execute(meter.address()), err.toString());
        assertEquals("1E6\n", out.toString().replace("\r\n", "\n"));
    }

    @Test
    void timeoutIsExitThreeWithOneLine() {
        int code = zweep("scpi", meter.address(), "--timeout", "200ms", "HANG?");
        assertEquals(3, code);
        String e = err.toString().strip();
        assertTrue(e.startsWith("zweep: command 1: no reply to 'HANG?' within 200 ms"), e);
        assertEquals(1, e.lines().count(), e);
    }

    @Test
    void pipedCommandsGoOnPastAnUnansweredQueryAndReportTheMetersErrorQueue() {
        // the simulator answers an unknown header with nothing and queues -113 (SCPI-1999 Vol. 2, 21.8.9)
        CommandLine cl = new CommandLine(new ScpiCommand(new ByteArrayInputStream(
                "*IDN?\nBOGUS:HEADer?\n*IDN?\n".getBytes(StandardCharsets.UTF_8))));
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int code = cl.execute("--timeout", "300ms", "sim:");
        assertEquals(3, code, "exit code says something failed; stderr: " + err);
        List<String> replies = out.toString().lines().toList();
        assertEquals(2, replies.size(), out.toString());
        assertTrue(replies.get(0).contains("Korvane") && replies.get(0).equals(replies.get(1)), out.toString());
        String e = err.toString().strip();
        assertEquals(1, e.lines().count(), e);
        assertTrue(e.startsWith("zweep: line 2: no reply to 'BOGUS:HEADer?' within 300 ms; the meter's error queue: -113"),
                e);
    }

    @Test
    void refusedConnectionIsExitThreeWithOneLine() throws Exception {
        int port;
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            port = s.getLocalPort();
        }
        assertEquals(3, zweep("scpi", "tcp://127.0.0.1:" + port, "*IDN?"));
        String e = err.toString().strip();
        assertTrue(e.contains("connection refused"), e);
        assertEquals(1, e.lines().count(), e);
    }

    @Test
    void badAddressIsExitTwoNamingThePart() {
        assertEquals(2, zweep("scpi", "tcp://meter:99999", "*IDN?"));
        assertTrue(err.toString().contains("port '99999'"), err.toString());
    }

    @Test
    void badTimeoutIsExitTwo() {
        assertEquals(2, zweep("scpi", meter.address(), "--timeout", "2h", "*IDN?"));
        assertTrue(err.toString().contains("'2h' is not a duration"), err.toString());
    }

    @Test
    void traceFileRecordsTheConversation(@TempDir Path dir) throws Exception {
        Path trace = dir.resolve("t.log");
        assertEquals(0, zweep("scpi", meter.address(), "--trace", trace.toString(), "*IDN?"), err.toString());
        String log = Files.readString(trace);
        assertTrue(log.contains(" > *IDN?\\n") && log.contains(" < " + TinyMeter.IDN + "\\n"), log);
    }
}
