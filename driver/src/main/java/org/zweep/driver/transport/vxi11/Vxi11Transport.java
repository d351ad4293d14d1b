package org.zweep.driver.transport.vxi11;

import java.io.IOException;
import java.net.InetSocketAddress;
import java.net.SocketTimeoutException;
import java.time.Duration;
import java.util.Arrays;
import java.util.concurrent.locks.ReentrantLock;
import org.zweep.driver.address.Vxi11Address;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.Deadline;
import org.zweep.driver.transport.LinkState;
import org.zweep.driver.transport.MessagePieces;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;

/**
 * A VXI-11 link (VXI-11 rev. 1.0, "TCP/IP Instrument Protocol"): the portmapper lookup of the core
 * channel (RFC 1833), {@code create_link}, one {@code device_write} per message with END on its last
 * piece (split at the server's maximum receive size), {@code device_read} in pieces until END, and
 * {@code destroy_link} on close. Device clear, status byte, trigger, locking and the abort channel
 * are offered as methods of their own.
 *
 * <p>As a {@link Transport} it is a byte stream: {@link #read} returns what one {@code device_read}
 * brought, keeping the rest for the next call. A read that the device does not answer within its
 * timeout (VXI-11 error 15) returns 0; the late reply then comes with the next read and the SCPI
 * client's resynchronisation discards it, as on raw TCP. A server that does not answer an RPC at
 * all within the timeout plus {@value #RPC_GRACE_MILLIS} ms is a timeout too; its late RPC reply is
 * recognised by its transaction id and dropped. RPC records longer than the read size plus a little
 * are refused. Not thread-safe (one caller at a time) except {@link #abort()} and {@link #close()}.
 */
public final class Vxi11Transport implements Transport {
    static final int CORE_PROGRAM = 0x0607AF;
    static final int CORE_VERSION = 1;
    static final int ABORT_PROGRAM = 0x0607B0;
    static final int ABORT_VERSION = 1;
    static final int PORTMAPPER_PROGRAM = 100000;
    static final int PORTMAPPER_VERSION = 2;
    static final int PMAPPROC_GETPORT = 3;
    static final int IPPROTO_TCP = 6;
    static final int CREATE_LINK = 10;
    static final int DEVICE_WRITE = 11;
    static final int DEVICE_READ = 12;
    static final int DEVICE_READSTB = 13;
    static final int DEVICE_TRIGGER = 14;
    static final int DEVICE_CLEAR = 15;
    static final int DEVICE_LOCK = 18;
    static final int DEVICE_UNLOCK = 19;
    static final int DESTROY_LINK = 23;
    static final int DEVICE_ABORT = 1;
    static final int FLAG_WAITLOCK = 1;
    static final int FLAG_END = 8;
    static final int REASON_END = 4;
    static final int ERR_LOCKED = 11;
    static final int ERR_NO_LOCK = 12;
    static final int ERR_TIMEOUT = 15;
    static final int ERR_ABORT = 23;
    /** The most one {@code device_read} asks for: the largest piece of a reply in one RPC record. */
    static final int DEFAULT_READ_BYTES = 1 << 20;
    /** How long past the I/O timeout the client waits for the server's RPC reply. */
    static final long RPC_GRACE_MILLIS = 1000;
    private static final int RECORD_OVERHEAD = 64;
    private static final long CLOSE_WAIT_MILLIS = 500;

    private final String name;
    private final RpcConnection core;
    private final InetSocketAddress host;
    private final int link;
    private final int abortPort;
    private final long serverMaxReceive;
    private final int readBytes;
    private final Duration connectTimeout;
    private final long writeTimeoutMillis;
    private final ReentrantLock busy = new ReentrantLock();
    private byte[] pending = new byte[0];
    private int pendingPos;
    private final LinkState state;

    private Vxi11Transport(String name, RpcConnection core, InetSocketAddress host, int link, int abortPort,
            long serverMaxReceive, int readBytes, TransportOptions options) {
        this.name = name;
        this.state = new LinkState(name);
        this.core = core;
        this.host = host;
        this.link = link;
        this.abortPort = abortPort;
        this.serverMaxReceive = serverMaxReceive;
        this.readBytes = readBytes;
        this.connectTimeout = options.connectTimeout();
        this.writeTimeoutMillis = Math.max(1, options.writeTimeout().toMillis());
    }

