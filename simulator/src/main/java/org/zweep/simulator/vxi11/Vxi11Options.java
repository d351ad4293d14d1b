package org.zweep.simulator.vxi11;

import java.net.InetAddress;
import java.util.function.Consumer;

/**
 * How a {@link Vxi11Server} listens. Immutable; change with the {@code withX} copies.
 *
 * @param bindAddress the address all three listeners bind to (loopback by default)
 * @param portmapperPort the portmapper's TCP port: 111 is the standard one, 0 picks a free one
 * @param maxReceiveBytes the largest {@code device_write} piece accepted (told to clients in
 *     {@code create_link}'s {@code maxRecvSize}); at least 16
 * @param replyFragmentBytes the largest record-marking fragment of a reply; 0 sends each reply in
 *     one fragment (a positive value exercises the clients' reassembly of fragmented records)
 * @param log where connection events go, one line each
 */
public record Vxi11Options(InetAddress bindAddress, int portmapperPort, int maxReceiveBytes, int replyFragmentBytes,
        Consumer<String> log) {
    /** The portmapper's well-known port (RFC 1833). */
    public static final int STANDARD_PORTMAPPER_PORT = 111;
    /** 1 MiB: a netlist block fits in one piece. */
    public static final int DEFAULT_MAX_RECEIVE_BYTES = 1 << 20;

    /** Checks the port and the sizes. */
    public Vxi11Options {
        if (portmapperPort < 0 || portmapperPort > 65535) {
            throw new IllegalArgumentException("portmapper port must be 0..65535, got " + portmapperPort);
        }
        if (maxReceiveBytes < 16) {
            throw new IllegalArgumentException("maxReceiveBytes must be at least 16, got " + maxReceiveBytes);
        }
        if (replyFragmentBytes < 0) {
            throw new IllegalArgumentException("replyFragmentBytes must not be negative, got " + replyFragmentBytes);
        }
    }

    /** Loopback, a free portmapper port, 1 MiB pieces, replies in one fragment, no log. */
    public static Vxi11Options defaults() {
        return new Vxi11Options(InetAddress.getLoopbackAddress(), 0, DEFAULT_MAX_RECEIVE_BYTES, 0, line -> { });
    }

    /** These options with another bind address. */
    public Vxi11Options withBindAddress(InetAddress a) {
        return new Vxi11Options(a, portmapperPort, maxReceiveBytes, replyFragmentBytes, log);
    }

    /** These options with another portmapper port (0 picks a free one). */
    public Vxi11Options withPortmapperPort(int p) {
        return new Vxi11Options(bindAddress, p, maxReceiveBytes, replyFragmentBytes, log);
    }

    /** These options with another largest write piece. */
    public Vxi11Options withMaxReceiveBytes(int n) {
        return new Vxi11Options(bindAddress, portmapperPort, n, replyFragmentBytes, log);
    }

    /** These options with replies cut into record fragments of at most {@code n} bytes (0: one fragment). */
    public Vxi11Options withReplyFragmentBytes(int n) {
        return new Vxi11Options(bindAddress, portmapperPort, maxReceiveBytes, n, log);
    }

    /** These options with another sink for connection events. */
    public Vxi11Options withLog(Consumer<String> l) {
        return new Vxi11Options(bindAddress, portmapperPort, maxReceiveBytes, replyFragmentBytes, l);
    }
}
