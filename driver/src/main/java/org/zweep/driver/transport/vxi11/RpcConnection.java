package org.zweep.driver.transport.vxi11;

import java.io.IOException;
import java.net.InetSocketAddress;
import java.net.SocketTimeoutException;
import java.time.Duration;
import java.util.Arrays;
import org.zweep.driver.transport.Deadline;
import org.zweep.driver.transport.TimedSocket;

/**
 * An ONC RPC version 2 client over one TCP connection (RFC 5531): calls with AUTH_NONE, replies
 * matched by transaction id, record marking with any number of fragments (RFC 5531 §11).
 *
 * <p>A reply that does not come in time leaves the connection usable: the partly read record is
 * kept and finished by the next wait, and a late reply to an earlier call is recognised by its
 * transaction id and discarded. Records longer than the limit given at connect time are refused
 * (the connection is closed), so a broken or hostile server cannot exhaust memory. Not thread-safe.
 */
final class RpcConnection implements AutoCloseable {
    private static final int RPC_VERSION = 2;
    private static final int MSG_CALL = 0;
    private static final int MSG_REPLY = 1;
    private static final int AUTH_NONE = 0;
    private static final int MAX_AUTH_BYTES = 400;
    private static final int LAST_FRAGMENT = 0x8000_0000;

    private final TimedSocket socket;
    private final int maxRecordBytes;
    private int nextXid;
    // the record being received; kept across timeouts
    private final byte[] header = new byte[4];
    private int headerGot;
    private long fragmentLeft = -1;
    private boolean lastFragment;
    private byte[] record = new byte[256];
    private int recordLength;

    private RpcConnection(TimedSocket socket, int maxRecordBytes) {
        this.socket = socket;
        this.maxRecordBytes = maxRecordBytes;
        this.nextXid = (int) System.nanoTime();
    }

    /**
     * Connects with TCP_NODELAY and keep-alive.
     *
     * @throws SocketTimeoutException if the connection is not made within {@code connectTimeout}
     * @throws IOException if it is refused or the host unreachable
     */
    static RpcConnection connect(InetSocketAddress target, Duration connectTimeout, int maxRecordBytes,
            Duration replySpin) throws IOException {
        return new RpcConnection(TimedSocket.connect(target, connectTimeout, replySpin), maxRecordBytes);
    }

    /** Sends a call as one record in one fragment; returns its transaction id. */
    int send(int program, int version, int procedure, XdrEncoder arguments) throws IOException {
        int xid = nextXid++;
        XdrEncoder call = new XdrEncoder().putInt(0) // the record mark, filled in below
                .putInt(xid).putInt(MSG_CALL).putInt(RPC_VERSION).putInt(program).putInt(version).putInt(procedure)
                .putInt(AUTH_NONE).putInt(0) // credentials
                .putInt(AUTH_NONE).putInt(0); // verifier
        byte[] args = arguments.buffer();
        byte[] message = Arrays.copyOf(call.buffer(), call.length() + arguments.length());
        System.arraycopy(args, 0, message, call.length(), arguments.length());
        int body = message.length - 4;
        message[0] = (byte) ((LAST_FRAGMENT | body) >>> 24);
        message[1] = (byte) (body >>> 16);
        message[2] = (byte) (body >>> 8);
        message[3] = (byte) body;
        socket.write(message, 0, message.length);
        return xid;
    }

