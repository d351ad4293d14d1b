package org.zweep.simulator.server;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;

/**
 * An in-process connection to a {@link SimulatorServer}: write program messages (LF-terminated)
 * to {@link #output()}, read replies from {@link #input()}. It behaves as a TCP connection does,
 * faults included; {@link #close()} ends it from the client side.
 */
public final class InMemoryConnection implements AutoCloseable {
    private final BytePipe toServer;
    private final BytePipe toClient;

    InMemoryConnection(BytePipe toServer, BytePipe toClient) {
        this.toServer = toServer;
        this.toClient = toClient;
    }

    /** Replies from the simulator; reading blocks until bytes arrive, -1 once the connection is closed. */
    public InputStream input() {
        return toClient.input;
    }

    /**
     * Reads replies with a timeout on the calling thread, so that a client needs no pump thread
     * (one thread hand-off less per reply than reading {@link #input()} from another thread).
     *
     * @param timeoutMillis the longest wait for the first byte; positive
     * @return the number of bytes read (at least one), 0 if none arrived in time, -1 once the
     *     connection is closed and every reply has been read
     * @throws java.io.InterruptedIOException if the calling thread is interrupted while waiting
     */
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) throws IOException {
        if (timeoutMillis <= 0) {
            throw new IllegalArgumentException("timeout must be positive, got " + timeoutMillis + " ms");
        }
        int n = toClient.read(buffer, offset, length, timeoutMillis);
        return n == BytePipe.TIMED_OUT ? 0 : n;
    }

    /** Program messages to the simulator; writing blocks while the simulator's input buffer is full. */
    public OutputStream output() {
        return toServer.output;
    }

    /** Closes both directions; never throws. */
    @Override
    public void close() {
        toServer.close();
        toClient.close();
    }
}
