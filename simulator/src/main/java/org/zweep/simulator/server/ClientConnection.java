package org.zweep.simulator.server;

import java.io.IOException;
import java.io.InterruptedIOException;
import java.io.OutputStream;
import java.net.SocketTimeoutException;
import java.time.Duration;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.Random;
import org.zweep.simulator.scpi.MessageFramer;
import org.zweep.simulator.scpi.Session;
import org.zweep.simulator.scpi.StandardError;

/**
 * One client connection: a reader thread that frames and executes messages in order, and a writer
 * thread that sends the replies from the connection's output queue (IEEE 488.2 §6.1.10), so the
 * reader never blocks on a client that does not read. The queue is bounded per connection and
 * across the server; a reply that does not fit is a deadlock in IEEE 488.2's sense (§6.3.1.7):
 * the queue is cleared, the reply discarded and {@code -430 Query DEADLOCKED} reported, and the
 * connection reads on. A reply always fits an empty queue, whatever its size. The first replies
 * (up to {@link #DIRECT_WRITE_BYTES}) are written by the reader itself: a new client's answer waits
 * for no other thread.
 */
final class ClientConnection implements Session.Hooks {
    private final SimulatorServer server;
    private final long id;
    private final Link link;
    private final ConnectionFaults faults;
    private final Session session;
    /** The output queue; guarded by {@code this}. */
    private final Deque<Pending> queue = new ArrayDeque<>();
    /** The entry the writer is sending now, or null; guarded by {@code this}. */
    private Pending writing;
    /** Bytes in the queue and in {@link #writing}; guarded by {@code this}. */
    private long queuedBytes;
    private boolean writerStarted; // guarded by this
    /** Bytes sent from the reader thread (see {@link #DIRECT_WRITE_BYTES}); guarded by {@code this}. */
    private long directBytes;
    /** The thread running {@link #run()}, null before and after; guarded by {@code this}. */
    private Thread readerThread;
    private volatile boolean stalled;
    private volatile boolean closed;
    private long messages;
    /** The reader's framer; used by the reader thread only. */
    private MessageFramer framer;
    /** A turn kept for the next message of a streaming client (see {@link #BATCH_MESSAGES}); reader only. */
    private boolean heldTurn;
    private boolean heldTurnWaiting;
    private int heldMessages;
    private long heldSinceNanos;
    private long replies;
    private String closeReason = "client closed";

    ClientConnection(SimulatorServer server, long id, Link link, FaultPlan plan) {
        this.server = server;
        this.id = id;
        this.link = link;
        this.faults = new ConnectionFaults(plan, id);
        this.session = server.instrument().openSession(this);
        session.attach(this);
    }

    long id() {
        return id;
    }

    ConnectionFaults faults() {
        return faults;
    }

    /** The number of the exchange being executed now. */
    long messageNumber() {
        return messages;
    }

    /** The number of the last reply. */
    long replyNumber() {
        return replies;
    }

    Session session() {
        return session;
    }

    /** Runs the reader loop on the calling thread until the connection ends. */
    void run() {
        synchronized (this) {
            readerThread = Thread.currentThread();
        }
        server.log("connection " + id + " from " + link.peer() + " opened");
        framer = new MessageFramer(link.input(), server.options().maxMessageBytes());
        try {
            int timeoutMs = 0;
            while (!closed) {
                Duration idle = faults.idleLimit();
                int wanted = idle == null ? 0 : (int) Math.max(1, Math.min(Integer.MAX_VALUE, idle.toMillis()));
                if (wanted != timeoutMs) {
                    link.setReadTimeoutMillis(wanted);
                    timeoutMs = wanted;
                }
                if (heldTurn && !framer.messageBuffered()) {
                    giveTurn(); // never wait for input with a turn
                }
                MessageFramer.Message m;
                try {
                    m = framer.next();
                } catch (SocketTimeoutException e) {
                    if (faults.idleLimit() != null) {
                        closeReason = "fault: idle for " + idle.toMillis() + " ms";
                        break;
                    }
                    continue;
                }
                if (m == null) {
                    break;
                }
                if (stalled) {
                    continue;
                }
                if (m.overrun()) {
                    session.report(StandardError.INPUT_BUFFER_OVERRUN,
                            "message longer than " + server.options().maxMessageBytes() + " bytes");
                    continue;
                }
                exchange(m.bytes(), !framer.buffered());
            }
        } catch (InterruptedIOException e) {
            closeReason = "server stopped";
        } catch (IOException e) {
            if (!closed) {
                closeReason = "connection lost: " + e.getMessage();
            }
        } catch (RuntimeException e) {
            // a bug of ours: one log line and this connection closed, never a stack trace or the server
            closeReason = "internal error: " + e;
        } finally {
            if (heldTurn) {
                giveTurn();
            }
            close(closeReason);
            synchronized (this) {
                // the thread goes back to the pool: no interrupt meant for this connection may reach it
                readerThread = null;
                Thread.interrupted();
            }
        }
    }

