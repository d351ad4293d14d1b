package org.zweep.simulator.server;

import java.io.IOException;
import java.io.InputStream;
import java.io.InterruptedIOException;
import java.io.OutputStream;
import java.net.SocketTimeoutException;
import java.util.concurrent.TimeUnit;
import java.util.function.BooleanSupplier;
import java.util.concurrent.locks.Condition;
import java.util.concurrent.locks.ReentrantLock;

/**
 * A bounded one-way byte pipe between threads, unlike {@code PipedInputStream} not tied to the
 * liveness of the threads that use it. Writing blocks while the pipe is full; reading blocks
 * while it is empty, up to an optional timeout. Closing either end ends the pipe: the reader
 * drains what is left and then sees end of stream, a writer gets an {@link IOException}.
 */
final class BytePipe {
    private static final long POLL_NANOS = TimeUnit.MILLISECONDS.toNanos(20);

    private final ReentrantLock lock = new ReentrantLock();
    private final Condition changed = lock.newCondition();
    private final byte[] ring;
    private int head;
    private int size;
    private boolean closed;
    private boolean readerWaiting;
    private volatile int readTimeoutMillis;
    private volatile BooleanSupplier onBlockedRead = () -> true;

    BytePipe(int capacity) {
        ring = new byte[capacity];
    }

    final InputStream input = new InputStream() {
        @Override
        public int read() throws IOException {
            byte[] one = new byte[1];
            int n = read(one, 0, 1);
            return n < 0 ? -1 : one[0] & 0xFF;
        }

        @Override
        public int read(byte[] b, int off, int len) throws IOException {
            return BytePipe.this.read(b, off, len);
        }

        @Override
        public int available() {
            lock.lock();
            try {
                return size;
            } finally {
                lock.unlock();
            }
        }

        @Override
        public void close() {
            BytePipe.this.close();
        }
    };

    final OutputStream output = new OutputStream() {
        @Override
        public void write(int b) throws IOException {
            write(new byte[] {(byte) b}, 0, 1);
        }

        @Override
        public void write(byte[] b, int off, int len) throws IOException {
            BytePipe.this.write(b, off, len);
        }

        @Override
        public void close() {
            BytePipe.this.close();
        }
    };

    /** The read timeout in milliseconds; 0 waits for ever. */
    void setReadTimeoutMillis(int ms) {
        readTimeoutMillis = ms;
    }

    /**
     * Called (without the pipe's lock) while a read waits on an empty pipe, about every 20 ms,
     * until it returns {@code true} for that read.
     */
    void setOnBlockedRead(BooleanSupplier r) {
        onBlockedRead = r;
    }

    /** Whether a reader is waiting on an empty pipe. */
    boolean readerWaitingOnEmpty() {
        lock.lock();
        try {
            return readerWaiting && size == 0;
        } finally {
            lock.unlock();
        }
    }

    boolean isEmpty() {
        lock.lock();
        try {
            return size == 0;
        } finally {
            lock.unlock();
        }
    }

    private int read(byte[] b, int off, int len) throws IOException {
        int n = read(b, off, len, readTimeoutMillis);
        if (n == TIMED_OUT) {
            throw new SocketTimeoutException("read timed out after " + readTimeoutMillis + " ms");
        }
        return n;
    }

    /** What {@link #read(byte[], int, int, long)} returns when nothing arrived in time. */
    static final int TIMED_OUT = -2;

    /**
     * Reads at least one byte, waiting at most {@code timeout} ms (0: for ever) for the first.
     *
     * @return the number of bytes read, -1 at end of stream, or {@link #TIMED_OUT}
     */
    int read(byte[] b, int off, int len, long timeout) throws IOException {
        if (len == 0) {
            return 0;
        }
        long deadline = timeout > 0 ? System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(timeout) : 0;
        boolean reported = false;
        lock.lock();
        try {
            while (size == 0) {
                if (closed) {
                    return -1;
                }
                readerWaiting = true;
                if (!reported) {
                    lock.unlock();
                    try {
                        reported = onBlockedRead.getAsBoolean();
                    } finally {
                        lock.lock();
                    }
                    if (size > 0 || closed) {
                        continue;
                    }
                }
                long wait = POLL_NANOS;
                if (timeout > 0) {
                    long left = deadline - System.nanoTime();
                    if (left <= 0) {
                        readerWaiting = false;
                        return TIMED_OUT;
                    }
                    wait = Math.min(wait, left);
                }
                try {
                    changed.awaitNanos(wait);
                } catch (InterruptedException e) {
                    readerWaiting = false;
                    Thread.currentThread().interrupt();
                    throw new InterruptedIOException("read interrupted");
                }
            }
            readerWaiting = false;
            int n = Math.min(len, size);
            for (int i = 0; i < n; i++) {
                b[off + i] = ring[(head + i) % ring.length];
            }
            head = (head + n) % ring.length;
            size -= n;
            changed.signalAll();
            return n;
        } finally {
            lock.unlock();
        }
    }

    private void write(byte[] b, int off, int len) throws IOException {
        lock.lock();
        try {
            int done = 0;
            while (done < len) {
                if (closed) {
                    throw new IOException("pipe closed");
                }
                if (size == ring.length) {
                    try {
                        changed.await();
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                        throw new InterruptedIOException("write interrupted");
                    }
                    continue;
                }
                int n = Math.min(len - done, ring.length - size);
                for (int i = 0; i < n; i++) {
                    ring[(head + size + i) % ring.length] = b[off + done + i];
                }
                size += n;
                done += n;
                changed.signalAll();
            }
        } finally {
            lock.unlock();
        }
    }

    void close() {
        lock.lock();
        try {
            closed = true;
            changed.signalAll();
        } finally {
            lock.unlock();
        }
    }
}
