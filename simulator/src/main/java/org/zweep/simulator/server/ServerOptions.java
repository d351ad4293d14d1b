package org.zweep.simulator.server;

import java.net.InetAddress;
import java.util.function.Consumer;
import org.zweep.simulator.scpi.InstrumentOptions;

/**
 * How a {@link SimulatorServer} listens and behaves. Immutable; change with the {@code withX} copies.
 *
 * @param tcp whether to open a TCP listener at all (off for in-memory use only)
 * @param bindAddress the address the TCP listener binds to (loopback by default)
 * @param port the TCP port; 0 picks a free one ({@link SimulatorServer#port()} tells which)
 * @param maxMessageBytes the longest program message accepted; longer ones give {@code -363}
 * @param faults the faults every new connection starts with
 * @param instrument the meter's own options (timing, error-queue depth, strictness, bench loader)
 * @param log where connection events go, one line each
 * @param maxConnections the most TCP connections open at once; one more is refused with a line saying so
 * @param maxOutputBytes the output queue of one connection, in bytes (a reply always fits an empty queue)
 * @param maxTotalOutputBytes the output queues of all connections together, in bytes
 */
public record ServerOptions(boolean tcp, InetAddress bindAddress, int port, int maxMessageBytes, FaultPlan faults,
        InstrumentOptions instrument, Consumer<String> log, int maxConnections, long maxOutputBytes,
        long maxTotalOutputBytes) {
    /** The IANA port for SCPI over a raw socket. */
    public static final int DEFAULT_PORT = 5025;
    /** 1 MiB: room for a netlist block, far from exhausting memory. */
    public static final int DEFAULT_MAX_MESSAGE_BYTES = 1 << 20;
    /** Room for many scripts and tests at once, far from running out of threads (two per connection). */
    public static final int DEFAULT_MAX_CONNECTIONS = 256;
    /** 256 KiB: thousands of short replies. */
    public static final long DEFAULT_MAX_OUTPUT_BYTES = 256 << 10;
    /** 16 MiB across all connections. */
    public static final long DEFAULT_MAX_TOTAL_OUTPUT_BYTES = 16 << 20;

    /** Checks the port (0..65535) and the message limit (at least 64 bytes). */
    public ServerOptions {
        if (port < 0 || port > 65535) {
            throw new IllegalArgumentException("port must be 0..65535, got " + port);
        }
        if (maxMessageBytes < 64) {
            throw new IllegalArgumentException("maxMessageBytes must be at least 64, got " + maxMessageBytes);
        }
        if (maxConnections < 1) {
            throw new IllegalArgumentException("maxConnections must be at least 1, got " + maxConnections);
        }
        if (maxOutputBytes < 1 || maxTotalOutputBytes < maxOutputBytes) {
            throw new IllegalArgumentException("output queue limits must be positive, the total at least the per-connection "
                    + "one; got " + maxOutputBytes + " and " + maxTotalOutputBytes);
        }
    }

    /** TCP on 127.0.0.1:5025, 1 MiB messages, no faults, default instrument options, no log. */
    public static ServerOptions defaults() {
        return new ServerOptions(true, InetAddress.getLoopbackAddress(), DEFAULT_PORT, DEFAULT_MAX_MESSAGE_BYTES,
                FaultPlan.none(), InstrumentOptions.defaults(), line -> { }, DEFAULT_MAX_CONNECTIONS, DEFAULT_MAX_OUTPUT_BYTES,
                DEFAULT_MAX_TOTAL_OUTPUT_BYTES);
    }

    /** These options with the TCP listener on or off. */
    public ServerOptions withTcp(boolean t) {
        return new ServerOptions(t, bindAddress, port, maxMessageBytes, faults, instrument, log,
                maxConnections, maxOutputBytes, maxTotalOutputBytes);
    }

    /** These options with another address to bind the TCP listener to. */
    public ServerOptions withBindAddress(InetAddress a) {
        return new ServerOptions(tcp, a, port, maxMessageBytes, faults, instrument, log,
                maxConnections, maxOutputBytes, maxTotalOutputBytes);
    }

    /** These options with another TCP port (0 picks a free one). */
    public ServerOptions withPort(int p) {
        return new ServerOptions(tcp, bindAddress, p, maxMessageBytes, faults, instrument, log,
                maxConnections, maxOutputBytes, maxTotalOutputBytes);
    }

    /** These options with another longest program message, in bytes (at least 64). */
    public ServerOptions withMaxMessageBytes(int n) {
        return new ServerOptions(tcp, bindAddress, port, n, faults, instrument, log,
                maxConnections, maxOutputBytes, maxTotalOutputBytes);
    }

    /** These options with the faults every new connection starts with. */
    public ServerOptions withFaults(FaultPlan f) {
        return new ServerOptions(tcp, bindAddress, port, maxMessageBytes, f, instrument, log,
                maxConnections, maxOutputBytes, maxTotalOutputBytes);
    }

    /** These options with other instrument options. */
    public ServerOptions withInstrument(InstrumentOptions i) {
        return new ServerOptions(tcp, bindAddress, port, maxMessageBytes, faults, i, log,
                maxConnections, maxOutputBytes, maxTotalOutputBytes);
    }

    /** These options with another sink for connection events (called from the server's threads). */
    public ServerOptions withLog(Consumer<String> l) {
        return new ServerOptions(tcp, bindAddress, port, maxMessageBytes, faults, instrument, l, maxConnections, maxOutputBytes,
                maxTotalOutputBytes);
    }

    /** These options with another cap on open TCP connections (at least 1). */
    public ServerOptions withMaxConnections(int n) {
        return new ServerOptions(tcp, bindAddress, port, maxMessageBytes, faults, instrument, log, n, maxOutputBytes,
                maxTotalOutputBytes);
    }

    /** These options with other output queue limits, per connection and in all, in bytes. */
    public ServerOptions withMaxOutputBytes(long perConnection, long total) {
        return new ServerOptions(tcp, bindAddress, port, maxMessageBytes, faults, instrument, log, maxConnections,
                perConnection, total);
    }
}