    private void exchange(byte[] message, boolean waitingClient) throws IOException {
        messages++;
        if (heldTurn && session.strict()) {
            giveTurn(); // the check below may wait for the writer
        }
        if (session.strict() && outputPendingAfterPlainWrites()) {
            clearOutput();
            session.report(StandardError.QUERY_INTERRUPTED, "a new message arrived before the reply was sent");
        }
        for (Fault f : faults.at(Phase.RECEIVE, messages)) {
            if (f instanceof Fault.PushError p) {
                session.report(p.code(), p.text());
            } else if (f instanceof Fault.Drop) {
                drop("fault: drop on receiving message " + messages);
                return;
            } else if (f instanceof Fault.Stall) {
                stall("message " + messages);
                return;
            }
        }
        byte[] reply;
        if (!heldTurn && server.takeTurn(waitingClient)) {
            heldTurn = true;
            heldTurnWaiting = waitingClient;
            heldMessages = 0;
            heldSinceNanos = System.nanoTime();
        }
        try {
            reply = session.execute(message);
        } finally {
            if (heldTurn && (heldTurnWaiting || ++heldMessages >= BATCH_MESSAGES
                    || System.nanoTime() - heldSinceNanos >= BATCH_NANOS || !framer.messageBuffered())) {
                giveTurn();
            }
        }
        if (closed) {
            return;
        }
        if (reply != null) {
            replies++;
            Duration delay = Duration.ZERO;
            Fault.Fragment fragment = null;
            boolean terminator = true;
            for (Fault f : faults.at(Phase.REPLY, replies)) {
                if (f instanceof Fault.Drop) {
                    drop("fault: drop instead of reply " + replies);
                    return;
                } else if (f instanceof Fault.Stall) {
                    stall("reply " + replies);
                    return;
                } else if (f instanceof Fault.Delay d) {
                    delay = delay.plus(d.delay());
                } else if (f instanceof Fault.Fragment fr) {
                    fragment = fr;
                } else if (f instanceof Fault.OmitTerminator) {
                    terminator = false;
                } else if (f instanceof Fault.Garble g) {
                    garble(reply, g.seed() ^ (replies * 0x9E3779B97F4A7C15L));
                }
            }
            byte[] out = terminator ? reply : java.util.Arrays.copyOf(reply, reply.length - 1);
            send(out, delay, fragment);
        }
        for (Fault f : faults.at(Phase.COMPLETE, messages)) {
            if (f instanceof Fault.Drop) {
                String why = "fault: drop after message " + messages;
                enqueue(new Pending(null, Duration.ZERO, null, () -> drop(why)));
                return;
            }
        }
    }

    /**
     * A streaming client keeps its turn for its next message while that message has already arrived
     * whole, for up to this many messages and {@link #BATCH_NANOS}: a flood then costs one hand-off
     * between threads per batch, not per message. (Turns kept this way are the streaming ones, so
     * a client that waits for its reply never waits for a batch while two or more processors.)
     */
    static final int BATCH_MESSAGES = 64;
    static final long BATCH_NANOS = 1_000_000;

    private void giveTurn() {
        heldTurn = false;
        server.endTurn(true, heldTurnWaiting);
    }

