package org.zweep.driver.transport;

import java.io.Closeable;
import java.io.IOException;
import java.io.InterruptedIOException;
import java.io.OutputStream;

/**
 * {@link Transport#of}: a timed input and an output stream as a transport; the one bookkeeping of
 * closing and of what a failed read or write means, for every stream-like link.
 */
final class TimedStreamTransport implements Transport {
    private final TimedInput in;
    private final OutputStream out;
    private final String name;
    private final Closeable onClose;
    private volatile boolean closed;

    TimedStreamTransport(TimedInput in, OutputStream out, String name, Closeable onClose) {
        this.in = in;
        this.out = out;
        this.name = name;
        this.onClose = onClose;
    }

    @Override
    public String name() {
        return name;
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        if (closed) {
            throw new ConnectionLostException(name + ": cannot write, the connection is closed");
        }
        try {
            out.write(data, offset, length);
            out.flush();
        } catch (IOException e) {
            throw new ConnectionLostException(name + ": link broke while writing: " + e.getMessage(), e);
        }
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        if (closed) {
            throw new ConnectionLostException(name + ": cannot read, the connection is closed");
        }
        int n;
        try {
            n = in.read(buffer, offset, length, timeoutMillis);
        } catch (InterruptedIOException e) {
            Thread.currentThread().interrupt();
            throw new ConnectionLostException(name + ": interrupted while reading", e);
        } catch (IOException e) {
            throw new ConnectionLostException(name + ": link broke while reading: " + e.getMessage(), e);
        }
        if (n < 0) {
            throw new ConnectionLostException(closed ? name + ": cannot read, the connection is closed"
                    : name + ": the peer closed the connection");
        }
        return n;
    }

    @Override
    public void close() {
        if (closed) {
            return;
        }
        closed = true;
        try {
            onClose.close();
        } catch (IOException e) {
            // closing is best effort: the link is being abandoned
        }
    }
}
