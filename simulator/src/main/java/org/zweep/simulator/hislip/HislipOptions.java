package org.zweep.simulator.hislip;

import org.zweep.simulator.server.ListenerOptions;

/**
 * How a {@link HislipServer} listens and behaves. Immutable; change with the {@code withX} copies.
 *
 * @param listener the address and TCP port of both channels (4880 is the standard port, 0 picks a
 *     free one) and the log of connection events
 * @param overlapped whether the server offers overlapped mode (true) or synchronized mode (false,
 *     the default), as told to clients in InitializeResponse
 * @param maxMessageBytes the largest message the server accepts (AsyncMaxMsgSizeResponse); at least 64
 */
public record HislipOptions(ListenerOptions listener, boolean overlapped, long maxMessageBytes) {
    /** The IANA-registered HiSLIP port. */
    public static final int STANDARD_PORT = 4880;

    /** Checks the size. */
    public HislipOptions {
        if (maxMessageBytes < 64) {
            throw new IllegalArgumentException("maxMessageBytes must be at least 64, got " + maxMessageBytes);
        }
    }

    /** Loopback, a free port, synchronized mode, 1 MiB messages, no log. */
    public static HislipOptions defaults() {
        return new HislipOptions(ListenerOptions.loopback(), false, 1 << 20);
    }

    /** These options with another address, port or log. */
    public HislipOptions withListener(ListenerOptions l) {
        return new HislipOptions(l, overlapped, maxMessageBytes);
    }

    /** These options in overlapped (true) or synchronized (false) mode. */
    public HislipOptions withOverlapped(boolean o) {
        return new HislipOptions(listener, o, maxMessageBytes);
    }

    /** These options with another largest accepted message. */
    public HislipOptions withMaxMessageBytes(long n) {
        return new HislipOptions(listener, overlapped, n);
    }
}
