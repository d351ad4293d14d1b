package org.zweep.simulator.hislip;

import java.net.InetAddress;
import java.util.function.Consumer;

/**
 * How a {@link HislipServer} listens and behaves. Immutable; change with the {@code withX} copies.
 *
 * @param bindAddress the address the listener binds to (loopback by default)
 * @param port the TCP port of both channels: 4880 is the standard one, 0 picks a free one
 * @param overlapped whether the server offers overlapped mode (true) or synchronized mode (false,
 *     the default), as told to clients in InitializeResponse
 * @param maxMessageBytes the largest message the server accepts (AsyncMaxMsgSizeResponse); at least 64
 * @param log where connection events go, one line each
 */
public record HislipOptions(InetAddress bindAddress, int port, boolean overlapped, long maxMessageBytes,
        Consumer<String> log) {
    /** The IANA-registered HiSLIP port. */
    public static final int STANDARD_PORT = 4880;

    /** Checks the port and the size. */
    public HislipOptions {
        if (port < 0 || port > 65535) {
            throw new IllegalArgumentException("port must be 0..65535, got " + port);
        }
        if (maxMessageBytes < 64) {
            throw new IllegalArgumentException("maxMessageBytes must be at least 64, got " + maxMessageBytes);
        }
    }

    /** Loopback, a free port, synchronized mode, 1 MiB messages, no log. */
    public static HislipOptions defaults() {
        return new HislipOptions(InetAddress.getLoopbackAddress(), 0, false, 1 << 20, line -> { });
    }

    /** These options with another bind address. */
    public HislipOptions withBindAddress(InetAddress a) {
        return new HislipOptions(a, port, overlapped, maxMessageBytes, log);
    }

    /** These options with another port (0 picks a free one). */
    public HislipOptions withPort(int p) {
        return new HislipOptions(bindAddress, p, overlapped, maxMessageBytes, log);
    }

    /** These options in overlapped (true) or synchronized (false) mode. */
    public HislipOptions withOverlapped(boolean o) {
        return new HislipOptions(bindAddress, port, o, maxMessageBytes, log);
    }

    /** These options with another largest accepted message. */
    public HislipOptions withMaxMessageBytes(long n) {
        return new HislipOptions(bindAddress, port, overlapped, n, log);
    }

    /** These options with another sink for connection events. */
    public HislipOptions withLog(Consumer<String> l) {
        return new HislipOptions(bindAddress, port, overlapped, maxMessageBytes, l);
    }
}