    /** Replaces about one printable character in eight (at least one) by another printable one. */
    static void garble(byte[] reply, long seed) {
        Random r = new Random(seed);
        int end = reply.length - 1; // keep the LF
        boolean changed = false;
        for (int i = 0; i < end; i++) {
            if ((r.nextInt(8) == 0 || (!changed && i == end - 1)) && reply[i] >= 0x21 && reply[i] <= 0x7E) {
                byte c;
                do {
                    c = (byte) (0x21 + r.nextInt(0x7E - 0x21 + 1));
                } while (c == reply[i] || c == ';' || c == '"');
                reply[i] = c;
                changed = true;
            }
        }
    }

    /**
     * One entry of the output queue: a reply (with its faults) or an action such as a drop. Replies
     * without faults that follow each other share one entry (their bytes appended), so a client
     * that does not read holds a few arrays in the queue, not one object per reply.
     */
    private static final class Pending {
        byte[] bytes; // guarded by the connection while queued
        int length; // guarded by the connection while queued
        final Duration delay;
        final Fault.Fragment fragment;
        final Runnable action;
        boolean cancelled; // guarded by the connection

        Pending(byte[] bytes, Duration delay, Fault.Fragment fragment, Runnable action) {
            this.bytes = bytes;
            this.length = bytes == null ? 0 : bytes.length;
            this.delay = delay;
            this.fragment = fragment;
            this.action = action;
        }

        long size() {
            return length;
        }

        /** Sent at once, in one write: gone as soon as the link takes it. */
        boolean plain() {
            return action == null && delay.isZero() && fragment == null;
        }

        /** Appends a plain entry's bytes to this plain entry. */
        void append(Pending p) {
            if (length + p.length > bytes.length) {
                bytes = java.util.Arrays.copyOf(bytes, Math.max(length + p.length, 2 * length));
            }
            System.arraycopy(p.bytes, 0, bytes, length, p.length);
            length += p.length;
        }
    }

    private void send(byte[] bytes, Duration delay, Fault.Fragment fragment) {
        enqueue(new Pending(bytes, delay, fragment, null));
    }

    private void enqueue(Pending p) {
        boolean deadlocked = false;
        boolean direct = false;
        synchronized (this) {
            if (closed) {
                return;
            }
            long n = p.size();
            boolean empty = queue.isEmpty() && writing == null;
            if (empty) {
                server.takeOutput(n);
            } else if (queuedBytes + n > server.options().maxOutputBytes() || !server.tryTakeOutput(n)) {
                deadlocked = true;
            }
            if (!deadlocked) {
                queuedBytes += n;
                if (empty && !writerStarted && p.plain() && directBytes + n <= DIRECT_WRITE_BYTES) {
                    // a new connection's first replies: sent from this thread, no hand-off to a writer
                    directBytes += n;
                    writing = p;
                    direct = true;
                } else {
                    Pending last = queue.peekLast();
                    if (last != null && last.plain() && p.plain()) {
                        last.append(p);
                    } else {
                        queue.addLast(p);
                    }
                    if (!writerStarted) {
                        writerStarted = true;
                        server.startThread("zweep-sim-writer-" + id, this::writeLoop);
                    }
                    notifyAll();
                }
            }
        }
        if (direct) {
            sendEntry(p);
        }
        if (deadlocked) {
            clearOutput();
            session.report(StandardError.QUERY_DEADLOCKED, "output queue full ("
                    + server.options().maxOutputBytes() + " bytes per connection, "
                    + server.options().maxTotalOutputBytes() + " in all); the client does not read its replies");
        }
    }

    /**
     * The bytes a connection sends from its reader thread before it needs a writer thread: less
     * than any TCP send buffer Linux gives a new socket (at least 4 KiB, {@code tcp_wmem}) and than
     * an in-memory pipe, so these writes never block on a client that does not read.
     */
    static final int DIRECT_WRITE_BYTES = 4096;

    /** The writer thread: sends the queue's entries in order until the connection closes. */
    private void writeLoop() {
        while (true) {
            Pending p;
            synchronized (this) {
                while (queue.isEmpty() && !closed) {
                    if (!waitQuietly(0)) {
                        return;
                    }
                }
                if (closed) {
                    return;
                }
                p = queue.pollFirst();
                writing = p;
            }
            sendEntry(p);
        }
    }

