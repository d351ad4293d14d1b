package org.zweep.simulator.vxi11;

import org.zweep.simulator.server.ListenerOptions;

/**
 * How a {@link Vxi11Server} listens. Immutable; change with the {@code withX} copies.
 *
 * @param portmapper the address all three listeners bind to, the portmapper's TCP port (111 is the
 *     standard one, 0 picks a free one; the core and abort channels always take free ports) and the
 *     log of connection events
 * @param maxReceiveBytes the largest {@code device_write} piece accepted (told to clients in
 *     {@code create_link}'s {@code maxRecvSize}); at least 16
 * @param replyFragmentBytes the largest record-marking fragment of a reply; 0 sends each reply in
 *     one fragment (a positive value exercises the clients' reassembly of fragmented records)
 */
public record Vxi11Options(ListenerOptions portmapper, int maxReceiveBytes, int replyFragmentBytes) {
    /** The portmapper's well-known port (RFC 1833). */
    public static final int STANDARD_PORTMAPPER_PORT = 111;
    /** 1 MiB: a netlist block fits in one piece. */
    public static final int DEFAULT_MAX_RECEIVE_BYTES = 1 << 20;

    /** Checks the sizes. */
    public Vxi11Options {
        if (maxReceiveBytes < 16) {
            throw new IllegalArgumentException("maxReceiveBytes must be at least 16, got " + maxReceiveBytes);
        }
        if (replyFragmentBytes < 0) {
            throw new IllegalArgumentException("replyFragmentBytes must not be negative, got " + replyFragmentBytes);
        }
    }

    /** Loopback, a free portmapper port, 1 MiB pieces, replies in one fragment, no log. */
    public static Vxi11Options defaults() {
        return new Vxi11Options(ListenerOptions.loopback(), DEFAULT_MAX_RECEIVE_BYTES, 0);
    }

    /** These options with another address, portmapper port or log. */
    public Vxi11Options withPortmapper(ListenerOptions l) {
        return new Vxi11Options(l, maxReceiveBytes, replyFragmentBytes);
    }

    /** These options with another largest write piece. */
    public Vxi11Options withMaxReceiveBytes(int n) {
        return new Vxi11Options(portmapper, n, replyFragmentBytes);
    }

    /** These options with replies cut into record fragments of at most {@code n} bytes (0: one fragment). */
    public Vxi11Options withReplyFragmentBytes(int n) {
        return new Vxi11Options(portmapper, maxReceiveBytes, n);
    }
}
