package org.zweep.simulator.vxi11;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicInteger;
import org.zweep.simulator.server.InMemoryConnection;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Serves a {@link SimulatorServer}'s instrument over VXI-11: a portmapper (program 100000 v2,
 * RFC 1833) on the configured port that knows the core channel (program 0x0607AF v1) and the abort
 * channel (0x0607B0 v1), both on free ports. Device name {@code inst0}. Each link is an in-memory
 * connection to the simulator, so the instrument's state is shared with its other clients and the
 * simulator's faults apply (a dropped connection closes the core channel; a stalled reply makes
 * {@code device_read} time out with error 15).
 *
 * <p>{@code device_read} returns at most the requested size, setting END where a response message
 * ends (the simulator's newline outside strings and blocks); a program message written with END
 * and without a final newline gets one. Locks are the server's: one link at a time holds the
 * device. Interrupt channels are not offered ({@code create_intr_chan} answers error 8).
 *
 * <p>Thread-safe; {@link #close()} stops the listeners and drops every link but leaves the
 * simulator running.
 */
public final class Vxi11Server implements AutoCloseable {
    static final int PORTMAPPER_PROGRAM = 100000;
    static final int CORE_PROGRAM = 0x0607AF;
    static final int ABORT_PROGRAM = 0x0607B0;
    static final int IPPROTO_TCP = 6;
    static final int ERR_SYNTAX = 1;
    static final int ERR_NOT_ACCESSIBLE = 3;
    static final int ERR_INVALID_LINK = 4;
    static final int ERR_PARAMETER = 5;
    static final int ERR_NOT_SUPPORTED = 8;
    static final int ERR_LOCKED = 11;
    static final int ERR_NO_LOCK = 12;
    static final int ERR_TIMEOUT = 15;
    static final int ERR_IO = 17;
    static final int ERR_ABORT = 23;
    static final int FLAG_WAITLOCK = 1;
    static final int FLAG_END = 8;
    static final int FLAG_TERMCHAR = 128;
    static final int REASON_REQCNT = 1;
    static final int REASON_CHR = 2;
    static final int REASON_END = 4;

    private final SimulatorServer meter;
    private final Vxi11Options options;
    private final RpcListener core;
    private final RpcListener abort;
    private final RpcListener portmapper;
    private final Map<Integer, DeviceLink> links = new ConcurrentHashMap<>();
    private final AtomicInteger nextLink = new AtomicInteger(1);
    private final Object lockMonitor = new Object();
    private int lockOwner;

    private Vxi11Server(SimulatorServer meter, Vxi11Options options) throws IOException {
        this.meter = meter;
        this.options = options;
        int maxRecord = options.maxReceiveBytes() + 1024;
        RpcListener c = null;
        RpcListener a = null;
        try {
            c = new RpcListener("vxi11-core", options.portmapper().bindAddress(), 0, CORE_PROGRAM, 1, new Core(),
                    options.replyFragmentBytes(), maxRecord, options.portmapper().log());
            a = new RpcListener("vxi11-abort", options.portmapper().bindAddress(), 0, ABORT_PROGRAM, 1, this::abortCall,
                    options.replyFragmentBytes(), 1024, options.portmapper().log());
            int corePort = c.port();
            int abortPort = a.port();
            this.portmapper = new RpcListener("portmapper", options.portmapper().bindAddress(), options.portmapper().port(),
                    PORTMAPPER_PROGRAM, 2, (proc, args, ch) -> portmap(proc, args, corePort, abortPort),
                    options.replyFragmentBytes(), 1024, options.portmapper().log());
        } catch (IOException e) {
            if (c != null) {
                c.close();
            }
            if (a != null) {
                a.close();
            }
            throw e;
        }
        this.core = c;
        this.abort = a;
    }

    /**
     * Starts the portmapper and both channels; returns once they listen.
     *
     * @throws IOException when a port cannot be bound (the message names it; port 111 needs root
     *     or CAP_NET_BIND_SERVICE on Linux)
     */
    public static Vxi11Server start(SimulatorServer meter, Vxi11Options options) throws IOException {
        return new Vxi11Server(meter, options);
    }

    /** The portmapper's port (the real one when 0 was asked for). */
    public int portmapperPort() {
        return portmapper.port();
    }

    /** The core channel's port, as the portmapper tells it. */
    public int corePort() {
        return core.port();
    }

    /** The abort channel's port, as {@code create_link} tells it. */
    public int abortPort() {
        return abort.port();
    }

    /** How many links are open. */
    public int linkCount() {
        return links.size();
    }

    // ---- the portmapper (RFC 1833 §3) ----

    private static byte[] portmap(int procedure, XdrIn args, int corePort, int abortPort) {
        return switch (procedure) {
            case 0 -> new byte[0]; // NULL
            case 1, 2 -> { // SET, UNSET: this portmapper keeps its own two entries only
                mapping(args);
                yield new XdrOut().int32(0).bytes();
            }
            case 3 -> { // GETPORT
                int[] m = mapping(args);
                int port = m[2] != IPPROTO_TCP || m[1] != 1 ? 0
                        : m[0] == CORE_PROGRAM ? corePort : m[0] == ABORT_PROGRAM ? abortPort : 0;
                yield new XdrOut().int32(port).bytes();
            }
            case 4 -> new XdrOut() // DUMP: a list of mappings, each preceded by TRUE, ended by FALSE
                    .int32(1).int32(PORTMAPPER_PROGRAM).int32(2).int32(IPPROTO_TCP).int32(0)
                    .int32(1).int32(CORE_PROGRAM).int32(1).int32(IPPROTO_TCP).int32(corePort)
                    .int32(1).int32(ABORT_PROGRAM).int32(1).int32(IPPROTO_TCP).int32(abortPort)
                    .int32(0).bytes();
            default -> null;
        };
    }

    private static int[] mapping(XdrIn args) {
        return new int[] {args.int32(), args.int32(), args.int32(), args.int32()};
    }

    // ---- the abort channel (VXI-11 B.5) ----

    private byte[] abortCall(int procedure, XdrIn args, RpcListener.Channel channel) {
        if (procedure != 1) {
            return null;
        }
        DeviceLink link = links.get(args.int32());
        if (link == null) {
            return new XdrOut().int32(ERR_INVALID_LINK).bytes();
        }
        link.abort();
        return new XdrOut().int32(0).bytes();
    }

    // ---- locks (VXI-11 B.6.7, B.6.8) ----

    /** 0 when {@code link} may go on, else error 11 (locked by another link past the lock timeout). */
    private int awaitLock(DeviceLink link, int flags, long lockTimeoutMillis) {
        synchronized (lockMonitor) {
            if (lockOwner == 0 || lockOwner == link.id) {
                return 0;
            }
            if ((flags & FLAG_WAITLOCK) == 0) {
                return ERR_LOCKED;
            }
            long deadline = System.nanoTime() + lockTimeoutMillis * 1_000_000L;
            while (lockOwner != 0 && lockOwner != link.id) {
                long left = deadline - System.nanoTime();
                if (left <= 0) {
                    return ERR_LOCKED;
                }
                try {
                    lockMonitor.wait((left + 999_999L) / 1_000_000L); // rounded up: never refused before the timeout
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                    return ERR_ABORT;
                }
            }
            return 0;
        }
    }

    private int lock(DeviceLink link, int flags, long lockTimeoutMillis) {
        synchronized (lockMonitor) {
            int e = awaitLock(link, flags, lockTimeoutMillis);
            if (e == 0) {
                lockOwner = link.id;
            }
            return e;
        }
    }

    private boolean unlock(DeviceLink link) {
        synchronized (lockMonitor) {
            if (lockOwner != link.id) {
                return false;
            }
            lockOwner = 0;
            lockMonitor.notifyAll();
            return true;
        }
    }

    private void destroy(DeviceLink link) {
        if (links.remove(link.id) != null) {
            unlock(link);
            link.close();
        }
    }

    /** The core channel (VXI-11 B.6): one instance serves every connection. */
    private final class Core implements RpcListener.Handler {
        private final Map<Long, List<DeviceLink>> byChannel = new ConcurrentHashMap<>();

        @Override
        public byte[] call(int procedure, XdrIn args, RpcListener.Channel channel) {
            if (procedure == 10) {
                return createLink(args, channel);
            }
            if (procedure == 25) { // create_intr_chan: no interrupt channel here
                args.uint32();
                args.uint32();
                args.uint32();
                args.uint32();
                args.int32();
                return new XdrOut().int32(ERR_NOT_SUPPORTED).bytes();
            }
            if (procedure == 26) { // destroy_intr_chan
                return new XdrOut().int32(ERR_NOT_SUPPORTED).bytes();
            }
            if (procedure < 11 || procedure > 23 || procedure == 21) {
                return null;
            }
            DeviceLink link = links.get(args.int32());
            if (link == null || link.channel != channel) {
                return invalidLink(procedure);
            }
            return switch (procedure) {
                case 11 -> write(link, args);
                case 12 -> read(link, args);
                case 13, 14, 15, 16, 17 -> generic(link, procedure, args);
                case 18 -> {
                    int flags = args.int32();
                    yield new XdrOut().int32(lock(link, flags, args.uint32())).bytes();
                }
                case 19 -> new XdrOut().int32(unlock(link) ? 0 : ERR_NO_LOCK).bytes();
                case 20 -> { // device_enable_srq: accepted, but there is no interrupt channel to raise it on
                    args.bool();
                    args.opaque(40);
                    yield new XdrOut().int32(0).bytes();
                }
                case 22 -> new XdrOut().int32(ERR_NOT_SUPPORTED).opaque(new byte[0], 0, 0).bytes();
                case 23 -> {
                    destroy(link);
                    byChannel.getOrDefault(channel.id, new ArrayList<>()).remove(link);
                    yield new XdrOut().int32(0).bytes();
                }
                default -> null;
            };
        }

        private byte[] invalidLink(int procedure) {
            XdrOut out = new XdrOut().int32(ERR_INVALID_LINK);
            return switch (procedure) {
                case 11 -> out.int32(0).bytes();
                case 12 -> out.int32(0).opaque(new byte[0], 0, 0).bytes();
                case 13 -> out.int32(0).bytes();
                case 22 -> out.opaque(new byte[0], 0, 0).bytes();
                default -> out.bytes();
            };
        }

        private byte[] createLink(XdrIn args, RpcListener.Channel channel) {
            args.int32(); // client id: for the client's own bookkeeping
            boolean lockDevice = args.bool();
            long lockTimeout = args.uint32();
            String device = args.string(256);
            if (!device.equalsIgnoreCase("inst0")) {
                options.portmapper().log().accept("vxi11: create_link to unknown device '" + device + "' refused");
                return new XdrOut().int32(ERR_NOT_ACCESSIBLE).int32(0).int32(abort.port())
                        .int32(options.maxReceiveBytes()).bytes();
            }
            DeviceLink link;
            try {
                link = new DeviceLink(nextLink.getAndIncrement(), channel, meter);
            } catch (IllegalStateException e) {
                return new XdrOut().int32(ERR_NOT_ACCESSIBLE).int32(0).int32(abort.port())
                        .int32(options.maxReceiveBytes()).bytes();
            }
            links.put(link.id, link);
            byChannel.computeIfAbsent(channel.id, k -> new ArrayList<>()).add(link);
            if (lockDevice) {
                int e = lock(link, FLAG_WAITLOCK, lockTimeout);
                if (e != 0) {
                    destroy(link);
                    return new XdrOut().int32(e).int32(0).int32(abort.port()).int32(options.maxReceiveBytes())
                            .bytes();
                }
            }
            options.portmapper().log().accept("vxi11: link " + link.id + " to " + device + " from " + channel.peer);
            return new XdrOut().int32(0).int32(link.id).int32(abort.port()).int32(options.maxReceiveBytes()).bytes();
        }

        private byte[] write(DeviceLink link, XdrIn args) {
            long ioTimeout = args.uint32();
            long lockTimeout = args.uint32();
            int flags = args.int32();
            byte[] data = args.opaque(Integer.MAX_VALUE);
            if (data.length > options.maxReceiveBytes()) {
                return new XdrOut().int32(ERR_PARAMETER).int32(0).bytes();
            }
            int e = awaitLock(link, flags, lockTimeout);
            if (e != 0) {
                return new XdrOut().int32(e).int32(0).bytes();
            }
            try {
                link.write(data, (flags & FLAG_END) != 0);
            } catch (IOException ex) {
                throw new RpcListener.DropConnection("the simulator closed link " + link.id + " (" + ex.getMessage() + ")");
            }
            return new XdrOut().int32(0).int32(data.length).bytes();
        }

        private byte[] read(DeviceLink link, XdrIn args) {
            long requestSize = args.uint32();
            long ioTimeout = args.uint32();
            long lockTimeout = args.uint32();
            int flags = args.int32();
            int termChar = args.int32();
            int e = awaitLock(link, flags, lockTimeout);
            if (e != 0) {
                return new XdrOut().int32(e).int32(0).opaque(new byte[0], 0, 0).bytes();
            }
            DeviceLink.Piece p;
            try {
                p = link.read((int) Math.min(requestSize, Integer.MAX_VALUE - 16), ioTimeout,
                        (flags & FLAG_TERMCHAR) != 0 ? termChar & 0xff : -1);
            } catch (IOException ex) {
                throw new RpcListener.DropConnection("the simulator closed link " + link.id + " (" + ex.getMessage() + ")");
            }
            return new XdrOut().int32(p.error()).int32(p.reason()).opaque(p.data(), 0, p.data().length).bytes();
        }

        /** device_readstb, _trigger, _clear, _remote, _local: Device_GenericParms. */
        private byte[] generic(DeviceLink link, int procedure, XdrIn args) {
            int flags = args.int32();
            long lockTimeout = args.uint32();
            long ioTimeout = args.uint32();
            int e = awaitLock(link, flags, lockTimeout);
            XdrOut out = new XdrOut();
            try {
                if (e == 0) {
                    switch (procedure) {
                        case 13 -> {
                            int stb = link.statusByte(ioTimeout);
                            return out.int32(stb < 0 ? ERR_TIMEOUT : 0).int32(Math.max(0, stb)).bytes();
                        }
                        case 14 -> link.write("*TRG".getBytes(java.nio.charset.StandardCharsets.US_ASCII), true);
                        case 15 -> link.clear();
                        default -> { } // remote and local: the simulator has no front panel to lock out
                    }
                }
            } catch (IOException ex) {
                throw new RpcListener.DropConnection("the simulator closed link " + link.id + " (" + ex.getMessage() + ")");
            }
            out.int32(e);
            return procedure == 13 ? out.int32(0).bytes() : out.bytes();
        }

        @Override
        public void closed(RpcListener.Channel channel) {
            List<DeviceLink> mine = byChannel.remove(channel.id);
            if (mine != null) {
                for (DeviceLink l : List.copyOf(mine)) {
                    destroy(l);
                }
            }
        }
    }

    /** Stops the portmapper and both channels and drops every link; the simulator keeps running. */
    @Override
    public void close() {
        portmapper.close();
        abort.close();
        core.close();
        for (DeviceLink l : List.copyOf(links.values())) {
            destroy(l);
        }
    }
}