    /**
     * Waits up to {@code timeoutMillis} for the reply to call {@code xid}, discarding replies to
     * earlier calls on the way.
     *
     * @return the decoder positioned at the procedure's results, or {@code null} if the reply did not come in time
     * @throws RpcException if the server refused the call or the reply is malformed
     * @throws IOException if the connection broke or the server closed it
     */
    XdrDecoder awaitReply(int xid, long timeoutMillis) throws IOException {
        Deadline deadline = Deadline.after(timeoutMillis);
        while (true) {
            if (!receiveRecord(deadline)) {
                return null;
            }
            XdrDecoder d = new XdrDecoder(record, 0, recordLength);
            recordLength = 0;
            try {
                int replyXid = d.getInt();
                if (d.getInt() != MSG_REPLY) {
                    throw new RpcException("the server sent a message that is not an RPC reply");
                }
                if (replyXid != xid) {
                    continue; // a late reply to a call that timed out
                }
                return accepted(d);
            } catch (XdrDecoder.XdrException e) {
                throw new RpcException("malformed RPC reply: " + e.getMessage());
            }
        }
    }

    /** Checks the reply header (RFC 5531 §9) and returns the decoder at the results. */
    private static XdrDecoder accepted(XdrDecoder d) {
        int replyStat = d.getInt();
        if (replyStat == 1) {
            int rejectStat = d.getInt();
            if (rejectStat == 0) {
                throw new RpcException("the server refused RPC version 2 (it supports " + d.getInt() + " to "
                        + d.getInt() + ")");
            }
            throw new RpcException("the server refused the call's authentication (auth_stat " + d.getInt() + ")");
        }
        if (replyStat != 0) {
            throw new RpcException("unknown reply_stat " + replyStat);
        }
        d.getInt(); // verifier flavour
        d.skipOpaque(MAX_AUTH_BYTES);
        int acceptStat = d.getInt();
        return switch (acceptStat) {
            case 0 -> d;
            case 1 -> throw new RpcException("the server does not offer this RPC program (PROG_UNAVAIL)");
            case 2 -> throw new RpcException("the server offers versions " + d.getUnsignedInt() + " to "
                    + d.getUnsignedInt() + " of the RPC program only (PROG_MISMATCH)");
            case 3 -> throw new RpcException("the server does not offer this procedure (PROC_UNAVAIL)");
            case 4 -> throw new RpcException("the server could not decode the call's arguments (GARBAGE_ARGS)");
            case 5 -> throw new RpcException("the server failed to carry out the call (SYSTEM_ERR)");
            default -> throw new RpcException("unknown accept_stat " + acceptStat);
        };
    }

    /** Reads fragments until a record is complete; false at the deadline (progress is kept). */
    private boolean receiveRecord(Deadline deadline) throws IOException {
        while (true) {
            if (fragmentLeft < 0) {
                while (headerGot < 4) {
                    int n = socket.readSome(header, headerGot, 4 - headerGot, deadline);
                    if (n == 0) {
                        return false;
                    }
                    headerGot += n;
                }
                int mark = ((header[0] & 0xff) << 24) | ((header[1] & 0xff) << 16) | ((header[2] & 0xff) << 8)
                        | (header[3] & 0xff);
                headerGot = 0;
                lastFragment = (mark & LAST_FRAGMENT) != 0;
                fragmentLeft = mark & 0x7fff_ffff;
                if (recordLength + fragmentLeft > maxRecordBytes) {
                    throw new RpcException("an RPC record longer than " + maxRecordBytes + " bytes (a fragment of "
                            + fragmentLeft + " bytes after " + recordLength + ")");
                }
                if (record.length < recordLength + fragmentLeft) {
                    record = Arrays.copyOf(record, (int) Math.max(recordLength + fragmentLeft, record.length * 2L));
                }
            }
            while (fragmentLeft > 0) {
                int n = socket.readSome(record, recordLength, (int) fragmentLeft, deadline);
                if (n == 0) {
                    return false;
                }
                recordLength += n;
                fragmentLeft -= n;
            }
            fragmentLeft = -1;
            if (lastFragment) {
                return true;
            }
        }
    }

    @Override
    public void close() {
        socket.close();
    }

    /** The server refused a call or broke the RPC protocol. */
    static final class RpcException extends RuntimeException {
        private static final long serialVersionUID = 1L;

        RpcException(String message) {
            super(message);
        }
    }
}
