package org.zweep.simulator.hislip;

import java.io.BufferedInputStream;
import java.io.DataInputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicInteger;
import org.zweep.simulator.lan.ResponseEnd;
import org.zweep.simulator.lan.StatusProbe;
import org.zweep.simulator.server.InMemoryConnection;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Serves a {@link SimulatorServer}'s instrument over HiSLIP (IVI-6.1): one port for both channels,
 * the Initialize / AsyncInitialize handshake (sub-address {@code hislip0}), maximum message size
 * negotiation, Data/DataEnd in both directions, Trigger, device clear, the status query and
 * exclusive locks, in synchronized or overlapped mode. Each session is an in-memory connection to
 * the simulator, so the simulator's faults apply (a dropped connection closes both channels).
 *
 * <p>A response is sent as DataEnd when the simulator's reply ends (its newline outside blocks), as
 * Data when part of it has waited 20 ms, and always carries the MessageID of the last message
 * received: the clients wait for each response, so that is the message it answers.
 *
 * <p>Thread-safe; {@link #close()} stops the listener and every session but leaves the simulator running.
 */
public final class HislipServer implements AutoCloseable {
    static final int INITIALIZE = 0;
    static final int INITIALIZE_RESPONSE = 1;
    static final int FATAL_ERROR = 2;
    static final int ERROR = 3;
    static final int ASYNC_LOCK = 4;
    static final int ASYNC_LOCK_RESPONSE = 5;
    static final int DATA = 6;
    static final int DATA_END = 7;
    static final int DEVICE_CLEAR_COMPLETE = 8;
    static final int DEVICE_CLEAR_ACKNOWLEDGE = 9;
    static final int ASYNC_REMOTE_LOCAL_CONTROL = 10;
    static final int ASYNC_REMOTE_LOCAL_RESPONSE = 11;
    static final int TRIGGER = 12;
    static final int ASYNC_MAX_MSG_SIZE = 15;
    static final int ASYNC_MAX_MSG_SIZE_RESPONSE = 16;
    static final int ASYNC_INITIALIZE = 17;
    static final int ASYNC_INITIALIZE_RESPONSE = 18;
    static final int ASYNC_DEVICE_CLEAR = 19;
    static final int ASYNC_STATUS_QUERY = 21;
    static final int ASYNC_STATUS_RESPONSE = 22;
    static final int ASYNC_DEVICE_CLEAR_ACKNOWLEDGE = 23;
    static final int ASYNC_LOCK_INFO = 24;
    static final int ASYNC_LOCK_INFO_RESPONSE = 25;
    static final int SERVER_VERSION = 0x0100;
    static final int VENDOR_ID = ('Z' << 8) | 'W';
    private static final long PARTIAL_REPLY_MILLIS = 20;

    private final SimulatorServer meter;
    private final HislipOptions options;
    private final ServerSocket listener;
    private final Map<Integer, Session> sessions = new ConcurrentHashMap<>();
    private final AtomicInteger nextSession = new AtomicInteger(1);
    private final Object lockMonitor = new Object();
    private Session lockOwner;
    private volatile boolean closed;

    private HislipServer(SimulatorServer meter, HislipOptions options) throws IOException {
        this.meter = meter;
        this.options = options;
        ServerSocket s = new ServerSocket();
        try {
            s.setReuseAddress(true);
            s.bind(new InetSocketAddress(options.listener().bindAddress(), options.listener().port()), 50);
        } catch (IOException e) {
            s.close();
            throw new IOException("cannot listen on " + options.listener().bindAddress().getHostAddress() + ":" + options.listener().port()
                    + " for HiSLIP: " + e.getMessage(), e);
        }
        listener = s;
        Thread t = new Thread(this::acceptLoop, "zweep-sim-hislip-" + s.getLocalPort());
        t.setDaemon(true);
        t.start();
    }

    /**
     * Starts listening; returns once bound.
     *
     * @throws IOException when the port cannot be bound (the message names it)
     */
    public static HislipServer start(SimulatorServer meter, HislipOptions options) throws IOException {
        return new HislipServer(meter, options);
    }

    /** The bound port (the real one when 0 was asked for). */
    public int port() {
        return listener.getLocalPort();
    }

    /** How many sessions are open. */
    public int sessionCount() {
        return sessions.size();
    }

    private void acceptLoop() {
        while (!closed) {
            try {
                Socket s = listener.accept();
                s.setTcpNoDelay(true);
                Thread t = new Thread(() -> serve(s), "zweep-sim-hislip-conn");
                t.setDaemon(true);
                t.start();
            } catch (IOException e) {
                // closed, or one failed accept: go on until closed
            }
        }
    }

    /** The first message says which channel a connection is. */
    private void serve(Socket s) {
        String peer = s.getInetAddress().getHostAddress() + ":" + s.getPort();
        try {
            DataInputStream in = new DataInputStream(new BufferedInputStream(s.getInputStream()));
            OutputStream out = s.getOutputStream();
            Frame first = Frame.read(in, 4096);
            if (first == null) {
                s.close();
                return;
            }
            if (first.type() == INITIALIZE) {
                String sub = new String(first.payload(), StandardCharsets.US_ASCII);
                if (!sub.equalsIgnoreCase("hislip0")) {
                    fatal(out, 3, "no sub-address '" + sub + "' here (this server offers hislip0)");
                    s.close();
                    return;
                }
                int id = nextSession.getAndIncrement() & 0xffff;
                Session session = new Session(id, s, out);
                sessions.put(id, session);
                Frame.write(out, INITIALIZE_RESPONSE, options.overlapped() ? 1 : 0, (SERVER_VERSION << 16) | id,
                        new byte[0], 0, 0);
                options.listener().log().accept("hislip: session " + id + " from " + peer);
                session.serveSync(in);
            } else if (first.type() == ASYNC_INITIALIZE) {
                Session session = sessions.get(first.parameter() & 0xffff);
                if (session == null) {
                    fatal(out, 3, "no session " + (first.parameter() & 0xffff));
                    s.close();
                    return;
                }
                Frame.write(out, ASYNC_INITIALIZE_RESPONSE, 0, VENDOR_ID, new byte[0], 0, 0);
                session.serveAsync(s, in, out);
            } else {
                fatal(out, 3, "the first message must be Initialize or AsyncInitialize, not type " + first.type());
                s.close();
            }
        } catch (IOException e) {
            closeQuietly(s);
        }
    }

    private static void fatal(OutputStream out, int code, String text) throws IOException {
        byte[] t = text.getBytes(StandardCharsets.US_ASCII);
        Frame.write(out, FATAL_ERROR, code, 0, t, 0, t.length);
    }

    private static void closeQuietly(Socket s) {
        if (s == null) {
            return;
        }
        try {
            s.close();
        } catch (IOException e) {
            // closing is best effort
        }
    }

    /** One HiSLIP session: both channels and its connection to the simulator. */
    private final class Session {
        final int id;
        final Socket syncSocket;
        final OutputStream syncOut;
        volatile Socket asyncSocket;
        volatile InMemoryConnection conn;
        volatile int lastMessageId = 0xFFFFFF00;
        volatile long clientMaxBytes = Long.MAX_VALUE;
        volatile int unsentReplyBytes;
        volatile boolean ended;
        final StatusProbe probe;

        Session(int id, Socket syncSocket, OutputStream syncOut) {
            this.id = id;
            this.syncSocket = syncSocket;
            this.syncOut = syncOut;
            this.probe = new StatusProbe(meter);
            startConnection();
        }

        private void startConnection() {
            InMemoryConnection c = meter.connectInMemory();
            conn = c;
            Thread t = new Thread(() -> pump(c), "zweep-sim-hislip-pump-" + id);
            t.setDaemon(true);
            t.start();
        }

        /** Sends the simulator's replies on the synchronous channel. */
        private void pump(InMemoryConnection c) {
            ResponseEnd ends = new ResponseEnd();
            byte[] chunk = new byte[8192];
            byte[] pending = new byte[8192];
            int n = 0;
            try {
                while (true) {
                    int got = c.read(chunk, 0, chunk.length, PARTIAL_REPLY_MILLIS);
                    if (got < 0) {
                        break;
                    }
                    if (got == 0) {
                        if (n > 0) {
                            send(DATA, pending, n);
                            n = 0;
                        }
                        unsentReplyBytes = 0;
                        continue;
                    }
                    for (int i = 0; i < got; i++) {
                        if (n == pending.length) {
                            pending = java.util.Arrays.copyOf(pending, pending.length * 2);
                        }
                        pending[n++] = chunk[i];
                        if (ends.endsAt(chunk[i])) {
                            send(DATA_END, pending, n);
                            n = 0;
                        }
                    }
                    unsentReplyBytes = n;
                }
            } catch (IOException e) {
                // the session is ending
            }
            if (c == conn) {
                end("the simulator closed the connection");
            }
        }

        /** One response piece, split at the client's maximum message size. */
        private void send(int type, byte[] data, int length) throws IOException {
            synchronized (syncOut) {
                int at = 0;
                do {
                    int piece = (int) Math.min(length - at, clientMaxBytes);
                    boolean last = at + piece == length;
                    Frame.write(syncOut, last ? type : DATA, 0, lastMessageId, data, at, piece);
                    at += piece;
                } while (at < length);
            }
        }

        void serveSync(DataInputStream in) {
            try {
                while (!ended) {
                    Frame f;
                    try {
                        f = Frame.read(in, options.maxMessageBytes());
                    } catch (Frame.BadHeader e) {
                        synchronized (syncOut) {
                            fatal(syncOut, 1, e.getMessage());
                        }
                        break;
                    }
                    if (f == null) {
                        break;
                    }
                    switch (f.type()) {
                        case DATA, DATA_END -> {
                            awaitLockFree();
                            lastMessageId = f.parameter();
                            OutputStream o = conn.output();
                            o.write(f.payload());
                            byte[] p = f.payload();
                            if (f.type() == DATA_END && (p.length == 0 || p[p.length - 1] != '\n')) {
                                o.write('\n');
                            }
                            o.flush();
                        }
                        case TRIGGER -> {
                            awaitLockFree();
                            lastMessageId = f.parameter();
                            conn.output().write("*TRG\n".getBytes(StandardCharsets.US_ASCII));
                            conn.output().flush();
                        }
                        case DEVICE_CLEAR_COMPLETE -> {
                            InMemoryConnection old = conn;
                            startConnection();
                            old.close();
                            lastMessageId = 0xFFFFFF00;
                            synchronized (syncOut) {
                                Frame.write(syncOut, DEVICE_CLEAR_ACKNOWLEDGE, options.overlapped() ? 1 : 0, 0,
                                        new byte[0], 0, 0);
                            }
                        }
                        default -> error(syncOut, 1, "message type " + f.type() + " on the synchronous channel");
                    }
                }
            } catch (IOException e) {
                // the client went away, or the simulator dropped the connection
            }
            end("client closed");
        }

        void serveAsync(Socket s, DataInputStream in, OutputStream out) {
            asyncSocket = s;
            try {
                while (!ended) {
                    Frame f = Frame.read(in, 4096);
                    if (f == null) {
                        break;
                    }
                    switch (f.type()) {
                        case ASYNC_MAX_MSG_SIZE -> {
                            if (f.payload().length == 8) {
                                clientMaxBytes = Math.max(1, java.nio.ByteBuffer.wrap(f.payload()).getLong());
                            }
                            byte[] max = java.nio.ByteBuffer.allocate(8).putLong(options.maxMessageBytes()).array();
                            Frame.write(out, ASYNC_MAX_MSG_SIZE_RESPONSE, 0, 0, max, 0, 8);
                        }
                        case ASYNC_LOCK -> Frame.write(out, ASYNC_LOCK_RESPONSE,
                                f.control() == 1 ? lock(f.parameter() & 0xffff_ffffL) : unlock(), 0, new byte[0], 0, 0);
                        case ASYNC_LOCK_INFO -> {
                            boolean held;
                            synchronized (lockMonitor) {
                                held = lockOwner != null;
                            }
                            Frame.write(out, ASYNC_LOCK_INFO_RESPONSE, held ? 1 : 0, held ? 1 : 0, new byte[0], 0, 0);
                        }
                        case ASYNC_STATUS_QUERY -> {
                            int stb = probe.statusByte(5000);
                            if (unsentReplyBytes > 0) {
                                stb |= 0x10;
                            }
                            Frame.write(out, ASYNC_STATUS_RESPONSE, Math.max(0, stb), 0, new byte[0], 0, 0);
                        }
                        case ASYNC_DEVICE_CLEAR -> Frame.write(out, ASYNC_DEVICE_CLEAR_ACKNOWLEDGE,
                                options.overlapped() ? 1 : 0, 0, new byte[0], 0, 0);
                        case ASYNC_REMOTE_LOCAL_CONTROL -> Frame.write(out, ASYNC_REMOTE_LOCAL_RESPONSE, 0, 0,
                                new byte[0], 0, 0);
                        default -> error(out, 1, "message type " + f.type() + " on the asynchronous channel");
                    }
                }
            } catch (IOException e) {
                // the client went away
            }
            end("client closed");
        }

        private void error(OutputStream out, int code, String text) throws IOException {
            byte[] t = text.getBytes(StandardCharsets.US_ASCII);
            synchronized (out) {
                Frame.write(out, ERROR, code, 0, t, 0, t.length);
            }
        }

        /** AsyncLockResponse control code: 1 granted, 0 not within the timeout. */
        private int lock(long timeoutMillis) {
            synchronized (lockMonitor) {
                long deadline = System.nanoTime() + timeoutMillis * 1_000_000L;
                while (lockOwner != null && lockOwner != this) {
                    long left = deadline - System.nanoTime();
                    if (left <= 0) {
                        return 0;
                    }
                    try {
                        // rounded up: a wait cut to whole milliseconds refused up to 1 ms before the timeout
                        lockMonitor.wait((left + 999_999L) / 1_000_000L);
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                        return 0;
                    }
                }
                lockOwner = this;
                return 1;
            }
        }

        /** AsyncLockResponse control code: 1 released, 3 this session held no lock. */
        private int unlock() {
            synchronized (lockMonitor) {
                if (lockOwner != this) {
                    return 3;
                }
                lockOwner = null;
                lockMonitor.notifyAll();
                return 1;
            }
        }

        /** Holds this session's messages while another session holds the lock. */
        private void awaitLockFree() throws IOException {
            synchronized (lockMonitor) {
                while (lockOwner != null && lockOwner != this && !ended) {
                    try {
                        lockMonitor.wait(100);
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                        throw new java.io.InterruptedIOException("stopped while waiting for the lock");
                    }
                }
            }
        }

        void end(String why) {
            synchronized (this) {
                if (ended) {
                    return;
                }
                ended = true;
            }
            sessions.remove(id);
            unlock();
            closeQuietly(syncSocket);
            closeQuietly(asyncSocket);
            conn.close();
            probe.close();
            options.listener().log().accept("hislip: session " + id + " closed (" + why + ")");
        }
    }

    /** Stops listening and ends every session; the simulator keeps running. */
    @Override
    public void close() {
        closed = true;
        try {
            listener.close();
        } catch (IOException e) {
            // closing is best effort
        }
        for (Session s : List.copyOf(sessions.values())) {
            s.end("server stopped");
        }
    }
}
