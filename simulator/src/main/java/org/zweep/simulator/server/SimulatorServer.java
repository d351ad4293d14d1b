package org.zweep.simulator.server;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.ByteBuffer;
import java.nio.channels.SelectionKey;
import java.nio.channels.Selector;
import java.nio.channels.ServerSocketChannel;
import java.nio.channels.SocketChannel;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Set;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.SynchronousQueue;
import java.util.concurrent.ThreadPoolExecutor;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.MessageFramer;

/**
 * The simulated meter behind a raw-socket SCPI server (IEEE 488.2 over TCP, LF-terminated) and
 * in-memory connections.
 *
 * <p>State model: one {@link Instrument} (settings, measurement data, status registers, error
 * queue) is shared by every connection, as on a real meter with several remote clients; each
 * connection has its own parser and header path, output queue, strictness
 * and faults. One selector thread accepts TCP connections and holds each without a thread until
 * its first message has arrived whole; from then on a connection is served by its own reader and
 * writer threads, so a slow, silent or non-reading client never blocks another (a connection's
 * first few replies go out from its reader, before it has a writer). TCP connections are capped
 * ({@link ServerOptions#maxConnections()}): one more is told why in one line and closed.
 *
 * <p>Thread-safe. {@link #close()} stops accepting, closes every connection and stops the meter.
 */
public final class SimulatorServer implements AutoCloseable {
    private static final int PIPE_BYTES = 1 << 16;

    private final ServerOptions options;
    private final Instrument instrument;
    private final ServerSocket listener;
    /** The listener's channel, non-blocking, on {@link #selector}. */
    private final ServerSocketChannel listenerChannel;
    /** Accepting and the connections that have not sent their first message yet (see {@link #selectLoop()}). */
    private final Selector selector;
    /** Starts another selector thread when the selector thread executes a message for too long. */
    private final java.util.concurrent.ScheduledThreadPoolExecutor watchdog;
    private final Set<ClientConnection> connections = ConcurrentHashMap.newKeySet();
    private final AtomicLong ids = new AtomicLong();
    /** TCP connections taken from the backlog, refused ones included. */
    private final AtomicLong tcpHandled = new AtomicLong();
    /** Bytes in all connections' output queues. */
    private final AtomicLong outputBytes = new AtomicLong();
    private final ExecutorService refusals;
    /**
     * The threads that read and write the connections, kept for a while when idle: a burst of new
     * connections then reuses threads instead of waiting for new ones to be created, which on a
     * busy machine held a fresh client's first reply up for 50–450 ms.
     */
    private final ThreadPoolExecutor connectionThreads = new ThreadPoolExecutor(0, Integer.MAX_VALUE,
            CONNECTION_THREAD_KEEP_ALIVE_SECONDS, TimeUnit.SECONDS, new SynchronousQueue<>(), r -> {
                Thread t = new Thread(r, "zweep-sim-idle");
                t.setDaemon(true);
                return t;
            });
    private final Turns turns = new Turns(Math.max(1, Runtime.getRuntime().availableProcessors()));
    private volatile boolean closed;

    /** How long a connection thread with nothing to do is kept for the next connection. */
    static final long CONNECTION_THREAD_KEEP_ALIVE_SECONDS = 5;

