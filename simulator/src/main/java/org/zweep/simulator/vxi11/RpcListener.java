package org.zweep.simulator.vxi11;

import java.io.DataInputStream;
import java.io.EOFException;
import java.io.IOException;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.ByteBuffer;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.Consumer;

/**
 * One ONC RPC version 2 program served over TCP (RFC 5531): a thread per connection reads call
 * records (any number of fragments, record marking of §11), answers each in order, and sends each
 * reply as one record, in fragments of a given size when asked to (so clients meet multi-fragment
 * records). Calls to other programs, versions or procedures get the RFC's refusals; a record
 * larger than the limit closes the connection.
 */
final class RpcListener implements AutoCloseable {
    private static final int LAST = 0x8000_0000;

    /** Answers one procedure; the connection is passed so a handler can tie state to it. */
    interface Handler {
        /**
         * @return the results, or {@code null} when the procedure does not exist (PROC_UNAVAIL)
         * @throws XdrIn.GarbageArgs when the arguments do not decode
         * @throws DropConnection to close the connection without a reply
         */
        byte[] call(int procedure, XdrIn args, Channel channel);

        /** The connection closed; release what it held. */
        default void closed(Channel channel) {
        }
    }

    /** One client connection, for handlers to key state on. */
    static final class Channel {
        final long id;
        final String peer;
        private final Socket socket;

        Channel(long id, Socket socket) {
            this.id = id;
            this.socket = socket;
            this.peer = socket.getInetAddress().getHostAddress() + ":" + socket.getPort();
        }

        /** Closes the connection from the server side (the client sees the link drop). */
        void close() {
            try {
                socket.close();
            } catch (IOException e) {
                // closing is best effort
            }
        }
    }

    /** Thrown by a handler to close the connection instead of answering. */
    static final class DropConnection extends RuntimeException {
        private static final long serialVersionUID = 1L;

        DropConnection(String why) {
            super(why);
        }
    }

    private final String label;
    private final int program;
    private final int version;
    private final Handler handler;
    private final int fragmentBytes;
    private final int maxRecordBytes;
    private final Consumer<String> log;
    private final ServerSocket listener;
    private final Set<Socket> open = ConcurrentHashMap.newKeySet();
    private volatile boolean closed;
    private long ids;

    /**
     * @param port 0 for a free one
     * @param fragmentBytes the largest reply fragment; 0 sends each reply in one fragment
     */
    RpcListener(String label, InetAddress bind, int port, int program, int version, Handler handler,
            int fragmentBytes, int maxRecordBytes, Consumer<String> log) throws IOException {
        this.label = label;
        this.program = program;
        this.version = version;
        this.handler = handler;
        this.fragmentBytes = fragmentBytes;
        this.maxRecordBytes = maxRecordBytes;
        this.log = log;
        ServerSocket s = new ServerSocket();
        try {
            s.setReuseAddress(true);
            s.bind(new InetSocketAddress(bind, port), 50);
        } catch (IOException e) {
            s.close();
            throw new IOException("cannot listen on " + bind.getHostAddress() + ":" + port + " for the " + label
                    + ": " + e.getMessage() + (port > 0 && port < 1024
                            ? " (ports below 1024 need root or CAP_NET_BIND_SERVICE; 0 picks a free port)" : ""), e);
        }
        listener = s;
        Thread t = new Thread(this::acceptLoop, "zweep-sim-" + label + "-" + s.getLocalPort());
        t.setDaemon(true);
        t.start();
    }

    int port() {
        return listener.getLocalPort();
    }

    private void acceptLoop() {
        while (!closed) {
            Socket s;
            try {
                s = listener.accept();
                s.setTcpNoDelay(true);
            } catch (IOException e) {
                continue;
            }
            open.add(s);
            Channel c;
            synchronized (this) {
                c = new Channel(++ids, s);
            }
            Thread t = new Thread(() -> serve(c), "zweep-sim-" + label + "-conn-" + c.id);
            t.setDaemon(true);
            t.start();
        }
    }

