package org.zweep.simulator.server;

import java.io.IOException;
import java.io.InterruptedIOException;
import java.io.OutputStream;
import java.net.SocketTimeoutException;
import java.time.Duration;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.Random;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.zweep.simulator.scpi.MessageFramer;
import org.zweep.simulator.scpi.Session;
import org.zweep.simulator.scpi.StandardError;

/**
 * One client connection: a reader thread that frames, executes and answers messages in order,
 * and (only once a reply is delayed or fragmented) a writer thread that sends replies late, so
 * that the reader can see a new message arrive before an old reply is out (-410 in strict mode).
 */
final class Connection implements Session.Hooks {
    private final SimulatorServer server;
    private final long id;
    private final Link link;
    private final ConnectionFaults faults;
    private final Session session;
    private final Object writeLock = new Object();
    private final Deque<Future<?>> inflight = new ArrayDeque<>();
    private ExecutorService writer;
    private volatile Thread readerThread;
    private volatile boolean stalled;
    private volatile boolean closed;
    private long messages;
    private long replies;
    private String closeReason = "client closed";

    Connection(SimulatorServer server, long id, Link link, FaultPlan plan) {
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
        readerThread = Thread.currentThread();
        server.log("connection " + id + " from " + link.peer() + " opened");
        MessageFramer framer = new MessageFramer(link.input(), server.options().maxMessageBytes());
        try {
            int timeoutMs = 0;
            while (!closed) {
                Duration idle = faults.idleLimit();
                int wanted = idle == null ? 0 : (int) Math.max(1, Math.min(Integer.MAX_VALUE, idle.toMillis()));
                if (wanted != timeoutMs) {
                    link.setReadTimeoutMillis(wanted);
                    timeoutMs = wanted;
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
                exchange(m.bytes());
            }
        } catch (InterruptedIOException e) {
            closeReason = "server stopped";
        } catch (IOException e) {
            if (!closed) {
                closeReason = "connection lost: " + e.getMessage();
            }
        } finally {
            close(closeReason);
        }
    }

    private void exchange(byte[] message) throws IOException {
        messages++;
        if (session.strict() && outputPending()) {
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
        byte[] reply = session.execute(message);
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
                if (hasWriter()) {
                    submit(() -> drop(why));
                } else {
                    drop(why);
                }
                return;
            }
        }
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

    private void send(byte[] bytes, Duration delay, Fault.Fragment fragment) throws IOException {
        if (delay.isZero() && fragment == null && !hasWriter()) {
            synchronized (writeLock) {
                OutputStream o = link.output();
                o.write(bytes);
                o.flush();
            }
            return;
        }
        submit(() -> {
            try {
                if (!delay.isZero()) {
                    Thread.sleep(delay.toMillis(), delay.toNanosPart() % 1_000_000);
                }
                synchronized (writeLock) {
                    OutputStream o = link.output();
                    if (fragment == null) {
                        o.write(bytes);
                        o.flush();
                    } else {
                        for (int i = 0; i < bytes.length; i += fragment.bytes()) {
                            if (i > 0) {
                                Thread.sleep(fragment.gap().toMillis(), fragment.gap().toNanosPart() % 1_000_000);
                            }
                            o.write(bytes, i, Math.min(fragment.bytes(), bytes.length - i));
                            o.flush();
                        }
                    }
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            } catch (IOException e) {
                drop("connection lost: " + e.getMessage());
            }
        });
    }

    private synchronized boolean hasWriter() {
        return writer != null;
    }

    private synchronized void submit(Runnable task) {
        if (closed) {
            return;
        }
        if (writer == null) {
            writer = Executors.newSingleThreadExecutor(r -> {
                Thread t = new Thread(r, "zweep-sim-writer-" + id);
                t.setDaemon(true);
                return t;
            });
        }
        inflight.addLast(writer.submit(task));
    }

    @Override
    public synchronized boolean outputPending() {
        inflight.removeIf(Future::isDone);
        return !inflight.isEmpty();
    }

    @Override
    public synchronized void clearOutput() {
        for (Future<?> f : inflight) {
            f.cancel(true);
        }
        inflight.clear();
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
            for (Future<?> f : inflight) {
                f.cancel(true);
            }
            inflight.clear();
            if (writer != null) {
                writer.shutdownNow();
            }
        }
        link.close();
        Thread t = readerThread;
        if (t != null && t != Thread.currentThread()) {
            t.interrupt();
        }
        server.closed(this);
        server.log("connection " + id + " closed (" + reason + ")");
    }

}