    /**
     * Asks the portmapper for the core channel, connects and creates the link; each step waits up
     * to the connect timeout.
     *
     * @throws ConnectFailedException if the portmapper or the core channel cannot be reached, the
     *     server offers no VXI-11, or refuses the link (e.g. no such device)
     */
    public static Vxi11Transport connect(Vxi11Address address, TransportOptions options) {
        return connect(address, options, DEFAULT_READ_BYTES);
    }

    /** As {@link #connect(Vxi11Address, TransportOptions)}, asking for at most {@code readBytes} per {@code device_read}. */
    static Vxi11Transport connect(Vxi11Address address, TransportOptions options, int readBytes) {
        String name = address.text();
        InetSocketAddress pm = new InetSocketAddress(address.host(), address.portmapperPort());
        if (pm.isUnresolved()) {
            throw new ConnectFailedException(name + ": unknown host '" + address.host() + "'");
        }
        long timeout = Math.max(1, options.connectTimeout().toMillis());
        int corePort = corePort(name, pm, options);
        InetSocketAddress coreAddress = new InetSocketAddress(pm.getAddress(), corePort);
        RpcConnection core;
        try {
            core = RpcConnection.connect(coreAddress, options.connectTimeout(), readBytes + RECORD_OVERHEAD,
                    options.replySpin());
        } catch (IOException e) {
            throw new ConnectFailedException(name + ": cannot connect to the VXI-11 core channel at "
                    + where(coreAddress) + " (registered with the portmapper): " + e.getMessage(), e);
        }
        try {
            XdrEncoder args = new XdrEncoder().putInt((int) ProcessHandle.current().pid()).putBoolean(false)
                    .putInt(0).putString(address.device());
            XdrDecoder r = core.awaitReply(core.send(CORE_PROGRAM, CORE_VERSION, CREATE_LINK, args), timeout);
            if (r == null) {
                throw new ConnectFailedException(name + ": the VXI-11 server at " + where(coreAddress)
                        + " did not answer create_link within " + timeout + " ms");
            }
            int error = r.getInt();
            int link = r.getInt();
            int abortPort = (int) (r.getUnsignedInt() & 0xffff);
            long maxReceive = r.getUnsignedInt();
            if (error != 0) {
                throw new ConnectFailedException(name + ": the VXI-11 server refused a link to device '"
                        + address.device() + "': " + errorText(error));
            }
            return new Vxi11Transport(name, core, new InetSocketAddress(pm.getAddress(), 0), link, abortPort,
                    maxReceive == 0 ? Long.MAX_VALUE : maxReceive, readBytes, options);
        } catch (IOException | RpcConnection.RpcException | XdrDecoder.XdrException e) {
            core.close();
            throw new ConnectFailedException(name + ": create_link failed at " + where(coreAddress) + ": "
                    + e.getMessage(), e);
        } catch (RuntimeException e) {
            core.close();
            throw e;
        }
    }

    /** Asks the portmapper at {@code pm} for the TCP port of the core channel (RFC 1833 §3.2, PMAPPROC_GETPORT). */
    private static int corePort(String name, InetSocketAddress pm, TransportOptions options) {
        long timeout = Math.max(1, options.connectTimeout().toMillis());
        try (RpcConnection c = RpcConnection.connect(pm, options.connectTimeout(), 1024, Duration.ZERO)) {
            XdrEncoder mapping = new XdrEncoder().putInt(CORE_PROGRAM).putInt(CORE_VERSION).putInt(IPPROTO_TCP).putInt(0);
            XdrDecoder r = c.awaitReply(c.send(PORTMAPPER_PROGRAM, PORTMAPPER_VERSION, PMAPPROC_GETPORT, mapping),
                    timeout);
            if (r == null) {
                throw new ConnectFailedException(name + ": the portmapper at " + where(pm) + " did not answer within "
                        + timeout + " ms");
            }
            long port = r.getUnsignedInt();
            if (port == 0 || port > 65535) {
                throw new ConnectFailedException(name + ": the portmapper at " + where(pm)
                        + " knows no VXI-11 core channel (program 0x0607AF version 1 over TCP): is it an instrument?");
            }
            return (int) port;
        } catch (SocketTimeoutException e) {
            throw new ConnectFailedException(name + ": no answer from the portmapper at " + where(pm) + " within "
                    + timeout + " ms while connecting (is the instrument on the network?)", e);
        } catch (IOException e) {
            throw new ConnectFailedException(name + ": cannot reach the portmapper at " + where(pm) + ": "
                    + e.getMessage() + " (VXI-11 looks the instrument up there: is port " + pm.getPort()
                    + " reachable through firewalls?)", e);
        } catch (RpcConnection.RpcException | XdrDecoder.XdrException e) {
            throw new ConnectFailedException(name + ": the portmapper at " + where(pm) + " gave no usable answer: "
                    + e.getMessage(), e);
        }
    }

