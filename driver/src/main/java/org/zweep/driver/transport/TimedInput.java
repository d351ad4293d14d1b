package org.zweep.driver.transport;

import java.io.IOException;

/** The reading side of a stream-like link whose reads can wait with a timeout. */
@FunctionalInterface
public interface TimedInput {
    /**
     * Reads up to {@code length} bytes, waiting at most {@code timeoutMillis} for the first.
     *
     * @return the number of bytes read, 0 when none arrived in time, -1 at the end of the stream
     * @throws java.io.InterruptedIOException if the waiting thread was interrupted
     * @throws IOException if the link broke
     */
    int read(byte[] buffer, int offset, int length, long timeoutMillis) throws IOException;
}
