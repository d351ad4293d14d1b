package org.zweep.driver.transport;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.util.Arrays;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.TimeUnit;

/** {@link Transport#ofStreams}: a pump thread turns a blocking stream into timed reads. */
final class StreamTransport implements Transport {
    private static final byte[] END = new byte[0];

    private final InputStream in;
    private final OutputStream out;
    private final String name;
    private final BlockingQueue<byte[]> chunks = new ArrayBlockingQueue<>(256);
    private final Thread pump;
    private volatile boolean closed;
    private volatile IOException failure;
    private byte[] current = new byte[0];
    private int currentPos;
    private boolean ended;

    StreamTransport(InputStream in, OutputStream out, String name) {
        this.in = in;
        this.out = out;
        this.name = name;
        this.pump = new Thread(this::pump, "zweep-stream-transport " + name);
        pump.setDaemon(true);
        pump.start();
    }

    private void pump() {
        byte[] buf = new byte[8192];
        try {
            int n;
            while ((n = in.read(buf)) >= 0) {
                if (n > 0) {
                    chunks.put(Arrays.copyOf(buf, n));
                }
            }
            chunks.put(END);
        } catch (IOException e) {
            failure = e;
            endQuietly();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /** Queues the end behind the data still unread; gives up only when closed (close interrupts). */
    private void endQuietly() {
        try {
            chunks.put(END);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
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
        if (currentPos == current.length) {
            if (ended) {
                throw lost();
            }
            byte[] next;
            try {
                next = chunks.poll(timeoutMillis, TimeUnit.MILLISECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new ConnectionLostException(name + ": interrupted while reading", e);
            }
            if (next == null) {
                return 0;
            }
            if (next == END) {
                ended = true;
                throw lost();
            }
            current = next;
            currentPos = 0;
        }
        int n = Math.min(length, current.length - currentPos);
        System.arraycopy(current, currentPos, buffer, offset, n);
        currentPos += n;
        return n;
    }

    private ConnectionLostException lost() {
        IOException f = failure;
        return closed ? new ConnectionLostException(name + ": cannot read, the connection is closed")
                : new ConnectionLostException(name + ": the peer closed the connection"
                        + (f == null ? "" : " (" + f.getMessage() + ")"), f);
    }

    @Override
    public void close() {
        if (closed) {
            return;
        }
        closed = true;
        try {
            out.close();
        } catch (IOException e) {
            // closing is best effort: the link is being abandoned
        }
        try {
            in.close();
        } catch (IOException e) {
            // as above
        }
        pump.interrupt();
    }
}