    @Override
    public String name() {
        return name;
    }

    /** The link id the server gave (for traces and tests). */
    public int linkId() {
        return link;
    }

    /** The server's maximum receive size: the largest piece of a message one {@code device_write} carries. */
    public long serverMaxReceiveBytes() {
        return serverMaxReceive;
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        busy.lock();
        try {
            state.check("write");
            MessagePieces.send(length, serverMaxReceive, (from, piece, last) -> {
                XdrEncoder args = new XdrEncoder().putInt(link).putInt((int) writeTimeoutMillis)
                        .putInt((int) writeTimeoutMillis).putInt(FLAG_WAITLOCK | (last ? FLAG_END : 0))
                        .putOpaque(data, offset + from, piece);
                XdrDecoder r = call(DEVICE_WRITE, args, writeTimeoutMillis, "device_write");
                if (r == null) {
                    throw new MeterTimeoutException(name + ": the VXI-11 server did not answer device_write within "
                            + (writeTimeoutMillis + RPC_GRACE_MILLIS) + " ms", new byte[0]);
                }
                int error = r.getInt();
                long accepted = r.getUnsignedInt();
                if (error == ERR_TIMEOUT || error == ERR_LOCKED) {
                    throw new MeterTimeoutException(name + ": device_write not accepted within " + writeTimeoutMillis
                            + " ms: " + errorText(error), new byte[0]);
                }
                if (error != 0) {
                    throw fail("device_write failed: " + errorText(error));
                }
                if (accepted > piece) {
                    throw fail("device_write: the server claims " + accepted + " bytes of a " + piece + "-byte piece");
                }
                if (accepted == 0 && piece > 0) {
                    throw fail("device_write: the server accepted none of a " + piece + "-byte piece");
                }
                return (int) accepted;
            });
        } catch (XdrDecoder.XdrException e) {
            throw fail("malformed device_write reply: " + e.getMessage());
        } finally {
            busy.unlock();
        }
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        if (pendingPos < pending.length) {
            return take(buffer, offset, length);
        }
        busy.lock();
        try {
            state.check("read");
            long t = Math.max(1, timeoutMillis);
            Deadline deadline = Deadline.after(t);
            while (true) {
                XdrEncoder args = new XdrEncoder().putInt(link).putInt(readBytes).putInt((int) t).putInt((int) t)
                        .putInt(FLAG_WAITLOCK).putInt(0);
                XdrDecoder r = call(DEVICE_READ, args, t, "device_read");
                if (r == null) {
                    return 0;
                }
                int error = r.getInt();
                r.getInt(); // reason: END, CHR or REQCNT; the SCPI client frames messages by their terminator
                byte[] data = r.getOpaque(readBytes);
                if (error != 0 && error != ERR_TIMEOUT && error != ERR_LOCKED && error != ERR_ABORT) {
                    throw fail("device_read failed: " + errorText(error));
                }
                if (data.length > 0) {
                    pending = data;
                    pendingPos = 0;
                    return take(buffer, offset, length);
                }
                // an empty message, or the device had nothing in time (error 15), was locked by another
                // link beyond the lock timeout (11) or the read was aborted (23)
                t = deadline.millisLeft();
                if (error != 0 || t <= 0) {
                    return 0;
                }
            }
        } catch (XdrDecoder.XdrException e) {
            throw fail("malformed device_read reply: " + e.getMessage());
        } finally {
            busy.unlock();
        }
    }