    private SimulatorServer(Bench bench, ServerOptions options) throws IOException {
        this.options = options;
        this.instrument = new Instrument(bench, options.instrument(), FaultCommands::register);
        if (options.tcp()) {
            ServerSocketChannel ch = ServerSocketChannel.open();
            ServerSocket s = ch.socket();
            try {
                s.setReuseAddress(true);
                // a burst of up to the cap waits in the kernel; a full backlog drops SYNs and costs a client 1 s
                s.bind(new InetSocketAddress(options.bindAddress(), options.port()), Math.max(50, options.maxConnections() + 16));
            } catch (IOException e) {
                s.close();
                instrument.close();
                throw new IOException("cannot listen on " + options.bindAddress().getHostAddress() + ":" + options.port()
                        + ": " + e.getMessage(), e);
            }
            this.listener = s;
            this.listenerChannel = ch;
            this.refusals = new ThreadPoolExecutor(1, 1, 1, TimeUnit.SECONDS, new ArrayBlockingQueue<>(64), r -> {
                Thread t = new Thread(r, "zweep-sim-refuse-" + s.getLocalPort());
                t.setDaemon(true);
                return t;
            }, (r, pool) -> ((Refusal) r).close());
            ((ThreadPoolExecutor) refusals).allowCoreThreadTimeOut(true);
            try {
                this.selector = Selector.open();
                ch.configureBlocking(false);
                ch.register(selector, SelectionKey.OP_ACCEPT);
            } catch (IOException e) {
                s.close();
                instrument.close();
                throw new IOException("cannot listen on " + options.bindAddress().getHostAddress() + ":" + options.port()
                        + ": " + e.getMessage(), e);
            }
            this.watchdog = new java.util.concurrent.ScheduledThreadPoolExecutor(1, r -> {
                Thread t = new Thread(r, "zweep-sim-watch-" + s.getLocalPort());
                t.setDaemon(true);
                return t;
            });
            watchdog.setRemoveOnCancelPolicy(true);
            watchdog.setKeepAliveTime(1, TimeUnit.SECONDS);
            watchdog.allowCoreThreadTimeOut(true);
            startThread(selectorName(), this::selectLoop);
        } else {
            this.watchdog = null;
            this.listener = null;
            this.listenerChannel = null;
            this.selector = null;
            this.refusals = null;
        }
    }

    /**
     * Starts a server for {@code bench}; returns once the TCP listener (if any) is bound.
     *
     * @throws IOException when the address cannot be bound (the message names it)
     */
    public static SimulatorServer start(Bench bench, ServerOptions options) throws IOException {
        return new SimulatorServer(bench, options);
    }

    /** The bound TCP port (the real one when 0 was asked for); -1 without a TCP listener. */
    public int port() {
        return listener == null ? -1 : listener.getLocalPort();
    }

    /** The bound TCP address, or {@code null} without a TCP listener. */
    public InetSocketAddress address() {
        return listener == null ? null : (InetSocketAddress) listener.getLocalSocketAddress();
    }

    /** The meter all connections share. */
    public Instrument instrument() {
        return instrument;
    }

    ServerOptions options() {
        return options;
    }

    /** How many TCP connections were taken from the listener's backlog so far, refused ones included. */
    long tcpConnectionsHandled() {
        return tcpHandled.get();
    }

    /** How many connections are open now. */
    public int connectionCount() {
        return connections.size();
    }

    /**
     * Opens an in-process connection served exactly like a TCP one (same faults, same state).
     *
     * @throws IllegalStateException after {@link #close()}
     */
    public InMemoryConnection connectInMemory() {
        if (closed) {
            throw new IllegalStateException("simulator server is closed");
        }
        BytePipe toServer = new BytePipe(PIPE_BYTES);
        BytePipe toClient = new BytePipe(PIPE_BYTES);
        Link link = new Link() {
            @Override
            public InputStream input() {
                return toServer.input;
            }

            @Override
            public OutputStream output() {
                return toClient.output;
            }

            @Override
            public void setReadTimeoutMillis(int ms) {
                toServer.setReadTimeoutMillis(ms);
            }

            @Override
            public void close() {
                toServer.close();
                toClient.close();
            }

            @Override
            public String peer() {
                return "in-memory";
            }
        };
        ClientConnection c = new ClientConnection(this, ids.incrementAndGet(), link, options.faults());
        toClient.setOnBlockedRead(() -> c.onClientBlockedRead(toServer));
        serve(c);
        return new InMemoryConnection(toServer, toClient);
    }

    private String selectorName() {
        return "zweep-sim-select-" + listener.getLocalPort();
    }

