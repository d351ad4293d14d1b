package org.zweep.simulator.server;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;

/** The byte channel under one connection: a TCP socket or an in-memory pipe pair. */
interface Link {
    InputStream input();

    OutputStream output();

    /** Read timeout for the next reads in milliseconds; 0 waits for ever. */
    void setReadTimeoutMillis(int ms) throws IOException;

    /** Closes both directions; never throws. */
    void close();

    /** For log lines, e.g. {@code 127.0.0.1:53122} or {@code in-memory}. */
    String peer();
}
