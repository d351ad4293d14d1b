package org.zweep.driver.transport;

import java.io.Closeable;
import java.io.IOException;
import java.io.InputStream;
import java.io.InterruptedIOException;
import java.util.Arrays;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.TimeUnit;

/** The input of {@link Transport#ofStreams}: a pump thread turns a blocking stream into timed reads. */
final class PumpedInput implements TimedInput, Closeable {
    private static final byte[] END = new byte[0];

    private final InputStream in;
    private final BlockingQueue<byte[]> chunks = new ArrayBlockingQueue<>(256);
    private final Thread pump;
    private volatile IOException failure;
    private byte[] current = new byte[0];
    private int currentPos;
    private boolean ended;

    PumpedInput(InputStream in, String name) {
        this.in = in;
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
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) throws IOException {
        if (currentPos == current.length) {
            if (ended) {
                return end();
            }
            byte[] next;
            try {
                next = chunks.poll(timeoutMillis, TimeUnit.MILLISECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new InterruptedIOException("interrupted while reading");
            }
            if (next == null) {
                return 0;
            }
            if (next == END) {
                ended = true;
                return end();
            }
            current = next;
            currentPos = 0;
        }
        int n = Math.min(length, current.length - currentPos);
        System.arraycopy(current, currentPos, buffer, offset, n);
        currentPos += n;
        return n;
    }

    /** The end of the stream: -1, or the failure that ended it. */
    private int end() throws IOException {
        IOException f = failure;
        if (f != null) {
            throw f;
        }
        return -1;
    }

    @Override
    public void close() {
        try {
            in.close();
        } catch (IOException e) {
            // closing is best effort: the link is being abandoned
        }
        pump.interrupt();
    }
}
