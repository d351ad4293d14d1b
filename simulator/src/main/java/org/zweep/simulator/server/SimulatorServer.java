package org.zweep.simulator.server;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.channels.ServerSocketChannel;
import java.nio.channels.SocketChannel;
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

/**
 * The simulated meter behind a raw-socket SCPI server (IEEE 488.2 over TCP, LF-terminated) and
 * in-memory connections.
 *
 * <p>State model: one {@link Instrument} (settings, measurement data, status registers, error
 * queue) is shared by every connection, as on a real meter with several remote clients; each
 * connection has its own parser and header path, output queue, strictness
 * and faults. Each connection is served by its own reader and writer threads, so a slow, silent
 * or non-reading client never blocks another (a new connection's first few replies go out from its
 * reader, before it has a writer). TCP connections are capped
 * ({@link ServerOptions#maxConnections()}): one more is told why in one line and closed.
 *
 * <p>Thread-safe. {@link #close()} stops accepting, closes every connection and stops the meter.
 */
public final class SimulatorServer implements AutoCloseable {
    private static final int PIPE_BYTES = 1 << 16;

    private final ServerOptions options;
    private final Instrument instrument;
    private final ServerSocket listener;
    /** The listener's channel: accepts without blocking when the backlog is to be drained. */
    private final ServerSocketChannel listenerChannel;
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
            startThread(acceptorName(), this::acceptLoop);
        } else {
            this.listener = null;
            this.listenerChannel = null;
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

    private String acceptorName() {
        return "zweep-sim-accept-" + listener.getLocalPort();
    }

    /**
     * Accepts connections. When a connection arrives alone (nothing more in the backlog), this
     * thread serves it itself and another takes over accepting: a new client's first message then
     * waits for no hand-off between threads. A burst is set up for connection threads one by one,
     * and the last of it served here.
     */
    private void acceptLoop() {
        while (!closed) {
            ClientConnection here = null;
            try {
                SocketChannel s = listenerChannel.accept();
                for (SocketChannel next = acceptWaiting(); next != null; next = acceptWaiting()) {
                    ClientConnection c = admit(s);
                    if (c != null) {
                        serve(c);
                    }
                    s = next;
                }
                here = admit(s);
            } catch (IOException e) {
                if (!closed) {
                    log("accept failed: " + e.getMessage());
                }
                continue;
            }
            if (here != null) {
                connections.add(here);
                if (closed) {
                    here.close("server stopped");
                    return;
                }
                startThread(acceptorName(), this::acceptLoop);
                Thread.currentThread().setName("zweep-sim-conn-" + here.id());
                here.run();
                return;
            }
        }
    }

    /** The next connection of the backlog, or null when none is waiting (or the listener failed). */
    private SocketChannel acceptWaiting() {
        try {
            listenerChannel.configureBlocking(false);
            try {
                return listenerChannel.accept();
            } finally {
                listenerChannel.configureBlocking(true);
            }
        } catch (IOException e) {
            return null; // the blocking accept that follows reports it
        }
    }

    /** The connection for {@code ch}, or null when it was refused (the cap) or could not be set up. */
    private ClientConnection admit(SocketChannel ch) {
        tcpHandled.incrementAndGet();
        Socket s = ch.socket();
        if (connections.size() >= options.maxConnections()) {
            refuse(s);
            return null;
        }
        try {
            s.setTcpNoDelay(true);
            return new ClientConnection(this, ids.incrementAndGet(), socketLink(s), options.faults());
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
        InputStream in = s.getInputStream();
        OutputStream out = s.getOutputStream();
        String peer = s.getInetAddress().getHostAddress() + ":" + s.getPort();
        return new Link() {
            @Override
            public InputStream input() {
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
            } catch (IOException e) {
                // closing is best effort
            }
        }
        for (ClientConnection c : connections) {
            c.close("server stopped");
        }
        if (refusals != null) {
            refusals.shutdownNow();
        }
        connectionThreads.shutdown();
        instrument.close();
    }
}