    /** Sends or runs the entry in {@link #writing}, then gives its bytes back. */
    private void sendEntry(Pending p) {
        try {
            if (p.action != null) {
                p.action.run();
            } else if (pause(p, p.delay)) {
                write(p);
            }
        } catch (IOException e) {
            drop("connection lost: " + e.getMessage());
        } finally {
            synchronized (this) {
                if (writing == p) {
                    writing = null;
                    queuedBytes -= p.size();
                    server.giveOutput(p.size());
                }
                notifyAll();
            }
        }
    }

    private void write(Pending p) throws IOException {
        OutputStream o = link.output();
        if (p.fragment == null) {
            o.write(p.bytes, 0, p.length);
            o.flush();
            return;
        }
        for (int i = 0; i < p.length; i += p.fragment.bytes()) {
            if (i > 0 && !pause(p, p.fragment.gap())) {
                return;
            }
            o.write(p.bytes, i, Math.min(p.fragment.bytes(), p.length - i));
            o.flush();
        }
    }

    /** Waits {@code d} unless the entry is cancelled or the connection closes; whether to go on. */
    private synchronized boolean pause(Pending p, Duration d) {
        long end = System.nanoTime() + d.toNanos();
        long left;
        while (!p.cancelled && !closed && (left = end - System.nanoTime()) > 0) {
            if (!waitQuietly(Math.max(1, left / 1_000_000))) {
                return false;
            }
        }
        return !p.cancelled && !closed;
    }

    /** Waits on this connection's monitor; false when interrupted (only closing interrupts). */
    private boolean waitQuietly(long ms) {
        try {
            wait(ms);
            return true;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    @Override
    public synchronized boolean outputPending() {
        return !queue.isEmpty() || (writing != null && !writing.cancelled && writing.action == null);
    }

    /**
     * Whether output is still pending once replies that go out in one write have had a moment
     * (50 ms) to be taken by the link: a reply the client has read may still be on its way out
     * of the writer thread when the client's next message arrives.
     */
    private synchronized boolean outputPendingAfterPlainWrites() {
        long end = System.nanoTime() + 50_000_000L;
        long left;
        while (!closed && outputPending() && onlyPlain() && (left = end - System.nanoTime()) > 0) {
            if (!waitQuietly(Math.max(1, left / 1_000_000))) {
                break;
            }
        }
        return outputPending();
    }

    private boolean onlyPlain() {
        if (writing != null && !writing.plain()) {
            return false;
        }
        for (Pending p : queue) {
            if (!p.plain()) {
                return false;
            }
        }
        return true;
    }

    /** Discards the replies not yet sent (the one being written finishes); keeps queued actions. */
    @Override
    public synchronized void clearOutput() {
        for (java.util.Iterator<Pending> it = queue.iterator(); it.hasNext();) {
            Pending p = it.next();
            if (p.action == null) {
                it.remove();
                queuedBytes -= p.size();
                server.giveOutput(p.size());
            }
        }
        if (writing != null && writing.action == null) {
            writing.cancelled = true;
        }
        notifyAll();
    }

    /**
     * The in-memory check for IEEE 488.2 §6.3.2.2: the client reads while no query is pending
     * (this connection's reader waits for input and no reply is on its way).
     *
     * @return whether -420 was reported
     */
    boolean onClientBlockedRead(BytePipe toServer) {
        if (session.strict() && !stalled && !closed && toServer.readerWaitingOnEmpty() && !outputPending()) {
            session.report(StandardError.QUERY_UNTERMINATED, "read with no query pending");
            return true;
        }
        return false;
    }

    void stall(String where) {
        stalled = true;
        clearOutput();
        server.log("connection " + id + " stalled at " + where + " (fault)");
    }

    void drop(String reason) {
        closeReason = reason;
        close(reason);
    }

    /** Closes the connection and releases its threads; idempotent. */
    void close(String reason) {
        synchronized (this) {
            if (closed) {
                return;
            }
            closed = true;
            for (Pending p : queue) {
                queuedBytes -= p.size();
                server.giveOutput(p.size());
            }
            queue.clear();
            notifyAll();
        }
        link.close();
        synchronized (this) {
            Thread t = readerThread;
            if (t != null && t != Thread.currentThread()) {
                t.interrupt();
            }
        }
        server.closed(this);
        server.log("connection " + id + " closed (" + reason + ")");
    }

}