    /**
     * The selector thread: accepts connections and holds each, without a thread of its own, until
     * its first message has arrived whole (an LF; or {@value #FIRST_BYTES} bytes): idle and
     * half-sent connections cost no thread, and a burst of them makes no threads runnable. A
     * client that sent one message and waits for its reply (the usual new client) has that message
     * executed and answered by this thread: its answer waits for no other thread to be woken (that
     * hand-off was the longest wait left for a new client while others flooded the server), and
     * its connection then waits here again, without a thread, for its next message. Should the
     * execution take longer than {@value #INLINE_LIMIT_MS} ms (a message that waits for a
     * measurement or a trigger), another thread takes over selecting and this one stays with the
     * connection. A connection that sends more than one message at once (or whose reply or faults
     * need a thread) gets a connection thread from then on ({@link ClientConnection#run()}).
     */
    private void selectLoop() {
        ByteBuffer buffer = ByteBuffer.allocate(FIRST_BYTES);
        List<Arrival> ready = new ArrayList<>();
        while (!closed) {
            try {
                selector.select();
                for (Iterator<SelectionKey> it = selector.selectedKeys().iterator(); it.hasNext();) {
                    SelectionKey k = it.next();
                    it.remove();
                    if (!k.isValid()) {
                        continue;
                    }
                    if (k.isAcceptable()) {
                        for (SocketChannel ch = acceptWaiting(); ch != null; ch = acceptWaiting()) {
                            Arrival a = admit(ch);
                            if (a == null) {
                                continue;
                            }
                            if (a.firstMessage(buffer)) {
                                ready.add(a); // never registered
                            } else if (!a.connection.isClosed()) {
                                a.register();
                            }
                        }
                    } else if (k.isReadable() && k.attachment() instanceof Arrival a && a.firstMessage(buffer)) {
                        k.cancel();
                        ready.add(a);
                    }
                }
                if (ready.isEmpty()) {
                    continue;
                }
                selector.selectNow(); // deregisters the cancelled keys: their channels may block again
                for (int i = 0; i < ready.size(); i++) {
                    Arrival a = ready.get(i);
                    if (!a.toBlocking()) {
                        continue;
                    }
                    if (!a.waitsForReply()) {
                        startThread("zweep-sim-conn-" + a.connection.id(), a.connection::run);
                    } else if (!executeHere(a)) {
                        // another thread selects now: this one serves the rest found, then stays with a's connection
                        for (Arrival b : ready.subList(i + 1, ready.size())) {
                            if (b.toBlocking()) {
                                startThread("zweep-sim-conn-" + b.connection.id(), b.connection::run);
                            }
                        }
                        ready.clear();
                        Thread.currentThread().setName("zweep-sim-conn-" + a.connection.id());
                        a.connection.run();
                        return;
                    }
                }
                ready.clear();
            } catch (java.nio.channels.ClosedSelectorException e) {
                return;
            } catch (IOException e) {
                if (!closed) {
                    log("accepting connections failed: " + e.getMessage());
                }
            }
        }
    }

    /**
     * Executes {@code a}'s message on this thread, then puts the connection back on the selector
     * (or gives it a thread of its own). If that takes longer than {@value #INLINE_LIMIT_MS} ms, a
     * new thread takes over selecting.
     *
     * @return whether this thread is still the selector thread (false: it is to go on with the connection)
     */
    private boolean executeHere(Arrival a) {
        java.util.concurrent.atomic.AtomicBoolean settled = new java.util.concurrent.atomic.AtomicBoolean();
        java.util.concurrent.ScheduledFuture<?> takeover = watchdog.schedule(() -> {
            if (settled.compareAndSet(false, true)) {
                startThread(selectorName(), this::selectLoop);
            }
        }, INLINE_LIMIT_MS, TimeUnit.MILLISECONDS);
        boolean open = a.connection.executeArrived();
        if (!settled.compareAndSet(false, true)) {
            return false;
        }
        takeover.cancel(false);
        if (open && a.connection.mayWaitWithoutThread()) {
            a.waitForNext();
        } else if (open) {
            startThread("zweep-sim-conn-" + a.connection.id(), a.connection::run);
        }
        return true;
    }

    /** How long the selector thread executes a new client's message before another takes over selecting. */
    static final long INLINE_LIMIT_MS = 5;

    /** The most a connection sends before it gets a thread: its first message, or this much of it. */
    static final int FIRST_BYTES = MessageFramer.PRELOAD_BYTES;

    /**
     * A TCP connection before it has a thread: its channel and the bytes it sent so far (guarded by
     * the selector thread, then handed to the connection's thread with the connection).
     */
    private final class Arrival {
        final SocketChannel channel;
        final ClientConnection connection;
        /** The bytes read so far (allocated with the first of them: an idle connection holds none). */
        byte[] bytes;
        int length;

        Arrival(SocketChannel channel) throws IOException {
            this.channel = channel;
            this.connection = new ClientConnection(SimulatorServer.this, ids.incrementAndGet(),
                    socketLink(channel.socket()), options.faults());
        }

