package org.zweep.simulator.server;

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
