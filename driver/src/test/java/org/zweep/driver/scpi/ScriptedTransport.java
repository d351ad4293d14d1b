package org.zweep.driver.scpi;

import java.nio.charset.StandardCharsets;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Deque;
import java.util.List;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.Transport;

/**
 * An in-memory transport for unit tests: what the meter "sends" is a queue of chunks and events
 * given in advance; every write is recorded. A read with nothing queued (or at a {@link #stall()})
 * returns 0 at once, as a real transport would after its timeout, so tests never sleep.
 */
final class ScriptedTransport implements Transport {
    private static final byte[] STALL = new byte[0];
    private static final byte[] END = new byte[0];

    private final Deque<byte[]> incoming = new ArrayDeque<>();
    private final List<String> written = new ArrayList<>();
    private byte[] current = new byte[0];
    private int currentPos;
    private boolean closed;

    /** Queues text as one chunk (a terminator is not added). */
    ScriptedTransport send(String text) {
        return sendBytes(text.getBytes(StandardCharsets.ISO_8859_1));
    }

    /** Queues bytes as one chunk. */
    ScriptedTransport sendBytes(byte[] bytes) {
        incoming.add(bytes.clone());
        return this;
    }

    /** Queues bytes cut into chunks of {@code size}. */
    ScriptedTransport sendInChunks(byte[] bytes, int size) {
        for (int i = 0; i < bytes.length; i += size) {
            incoming.add(Arrays.copyOfRange(bytes, i, Math.min(bytes.length, i + size)));
        }
        return this;
    }

    /** Queues one read that times out. */
    ScriptedTransport stall() {
        incoming.add(STALL);
        return this;
    }

    /** Queues the peer closing the link. */
    ScriptedTransport end() {
        incoming.add(END);
        return this;
    }

    /** Every message written so far, decoded, terminators included. */
    List<String> written() {
        return written;
    }

    boolean closed() {
        return closed;
    }

    @Override
    public String name() {
        return "test:scripted";
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        written.add(new String(data, offset, length, StandardCharsets.ISO_8859_1));
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        if (currentPos == current.length) {
            byte[] next = incoming.poll();
            if (next == null || next == STALL) {
                return 0;
            }
            if (next == END) {
                throw new ConnectionLostException(name() + ": the meter closed the connection");
            }
            current = next;
            currentPos = 0;
        }
        int n = Math.min(length, current.length - currentPos);
        System.arraycopy(current, currentPos, buffer, offset, n);
        currentPos += n;
        return n;
    }

    @Override
    public void close() {
        closed = true;
    }
}