    private int take(byte[] buffer, int offset, int length) {
        int n = Math.min(length, pending.length - pendingPos);
        System.arraycopy(pending, pendingPos, buffer, offset, n);
        pendingPos += n;
        return n;
    }

    /**
     * Device clear ({@code device_clear}, IEEE 488.2 §5.8 DCL): the device empties its input and
     * output queues; replies not yet read here are discarded too. Blocks up to the write timeout.
     *
     * @throws MeterTimeoutException if the device does not confirm in time
     */
    public void clear() {
        genericCall(DEVICE_CLEAR, "device_clear");
        pending = new byte[0];
        pendingPos = 0;
    }

    /** Device trigger ({@code device_trigger}, the GET of IEEE 488.1). Blocks up to the write timeout. */
    public void trigger() {
        genericCall(DEVICE_TRIGGER, "device_trigger");
    }

    /** The status byte ({@code device_readstb}, IEEE 488.2 §11.2), 0 to 255. Blocks up to the write timeout. */
    public int readStatusByte() {
        return genericCall(DEVICE_READSTB, "device_readstb").getInt() & 0xff;
    }

    /**
     * Locks the device for this link ({@code device_lock}), waiting up to {@code lockTimeout} for
     * another link to release it. While locked, other links' writes and reads wait for their own
     * lock timeout and then fail.
     *
     * @throws MeterTimeoutException if another link held the lock for all of {@code lockTimeout}
     */
    public void lock(Duration lockTimeout) {
        long ms = Math.max(0, lockTimeout.toMillis());
        busy.lock();
        try {
            state.check("lock");
            XdrDecoder r = call(DEVICE_LOCK, new XdrEncoder().putInt(link).putInt(FLAG_WAITLOCK).putInt((int) ms),
                    ms, "device_lock");
            int error = r == null ? ERR_TIMEOUT : r.getInt();
            if (error == ERR_LOCKED || error == ERR_TIMEOUT) {
                throw new MeterTimeoutException(name + ": the device stayed locked by another link for " + ms
                        + " ms (the lock timeout)", new byte[0]);
            }
            if (error != 0) {
                throw fail("device_lock failed: " + errorText(error));
            }
        } finally {
            busy.unlock();
        }
    }

    /**
     * Releases this link's lock ({@code device_unlock}).
     *
     * @return false if this link held no lock
     */
    public boolean unlock() {
        busy.lock();
        try {
            state.check("unlock");
            XdrDecoder r = call(DEVICE_UNLOCK, new XdrEncoder().putInt(link), writeTimeoutMillis, "device_unlock");
            int error = r == null ? ERR_TIMEOUT : r.getInt();
            if (error == ERR_NO_LOCK) {
                return false;
            }
            if (error != 0) {
                throw fail("device_unlock failed: " + errorText(error));
            }
            return true;
        } finally {
            busy.unlock();
        }
    }

    /**
     * Aborts an operation in progress on this link ({@code device_abort} over the abort channel),
     * e.g. a {@link #read} waiting for a slow reply, which then returns 0. Safe to call from another
     * thread; opens the abort channel for the call, waiting up to the connect timeout.
     *
     * @throws ConnectFailedException if the server offers no abort channel or it cannot be reached
     */
    public void abort() {
        if (abortPort == 0) {
            throw new ConnectFailedException(name + ": the VXI-11 server offers no abort channel");
        }
        InetSocketAddress target = new InetSocketAddress(host.getAddress(), abortPort);
        long timeout = Math.max(1, connectTimeout.toMillis());
        try (RpcConnection c = RpcConnection.connect(target, connectTimeout, 1024, Duration.ZERO)) {
            XdrDecoder r = c.awaitReply(c.send(ABORT_PROGRAM, ABORT_VERSION, DEVICE_ABORT, new XdrEncoder().putInt(link)),
                    timeout);
            if (r == null) {
                throw new ConnectFailedException(name + ": the abort channel at " + where(target)
                        + " did not answer within " + timeout + " ms");
            }
            int error = r.getInt();
            if (error != 0) {
                throw new ConnectFailedException(name + ": device_abort failed: " + errorText(error));
            }
        } catch (IOException | RpcConnection.RpcException | XdrDecoder.XdrException e) {
            throw new ConnectFailedException(name + ": cannot use the abort channel at " + where(target) + ": "
                    + e.getMessage(), e);
        }
    }