    private void serve(Channel c) {
        String reason = "client closed";
        try (Socket s = c.socket) {
            DataInputStream in = new DataInputStream(s.getInputStream());
            OutputStream out = s.getOutputStream();
            while (!closed) {
                byte[] record = readRecord(in);
                if (record == null) {
                    break;
                }
                byte[] reply = answer(ByteBuffer.wrap(record), c);
                if (reply != null) {
                    send(out, reply);
                }
            }
        } catch (DropConnection e) {
            reason = e.getMessage();
        } catch (IOException e) {
            reason = closed ? "server stopped" : "connection lost: " + e.getMessage();
        } finally {
            open.remove(c.socket);
            handler.closed(c);
            log.accept(label + " connection from " + c.peer + " closed (" + reason + ")");
        }
    }

    /** One record, its fragments joined; null at a clean end of stream before a record starts. */
    private byte[] readRecord(DataInputStream in) throws IOException {
        byte[] record = new byte[0];
        boolean first = true;
        while (true) {
            int mark;
            try {
                mark = in.readInt();
            } catch (EOFException e) {
                if (first) {
                    return null;
                }
                throw e;
            }
            first = false;
            long size = mark & 0x7fff_ffffL;
            if (record.length + size > maxRecordBytes) {
                throw new DropConnection("a call record longer than " + maxRecordBytes + " bytes");
            }
            int at = record.length;
            record = java.util.Arrays.copyOf(record, (int) (at + size));
            in.readFully(record, at, (int) size);
            if ((mark & LAST) != 0) {
                return record;
            }
        }
    }

    /** The reply record to one call (RFC 5531 §9), or null for a message that is not a call. */
    private byte[] answer(ByteBuffer call, Channel c) {
        XdrIn in = new XdrIn(call);
        int xid;
        try {
            xid = in.int32();
            if (in.int32() != 0) {
                return null; // not a CALL: ignored
            }
            int rpcVersion = in.int32();
            XdrOut out = new XdrOut().int32(xid).int32(1);
            if (rpcVersion != 2) {
                return out.int32(1).int32(0).int32(2).int32(2).bytes(); // MSG_DENIED, RPC_MISMATCH 2..2
            }
            int prog = in.int32();
            int vers = in.int32();
            int proc = in.int32();
            in.int32();
            in.opaque(400); // credentials (any flavour accepted)
            in.int32();
            in.opaque(400); // verifier
            out.int32(0).int32(0).int32(0); // MSG_ACCEPTED, verifier AUTH_NONE with an empty body
            if (prog != program) {
                return out.int32(1).bytes(); // PROG_UNAVAIL
            }
            if (vers != version) {
                return out.int32(2).int32(version).int32(version).bytes(); // PROG_MISMATCH
            }
            byte[] results;
            try {
                results = handler.call(proc, in, c);
            } catch (XdrIn.GarbageArgs e) {
                return out.int32(4).bytes(); // GARBAGE_ARGS
            }
            if (results == null) {
                return out.int32(3).bytes(); // PROC_UNAVAIL
            }
            byte[] head = out.int32(0).bytes(); // SUCCESS
            byte[] reply = java.util.Arrays.copyOf(head, head.length + results.length);
            System.arraycopy(results, 0, reply, head.length, results.length);
            return reply;
        } catch (XdrIn.GarbageArgs e) {
            throw new DropConnection("a record that is no RPC call: " + e.getMessage());
        }
    }

    private void send(OutputStream out, byte[] reply) throws IOException {
        int piece = fragmentBytes > 0 ? fragmentBytes : Math.max(1, reply.length);
        int at = 0;
        do {
            int n = Math.min(piece, reply.length - at);
            boolean last = at + n == reply.length;
            byte[] fragment = new byte[4 + n];
            int mark = (last ? LAST : 0) | n;
            fragment[0] = (byte) (mark >>> 24);
            fragment[1] = (byte) (mark >>> 16);
            fragment[2] = (byte) (mark >>> 8);
            fragment[3] = (byte) mark;
            System.arraycopy(reply, at, fragment, 4, n);
            out.write(fragment);
            out.flush();
            at += n;
        } while (at < reply.length);
    }

    @Override
    public void close() {
        closed = true;
        try {
            listener.close();
        } catch (IOException e) {
            // closing is best effort
        }
        for (Socket s : open) {
            try {
                s.close();
            } catch (IOException e) {
                // as above
            }
        }
    }
}
