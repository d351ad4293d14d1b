package org.zweep.driver.transport;

import java.io.InputStream;
import java.io.OutputStream;

/**
 * A byte-level link to a meter: it carries bytes and knows nothing of SCPI (terminators, blocks and
 * resynchronisation are the {@link org.zweep.driver.scpi.ScpiClient}'s job).
 *
 * <p>Not thread-safe: one reader and one writer at a time, normally the one client that owns it.
 * Failures are {@link ConnectionLostException} (the link broke); a read that finds nothing in time
 * returns 0 rather than throwing, so the caller decides what a timeout means.
 */
public interface Transport extends AutoCloseable {

    /** The address as the user wrote it, for messages. */
    String name();

    /**
     * Writes all {@code length} bytes; blocks until the operating system has taken them.
     *
     * @throws ConnectionLostException if the link broke
     * @throws MeterTimeoutException if a serial port does not accept them within the write timeout
     */
    void write(byte[] data, int offset, int length);

    /**
     * Reads what has arrived, at least one byte and at most {@code length}, waiting at most
     * {@code timeoutMillis} for the first byte. Never busy-waits.
     *
     * @param timeoutMillis positive; transports may round it up to their granularity (serial: 100 ms)
     * @return the number of bytes read, or 0 if none arrived in time
     * @throws ConnectionLostException if the peer closed the link or it broke
     */
    int read(byte[] buffer, int offset, int length, long timeoutMillis);

    /** Closes the link and releases its resources; idempotent, never throws. */
    @Override
    void close();

    /**
     * A transport over a pair of streams, e.g. an in-process simulator's. Reads are served by one
     * daemon thread that pumps {@code in}, so that {@link #read} can time out; closing the transport
     * closes both streams.
     *
     * @param name the name used in messages, e.g. the address {@code sim:}
     */
    static Transport ofStreams(InputStream in, OutputStream out, String name) {
        PumpedInput input = new PumpedInput(in, name);
        return of(input, out, name, () -> {
            try {
                out.close();
            } finally {
                input.close();
            }
        });
    }

    /**
     * A transport over an input whose reads take a timeout and an output stream, e.g. an in-process
     * connection that can wait itself; closing the transport runs {@code onClose} once.
     *
     * @param name the name used in messages, e.g. the address {@code sim:}
     */
    static Transport of(TimedInput in, OutputStream out, String name, java.io.Closeable onClose) {
        return new TimedStreamTransport(in, out, name, onClose);
    }
}