    private XdrDecoder genericCall(int procedure, String what) {
        busy.lock();
        try {
            state.check(what);
            XdrEncoder args = new XdrEncoder().putInt(link).putInt(FLAG_WAITLOCK).putInt((int) writeTimeoutMillis)
                    .putInt((int) writeTimeoutMillis);
            XdrDecoder r = call(procedure, args, writeTimeoutMillis, what);
            int error = r == null ? ERR_TIMEOUT : r.getInt();
            if (error == ERR_TIMEOUT || error == ERR_LOCKED) {
                throw new MeterTimeoutException(name + ": " + what + " not done within " + writeTimeoutMillis + " ms: "
                        + errorText(error), new byte[0]);
            }
            if (error != 0) {
                throw fail(what + " failed: " + errorText(error));
            }
            return r;
        } catch (XdrDecoder.XdrException e) {
            throw fail("malformed " + what + " reply: " + e.getMessage());
        } finally {
            busy.unlock();
        }
    }

    /** One core-channel call; null if the server did not answer within the timeout and the grace. */
    private XdrDecoder call(int procedure, XdrEncoder args, long timeoutMillis, String what) {
        try {
            return core.awaitReply(core.send(CORE_PROGRAM, CORE_VERSION, procedure, args),
                    timeoutMillis + RPC_GRACE_MILLIS);
        } catch (RpcConnection.RpcException e) {
            throw fail(what + ": " + e.getMessage());
        } catch (IOException e) {
            if (state.closed()) {
                throw new ConnectionLostException(name + ": the connection is closed");
            }
            throw fail("link broke during " + what + ": " + (e.getMessage() == null ? e.toString() : e.getMessage()));
        }
    }

    /** The link is unusable from now on: close it and say why. */
    private ConnectionLostException fail(String why) {
        ConnectionLostException broken = state.broke(why);
        core.close();
        return broken;
    }

    /** Destroys the link (waiting at most half a second for the server) and closes the connection; never throws. */
    @Override
    public void close() {
        if (state.closed()) {
            return;
        }
        // a caller blocked in a read (close from another thread) is released by closing the socket
        if (!state.broken() && busy.tryLock()) {
            try {
                core.awaitReply(core.send(CORE_PROGRAM, CORE_VERSION, DESTROY_LINK, new XdrEncoder().putInt(link)),
                        CLOSE_WAIT_MILLIS);
            } catch (IOException | RuntimeException e) {
                // the link is being abandoned either way
            } finally {
                busy.unlock();
            }
        }
        state.close();
        core.close();
    }

    /** The VXI-11 error code with its meaning (VXI-11 rev. 1.0, Table B.2). */
    static String errorText(int code) {
        String meaning = switch (code) {
            case 0 -> "no error";
            case 1 -> "syntax error";
            case 3 -> "device not accessible";
            case 4 -> "invalid link identifier";
            case 5 -> "parameter error";
            case 6 -> "channel not established";
            case 8 -> "operation not supported";
            case 9 -> "out of resources";
            case 11 -> "device locked by another link";
            case 12 -> "no lock held by this link";
            case 15 -> "I/O timeout";
            case 17 -> "I/O error";
            case 21 -> "invalid address";
            case 23 -> "abort";
            case 29 -> "channel already established";
            default -> "unknown error";
        };
        return "VXI-11 error " + code + " (" + meaning + ")";
    }

    private static String where(InetSocketAddress a) {
        String h = a.getAddress() != null ? a.getAddress().getHostAddress() : a.getHostString();
        return (h.indexOf(':') >= 0 ? "[" + h + "]" : h) + ":" + a.getPort();
    }

    byte[] pendingForTest() {
        return Arrays.copyOfRange(pending, pendingPos, pending.length);
    }
}
