package org.zweep.simulator.scpi;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/** Cutting the input stream into program messages. */
class MessageFramerTest {

    private static MessageFramer framer(byte[] input, int max) {
        return new MessageFramer(new ByteArrayInputStream(input), max);
    }

    private static String text(MessageFramer.Message m) {
        return new String(m.bytes(), StandardCharsets.ISO_8859_1);
    }

    @Test
    void lfEndsAMessageAndCrBeforeItStaysAsWhiteSpace() throws IOException {
        // IEEE 488.2 §7.5: NL is the terminator on a raw socket; CR is white space (§7.4.1.2)
        MessageFramer f = framer("*IDN?\nFREQ?\r\n".getBytes(StandardCharsets.US_ASCII), 100);
        assertEquals("*IDN?", text(f.next()));
        assertEquals("FREQ?\r", text(f.next()));
        assertNull(f.next());
    }

    @Test
    void saysWhetherMoreInputIsAlreadyBufferedAfterAMessage() throws IOException {
        MessageFramer f = framer("*IDN?\n*OPC?\n".getBytes(StandardCharsets.US_ASCII), 100);
        assertEquals("*IDN?", text(f.next()));
        assertTrue(f.buffered(), "the next message is already read in");
        assertEquals("*OPC?", text(f.next()));
        assertFalse(f.buffered());
    }

    @Test
    void saysWhetherTheNextMessageCanBeCutWithoutWaitingForInput() throws IOException {
        // every prefix of messages with quotes, definite-length blocks (LF as data), a lone '#' and
        // an overrun: next() returns without reading exactly when messageBuffered() said so
        String[] rest = {"*IDN?\n", "SIM:DEV \"a\nb\"\n", "SIM:DEV #14a\nbc\n", "FREQ #\n", "X'\n'\n",
            "ABCDEFGHIJKLMNOPQRSTUVWXYZ\n", "#0\n", "#213\n\n\n\n\n\n\n\n\n\n\n\n\n\n"};
        for (String r : rest) {
            byte[] all = ("X\n" + r).getBytes(StandardCharsets.ISO_8859_1);
            for (int k = 2; k <= all.length; k++) {
                byte[] prefix = java.util.Arrays.copyOf(all, k);
                java.io.InputStream once = new java.io.InputStream() {
                    boolean given;

                    @Override
                    public int read() {
                        throw new UnsupportedOperationException();
                    }

                    @Override
                    public int read(byte[] b, int off, int len) throws IOException {
                        if (given) {
                            throw new java.io.InterruptedIOException("would block");
                        }
                        given = true;
                        System.arraycopy(prefix, 0, b, off, prefix.length);
                        return prefix.length;
                    }
                };
                MessageFramer f = new MessageFramer(once, 16);
                assertEquals("X", text(f.next()));
                boolean said = f.messageBuffered();
                boolean blocked = false;
                try {
                    f.next();
                } catch (java.io.InterruptedIOException e) {
                    blocked = true;
                }
                assertEquals(!said, blocked, "after " + k + " bytes of X\\n" + r.replace("\n", "\\n"));
            }
        }
    }

    @Test
    void anLfInsideADefiniteLengthBlockIsData() throws IOException {
        // IEEE 488.2 §7.7.6: a definite-length block carries any byte, LF included
        byte[] in = "SIM:DEV #15a\nb\nc\nX\n".getBytes(StandardCharsets.US_ASCII);
        MessageFramer f = framer(in, 100);
        assertEquals("SIM:DEV #15a\nb\nc", text(f.next()));
        assertEquals("X", text(f.next()));
    }

    @Test
    void aHashInsideAStringStartsNoBlock() throws IOException {
        MessageFramer f = framer("FUNC \"#19\"\nX\n".getBytes(StandardCharsets.US_ASCII), 100);
        assertEquals("FUNC \"#19\"", text(f.next()));
        assertEquals("X", text(f.next()));
    }

    @Test
    void anOverlongMessageIsSkippedToTheNextLfAndReportedAsAnOverrun() throws IOException {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.writeBytes("SOUR:FREQ 1".getBytes(StandardCharsets.US_ASCII));
        b.writeBytes(new byte[10_000]);
        b.writeBytes("\n*IDN?\n".getBytes(StandardCharsets.US_ASCII));
        MessageFramer f = framer(b.toByteArray(), 64);
        MessageFramer.Message m = f.next();
        assertTrue(m.overrun());
        assertNull(m.bytes());
        assertArrayEquals("*IDN?".getBytes(StandardCharsets.US_ASCII), f.next().bytes());
    }

    @Test
    void aPartialMessageAtEndOfStreamIsDropped() throws IOException {
        assertNull(framer("*IDN".getBytes(StandardCharsets.US_ASCII), 100).next());
    }

    @Test
    void theLineEndingAfterALoneHashEndsTheMessage() throws IOException {
        // IEEE 488.2 §7.7.6: a block starts with '#' and a non-zero digit; a '#' followed by LF is no block
        MessageFramer f = framer("*IDN? #\n*OPC?\nA #\n#3\nB\n".getBytes(StandardCharsets.US_ASCII), 100);
        assertEquals("*IDN? #", text(f.next()));
        assertEquals("*OPC?", text(f.next()));
        assertEquals("A #", text(f.next()));
        assertEquals("#3", text(f.next())); // the LF in the length digits ends the message too
        assertEquals("B", text(f.next()));
        assertNull(f.next());
    }
}