        /**
         * Reads what the client sent without blocking: whether the connection is to get its thread
         * now (its first message is whole, or {@link #FIRST_BYTES} bytes of it are here). A client
         * that closes with only part of a message sent is closed here.
         */
        boolean firstMessage(ByteBuffer buffer) {
            if (connection.isClosed()) {
                return false;
            }
            try {
                buffer.clear().limit(FIRST_BYTES - length);
                int n = channel.read(buffer);
                if (n < 0) {
                    connection.close("client closed"); // a partial first message is dropped
                    return false;
                }
                if (n == 0) {
                    return false;
                }
                if (bytes == null) {
                    bytes = new byte[FIRST_BYTES];
                }
                buffer.flip().get(bytes, length, n);
                length += n;
                for (int i = length - n; i < length; i++) {
                    if (bytes[i] == '\n') {
                        return true;
                    }
                }
                return length >= FIRST_BYTES;
            } catch (IOException e) {
                connection.close("connection lost: " + e.getMessage());
                return false;
            }
        }

        /** Whether the client sent one message and nothing after it: it waits for the reply. */
        boolean waitsForReply() {
            if (length == 0 || bytes[length - 1] != '\n') {
                return false;
            }
            for (int i = 0; i < length - 1; i++) {
                if (bytes[i] == '\n') {
                    return false;
                }
            }
            return true;
        }

        /** Waits on the selector again, without a thread, for the connection's next message. */
        void waitForNext() {
            length = 0;
            try {
                channel.configureBlocking(false);
            } catch (IOException e) {
                connection.close("connection lost: " + e.getMessage());
                return;
            }
            register();
        }

        /** Waits on the selector for the first message. */
        void register() {
            try {
                channel.register(selector, SelectionKey.OP_READ, this);
            } catch (IOException e) {
                connection.close("cannot set up connection: " + e.getMessage()); // closed meanwhile
            }
        }

        /**
         * Puts the channel back in blocking mode (it is no longer on the selector) and gives the
         * connection the bytes read; false if the connection closed meanwhile.
         */
        boolean toBlocking() {
            try {
                channel.configureBlocking(true);
            } catch (IOException | java.nio.channels.IllegalBlockingModeException e) {
                connection.close("cannot set up connection: " + e.getMessage());
                return false;
            }
            if (bytes != null) {
                connection.preload(bytes, length);
            }
            return true;
        }
    }

    /** The next connection of the backlog, or null when none is waiting (or the listener failed). */
    private SocketChannel acceptWaiting() {
        try {
            return listenerChannel.accept();
        } catch (IOException e) {
            if (!closed) {
                log("accept failed: " + e.getMessage());
            }
            return null;
        }
    }

    /**
     * The arrival of {@code ch}'s connection (counted as open from now), its channel non-blocking;
     * null when it was refused (the cap), could not be set up, or got its thread at once (a
     * connection with an idle-time fault: its reads measure its idle time).
     */
    private Arrival admit(SocketChannel ch) {
        tcpHandled.incrementAndGet();
        Socket s = ch.socket();
        if (connections.size() >= options.maxConnections()) {
            refuse(s);
            return null;
        }
        try {
            s.setTcpNoDelay(true);
            Arrival a = new Arrival(ch);
            ClientConnection c = a.connection;
            connections.add(c);
            if (closed) {
                c.close("server stopped");
                return null;
            }
            if (c.faults().idleLimit() != null) {
                startThread("zweep-sim-conn-" + c.id(), c::run); // its reads measure its idle time
                return null;
            }
            ch.configureBlocking(false);
            return a;
        } catch (IOException e) {
            log("cannot set up connection: " + e.getMessage());
            closeQuietly(s);
            return null;
        }
    }

    /** Says why on the refused socket, then closes it once the client has had time to read that. */
    private record Refusal(Socket socket, String line) implements Runnable {
        @Override
        public void run() {
            try (Socket s = socket) {
                s.setSoTimeout(200);
                s.getOutputStream().write(line.getBytes(StandardCharsets.US_ASCII));
                s.shutdownOutput();
                InputStream in = s.getInputStream();
                byte[] sink = new byte[4096];
                long end = System.nanoTime() + 200_000_000L;
                while (System.nanoTime() < end && in.read(sink) >= 0) {
                    // drain what the client sent, so closing does not reset the line away
                }
            } catch (IOException e) {
                // the client went away first: nothing to tell
            }
        }

        void close() {
            closeQuietly(socket);
        }
    }

    private void refuse(Socket s) {
        String why = "connection refused: " + options.maxConnections() + " connections are open, the simulator's limit";
        log(why + " (from " + s.getInetAddress().getHostAddress() + ":" + s.getPort() + ")");
        refusals.execute(new Refusal(s, "zweep sim: " + why + "\n"));
    }

