package org.zweep.simulator.server;

import java.net.InetAddress;
import java.util.Objects;
import java.util.function.Consumer;

/**
 * Where a LAN front of the simulator (HiSLIP, VXI-11) listens and where it logs. Immutable; change
 * with the {@code withX} copies.
 *
 * @param bindAddress the address to bind to (loopback by default: this machine only)
 * @param port the TCP port, 0..65535; 0 picks a free one
 * @param log where connection events go, one line each (called from the server's threads)
 */
public record ListenerOptions(InetAddress bindAddress, int port, Consumer<String> log) {

    /** Checks the port. */
    public ListenerOptions {
        Objects.requireNonNull(bindAddress, "bindAddress");
        Objects.requireNonNull(log, "log");
        if (port < 0 || port > 65535) {
            throw new IllegalArgumentException("port must be 0..65535, got " + port);
        }
    }

    /** Loopback, a free port, no log. */
    public static ListenerOptions loopback() {
        return new ListenerOptions(InetAddress.getLoopbackAddress(), 0, line -> { });
    }

    /** These options with another bind address. */
    public ListenerOptions withBindAddress(InetAddress a) {
        return new ListenerOptions(a, port, log);
    }

    /** These options with another port (0 picks a free one). */
    public ListenerOptions withPort(int p) {
        return new ListenerOptions(bindAddress, p, log);
    }

    /** These options with another sink for connection events. */
    public ListenerOptions withLog(Consumer<String> l) {
        return new ListenerOptions(bindAddress, port, l);
    }
}
