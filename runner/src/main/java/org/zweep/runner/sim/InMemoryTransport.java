package org.zweep.runner.sim;

import java.io.IOException;
import java.io.InterruptedIOException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.Transport;
import org.zweep.simulator.server.InMemoryConnection;

/**
 * A {@link Transport} straight over an in-process simulator connection: reads wait on the
 * connection itself with their timeout, on the caller's thread, so a reply reaches the client
 * with no pump thread in between (unlike {@link Transport#ofStreams}). Not thread-safe, as any
 * transport: one reader and one writer.
 */
final class InMemoryTransport implements Transport {
    private final InMemoryConnection connection;
    private final String name;
    private volatile boolean closed;

    InMemoryTransport(InMemoryConnection connection, String name) {
        this.connection = connection;
        this.name = name;
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
            connection.output().write(data, offset, length);
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
            n = connection.read(buffer, offset, length, timeoutMillis);
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
        closed = true;
        connection.close();
    }
}