    /** Counts {@code n} bytes into the output total unconditionally (a reply into an empty queue). */
    void takeOutput(long n) {
        outputBytes.addAndGet(n);
    }

    /** Counts {@code n} bytes into the output total if the total stays within its limit. */
    boolean tryTakeOutput(long n) {
        long now;
        do {
            now = outputBytes.get();
            if (now + n > options.maxTotalOutputBytes()) {
                return false;
            }
        } while (!outputBytes.compareAndSet(now, now + n));
        return true;
    }

    /** Returns {@code n} bytes to the output total. */
    void giveOutput(long n) {
        outputBytes.addAndGet(-n);
    }

    /** Bytes held in all connections' output queues now. */
    public long outputQueueBytes() {
        return outputBytes.get();
    }

    private static Link socketLink(Socket s) throws IOException {
        OutputStream out = s.getOutputStream();
        String peer = s.getInetAddress().getHostAddress() + ":" + s.getPort();
        return new Link() {
            private InputStream in;

            @Override
            public synchronized InputStream input() {
                if (in == null) {
                    try {
                        in = s.getInputStream();
                    } catch (IOException e) {
                        throw new java.io.UncheckedIOException(e);
                    }
                }
                return in;
            }

            @Override
            public OutputStream output() {
                return out;
            }

            @Override
            public void setReadTimeoutMillis(int ms) throws IOException {
                s.setSoTimeout(ms);
            }

            @Override
            public void close() {
                closeQuietly(s);
            }

            @Override
            public String peer() {
                return peer;
            }
        };
    }

    private void serve(ClientConnection c) {
        connections.add(c);
        if (closed) {
            c.close("server stopped");
            return;
        }
        startThread("zweep-sim-conn-" + c.id(), c::run);
    }

    /**
     * Waits for a turn to execute one message. Turns are handed out as many at once as the machine
     * has processors, first to messages whose client waits for the reply (nothing more from it is
     * buffered), then to those of clients that stream messages, each in arrival order; streaming
     * messages hold at most all turns but one: a flood of messages on some connections waits its
     * turn instead of crowding the processors, a processor stays for accepting and reading, and a
     * new client's message waits behind at most one message per turn. A message whose turn has not
     * come within {@value #TURN_WAIT_MS} ms runs without one, so messages that block (a measurement,
     * {@code *WAI} for a trigger another client sends) can never hold the others up for longer.
     *
     * @param waitingClient whether the client has sent nothing after this message yet
     * @return whether a turn was taken (to be given back with {@link #endTurn(boolean, boolean)})
     */
    boolean takeTurn(boolean waitingClient) {
        return turns.take(waitingClient, TURN_WAIT_MS * 1_000_000L);
    }

    /** Gives back the turn {@link #takeTurn(boolean)} took, if it took one. */
    void endTurn(boolean taken, boolean waitingClient) {
        if (taken) {
            turns.give(waitingClient);
        }
    }

    /** The longest wait for a turn. */
    static final long TURN_WAIT_MS = 50;

    /**
     * Runs {@code task} on a connection thread named {@code name}; the thread goes back to the pool
     * with its interrupt status cleared when the task ends.
     */
    void startThread(String name, Runnable task) {
        connectionThreads.execute(() -> {
            Thread t = Thread.currentThread();
            t.setName(name);
            try {
                task.run();
            } finally {
                Thread.interrupted();
                t.setName("zweep-sim-idle");
            }
        });
    }

    void closed(ClientConnection c) {
        connections.remove(c);
    }

    void log(String line) {
        options.log().accept(line);
    }

    private static void closeQuietly(Socket s) {
        try {
            s.close();
        } catch (IOException e) {
            // closing is best effort
        }
    }

    /** Stops accepting, closes every connection, stops the meter; never throws. */
    @Override
    public void close() {
        if (closed) {
            return;
        }
        closed = true;
        if (listener != null) {
            try {
                listener.close();
                selector.close();
            } catch (IOException e) {
                // closing is best effort
            }
        }
        for (ClientConnection c : connections) {
            c.close("server stopped");
        }
        if (refusals != null) {
            refusals.shutdownNow();
            watchdog.shutdownNow();
        }
        connectionThreads.shutdown();
        instrument.close();
    }
}
