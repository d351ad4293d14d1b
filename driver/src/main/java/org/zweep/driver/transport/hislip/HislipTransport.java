package org.zweep.driver.transport.hislip;

import java.io.IOException;
import java.net.InetSocketAddress;
import java.net.SocketTimeoutException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import org.zweep.driver.address.HislipAddress;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.Deadline;
import org.zweep.driver.transport.LinkState;
import org.zweep.driver.transport.MessagePieces;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;

/**
 * A HiSLIP session (IVI-6.1, High-Speed LAN Instrument Protocol): the synchronous and asynchronous
 * channels to one port (4880 by default), the initialize handshake, maximum message size
 * negotiation, each program message as Data messages ending in DataEnd (END), responses read from
 * Data/DataEnd. Device clear, the status byte, trigger and locks are methods of their own.
 *
 * <p>Stale replies: every message the client sends carries a MessageID (from 0xFFFFFF00, up by 2);
 * the server labels a response with the ID of the message it answers, and response data with any
 * other ID (a late answer to a query that timed out) is dropped here, as IVI-6.1 has clients do.
 * The server may run in overlapped or synchronized mode (it says which when initializing); this
 * client works with either. Incoming messages larger than the maximum this client announced are
 * refused (the link is then lost). Not thread-safe.
 */
public final class HislipTransport implements Transport {
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
    static final int TRIGGER = 12;
    static final int INTERRUPTED = 13;
    static final int ASYNC_INTERRUPTED = 14;
    static final int ASYNC_MAX_MSG_SIZE = 15;
    static final int ASYNC_MAX_MSG_SIZE_RESPONSE = 16;
    static final int ASYNC_INITIALIZE = 17;
    static final int ASYNC_INITIALIZE_RESPONSE = 18;
    static final int ASYNC_DEVICE_CLEAR = 19;
    static final int ASYNC_SERVICE_REQUEST = 20;
    static final int ASYNC_STATUS_QUERY = 21;
    static final int ASYNC_STATUS_RESPONSE = 22;
    static final int ASYNC_DEVICE_CLEAR_ACKNOWLEDGE = 23;
    /** The first MessageID of a session and after a device clear (IVI-6.1). */
    static final int FIRST_MESSAGE_ID = 0xFFFFFF00;
    /** The MessageID a server uses for data that answers no particular message. */
    static final int UNKNOWN_MESSAGE_ID = 0xFFFFFFFF;
    /** Protocol version 1.0 in the upper 16 bits, vendor id "ZW" in the lower. */
    static final int CLIENT_VERSION_AND_VENDOR = 0x0100_0000 | ('Z' << 8) | 'W';
    /** The largest message this client accepts (told to the server): 1 MiB. */
    static final long MAX_INCOMING_BYTES = 1 << 20;

    private final String name;
    private final HislipChannel sync;
    private final HislipChannel async;
    private final boolean overlapped;
    private final int sessionId;
    private final long serverMaxBytes;
    private final long asyncTimeoutMillis;
    private int nextMessageId = FIRST_MESSAGE_ID;
    private int lastSentId = FIRST_MESSAGE_ID - 2;
    private boolean rmtDelivered;
    private long payloadLeft;
    private boolean delivering;
    private boolean endOfMessage;
    private final LinkState state;

    private HislipTransport(String name, HislipChannel sync, HislipChannel async, boolean overlapped, int sessionId,
            long serverMaxBytes, long asyncTimeoutMillis) {
        this.name = name;
        this.state = new LinkState(name);
        this.sync = sync;
        this.async = async;
        this.overlapped = overlapped;
        this.sessionId = sessionId;
        this.serverMaxBytes = serverMaxBytes;
        this.asyncTimeoutMillis = asyncTimeoutMillis;
    }

    /**
     * Opens both channels and negotiates the session; each step waits up to the connect timeout.
     *
     * @throws ConnectFailedException if the server cannot be reached, refuses the sub-address or
     *     does not speak HiSLIP
     */
    public static HislipTransport connect(HislipAddress address, TransportOptions options) {
        String name = address.text();
        InetSocketAddress target = new InetSocketAddress(address.host(), address.port());
        if (target.isUnresolved()) {
            throw new ConnectFailedException(name + ": unknown host '" + address.host() + "'");
        }
        String where = address.host() + ":" + address.port();
        long timeout = Math.max(1, options.connectTimeout().toMillis());
        HislipChannel sync = null;
        HislipChannel async = null;
        try {
            sync = HislipChannel.connect(target, options.connectTimeout(), options.replySpin());
            byte[] sub = address.subAddress().getBytes(StandardCharsets.US_ASCII);
            sync.send(INITIALIZE, 0, CLIENT_VERSION_AND_VENDOR, sub, 0, sub.length);
            HislipChannel.Header init = expect(sync, INITIALIZE_RESPONSE, timeout, "Initialize", name, where);
            boolean overlapped = (init.control() & 1) != 0;
            int session = init.parameter() & 0xffff;
            async = HislipChannel.connect(target, options.connectTimeout(), Duration.ZERO);
            async.send(ASYNC_INITIALIZE, 0, session);
            expect(async, ASYNC_INITIALIZE_RESPONSE, timeout, "AsyncInitialize", name, where);
            byte[] max = new byte[8];
            for (int i = 0; i < 8; i++) {
                max[i] = (byte) (MAX_INCOMING_BYTES >>> (56 - 8 * i));
            }
            async.send(ASYNC_MAX_MSG_SIZE, 0, 0, max, 0, 8);
            HislipChannel.Header h = expect(async, ASYNC_MAX_MSG_SIZE_RESPONSE, timeout, "AsyncMaxMsgSize", name, where);
            byte[] p = h.length() == 8 ? async.readAll(8, timeout) : null;
            if (p == null) {
                throw new ConnectFailedException(name + ": the HiSLIP server at " + where
                        + " sent no 8-byte maximum message size");
            }
            long serverMax = 0;
            for (byte b : p) {
                serverMax = (serverMax << 8) | (b & 0xff);
            }
            return new HislipTransport(name, sync, async, overlapped, session, Math.max(1, serverMax),
                    Math.max(1, options.writeTimeout().toMillis()));
        } catch (SocketTimeoutException e) {
            close(sync, async);
            throw new ConnectFailedException(name + ": no answer from " + where + " within " + timeout
                    + " ms while connecting (is the instrument on the network?)", e);
        } catch (IOException e) {
            close(sync, async);
            throw new ConnectFailedException(name + ": cannot connect to the HiSLIP server at " + where + ": "
                    + e.getMessage(), e);
        } catch (HislipChannel.HislipException e) {
            close(sync, async);
            throw new ConnectFailedException(name + ": " + where + " does not speak HiSLIP: " + e.getMessage(), e);
        } catch (RuntimeException e) {
            close(sync, async);
            throw e;
        }
    }

    private static HislipChannel.Header expect(HislipChannel c, int type, long timeout, String step, String name,
            String where) throws IOException {
        HislipChannel.Header h = c.readHeader(timeout);
        if (h == null) {
            throw new ConnectFailedException(name + ": the HiSLIP server at " + where + " did not answer " + step
                    + " within " + timeout + " ms");
        }
        if (h.type() == FATAL_ERROR || h.type() == ERROR) {
            byte[] text = h.length() <= 4096 ? c.readAll(h.length(), timeout) : null;
            throw new ConnectFailedException(name + ": the HiSLIP server at " + where + " refused " + step + ": "
                    + errorText(h.type(), h.control(), text));
        }
        if (h.type() != type) {
            throw new ConnectFailedException(name + ": the HiSLIP server at " + where + " answered " + step
                    + " with message type " + h.type());
        }
        return h;
    }

    private static void close(HislipChannel a, HislipChannel b) {
        if (a != null) {
            a.close();
        }
        if (b != null) {
            b.close();
        }
    }

    @Override
    public String name() {
        return name;
    }

    /** Whether the server runs in overlapped mode (false: synchronized), as it said when initializing. */
    public boolean overlapped() {
        return overlapped;
    }

    /** The session id the server gave. */
    public int sessionId() {
        return sessionId;
    }

    /** The largest message the server accepts: program messages are sent in Data pieces of at most this. */
    public long serverMaxMessageBytes() {
        return serverMaxBytes;
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        state.check("write");
        try {
            MessagePieces.send(length, serverMaxBytes, (from, piece, last) -> {
                sendOnSync(last ? DATA_END : DATA, data, offset + from, piece);
                return piece;
            });
        } catch (IOException e) {
            throw fail("link broke while sending: " + e.getMessage());
        }
    }

    /** Sends a Data, DataEnd or Trigger message with the next MessageID and RMT-delivered when due. */
    private void sendOnSync(int type, byte[] data, int offset, int length) throws IOException {
        int id = nextMessageId;
        sync.send(type, rmtDelivered ? 1 : 0, id, data, offset, length);
        rmtDelivered = false;
        lastSentId = id;
        nextMessageId = id + 2;
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        state.check("read");
        Deadline deadline = Deadline.after(timeoutMillis);
        try {
            while (true) {
                long left = deadline.millisLeftRoundedUp();
                if (payloadLeft > 0) {
                    byte[] into = delivering ? buffer : new byte[(int) Math.min(payloadLeft, 8192)];
                    int off = delivering ? offset : 0;
                    int n = sync.readPayload(into, off, (int) Math.min(delivering ? length : into.length, payloadLeft),
                            left);
                    if (n == 0) {
                        return 0;
                    }
                    payloadLeft -= n;
                    if (payloadLeft == 0 && endOfMessage && delivering) {
                        rmtDelivered = true;
                    }
                    if (delivering) {
                        return n;
                    }
                    continue;
                }
                if (deadline.passed()) {
                    return 0;
                }
                HislipChannel.Header h = sync.readHeader(left);
                if (h == null) {
                    return 0;
                }
                switch (h.type()) {
                    case DATA, DATA_END -> {
                        if (h.length() > MAX_INCOMING_BYTES) {
                            throw fail("the server sent a " + h.length() + "-byte message, more than the "
                                    + MAX_INCOMING_BYTES + " announced");
                        }
                        delivering = h.parameter() == lastSentId || h.parameter() == UNKNOWN_MESSAGE_ID;
                        endOfMessage = h.type() == DATA_END;
                        payloadLeft = h.length();
                        if (payloadLeft == 0 && endOfMessage && delivering) {
                            rmtDelivered = true;
                        }
                    }
                    case INTERRUPTED -> payloadLeft = 0; // the server dropped a response: nothing to deliver
                    case FATAL_ERROR, ERROR -> {
                        byte[] text = h.length() <= 4096 ? sync.readAll(h.length(), left) : null;
                        throw fail("the server reported " + errorText(h.type(), h.control(), text));
                    }
                    default -> throw fail("unexpected HiSLIP message type " + h.type() + " on the synchronous channel");
                }
            }
        } catch (IOException e) {
            throw fail("link broke while receiving: " + e.getMessage());
        } catch (HislipChannel.HislipException e) {
            throw fail(e.getMessage());
        }
    }

    /**
     * Device clear (IVI-6.1 AsyncDeviceClear, then DeviceClearComplete): the device empties its
     * input and output; unread response data is discarded and MessageIDs start over.
     *
     * @throws MeterTimeoutException if the server does not acknowledge within the write timeout
     */
    public void clear() {
        state.check("clear");
        try {
            async.send(ASYNC_DEVICE_CLEAR, 0, 0);
            HislipChannel.Header ack = asyncReply(ASYNC_DEVICE_CLEAR_ACKNOWLEDGE, "device clear");
            sync.send(DEVICE_CLEAR_COMPLETE, ack.control(), 0);
            Deadline deadline = Deadline.after(asyncTimeoutMillis);
            while (true) {
                long left = deadline.millisLeft();
                if (payloadLeft > 0) {
                    int n = left <= 0 ? 0 : sync.readPayload(new byte[(int) Math.min(payloadLeft, 8192)], 0,
                            (int) Math.min(payloadLeft, 8192), left);
                    if (n == 0) {
                        throw new MeterTimeoutException(name + ": device clear not acknowledged within "
                                + asyncTimeoutMillis + " ms", new byte[0]);
                    }
                    payloadLeft -= n;
                    continue;
                }
                HislipChannel.Header h = left <= 0 ? null : sync.readHeader(left);
                if (h == null) {
                    throw new MeterTimeoutException(name + ": device clear not acknowledged within "
                            + asyncTimeoutMillis + " ms", new byte[0]);
                }
                if (h.type() == DEVICE_CLEAR_ACKNOWLEDGE) {
                    break;
                }
                payloadLeft = h.length(); // data or Interrupted from before the clear: discarded
            }
            nextMessageId = FIRST_MESSAGE_ID;
            lastSentId = FIRST_MESSAGE_ID - 2;
            rmtDelivered = false;
        } catch (IOException e) {
            throw fail("link broke during device clear: " + e.getMessage());
        }
    }

    /** The status byte (AsyncStatusQuery), 0 to 255. Blocks up to the write timeout. */
    public int readStatusByte() {
        state.check("read the status byte");
        try {
            async.send(ASYNC_STATUS_QUERY, rmtDelivered ? 1 : 0, lastSentId);
            return asyncReply(ASYNC_STATUS_RESPONSE, "status query").control();
        } catch (IOException e) {
            throw fail("link broke during the status query: " + e.getMessage());
        }
    }

    /** Trigger (the Trigger message on the synchronous channel, the same as GET / {@code *TRG}). */
    public void trigger() {
        state.check("trigger");
        try {
            sendOnSync(TRIGGER, new byte[0], 0, 0);
        } catch (IOException e) {
            throw fail("link broke while sending a trigger: " + e.getMessage());
        }
    }

    /**
     * Requests the exclusive lock (AsyncLock), waiting up to {@code lockTimeout} for another
     * session to release it.
     *
     * @throws MeterTimeoutException if the lock was not granted within {@code lockTimeout}
     */
    public void lock(Duration lockTimeout) {
        state.check("lock");
        long ms = Math.max(0, Math.min(0xffff_ffffL, lockTimeout.toMillis()));
        try {
            async.send(ASYNC_LOCK, 1, (int) ms);
            HislipChannel.Header h = asyncReply(ASYNC_LOCK_RESPONSE, "lock request", ms + asyncTimeoutMillis);
            if (h.control() == 0) {
                throw new MeterTimeoutException(name + ": the device stayed locked by another session for " + ms
                        + " ms (the lock timeout)", new byte[0]);
            }
            if (h.control() != 1) {
                throw new ConnectionLostException(name + ": the server refused the lock request (AsyncLockResponse "
                        + h.control() + ")");
            }
        } catch (IOException e) {
            throw fail("link broke during a lock request: " + e.getMessage());
        }
    }

    /**
     * Releases this session's lock (AsyncLock release).
     *
     * @return false if this session held no lock
     */
    public boolean unlock() {
        state.check("unlock");
        try {
            async.send(ASYNC_LOCK, 0, lastSentId);
            return asyncReply(ASYNC_LOCK_RESPONSE, "lock release").control() == 1;
        } catch (IOException e) {
            throw fail("link broke during a lock release: " + e.getMessage());
        }
    }

    private HislipChannel.Header asyncReply(int type, String what) throws IOException {
        return asyncReply(type, what, asyncTimeoutMillis);
    }

    /** The next asynchronous reply of {@code type}, skipping service requests. */
    private HislipChannel.Header asyncReply(int type, String what, long timeoutMillis) throws IOException {
        Deadline deadline = Deadline.after(timeoutMillis);
        while (true) {
            long left = deadline.millisLeft();
            HislipChannel.Header h = left <= 0 ? null : async.readHeader(left);
            if (h == null) {
                throw new MeterTimeoutException(name + ": no answer to the " + what + " within " + timeoutMillis
                        + " ms", new byte[0]);
            }
            byte[] payload = h.length() == 0 ? new byte[0] : h.length() <= 4096 ? async.readAll(h.length(), left) : null;
            if (payload == null) {
                throw fail("an asynchronous message of " + h.length() + " bytes");
            }
            if (h.type() == type) {
                return h;
            }
            if (h.type() == FATAL_ERROR || h.type() == ERROR) {
                throw fail("the server reported " + errorText(h.type(), h.control(), payload) + " on the " + what);
            }
            if (h.type() != ASYNC_SERVICE_REQUEST && h.type() != ASYNC_INTERRUPTED) {
                throw fail("unexpected HiSLIP message type " + h.type() + " on the asynchronous channel");
            }
        }
    }

    static String errorText(int type, int code, byte[] text) {
        String kind = type == FATAL_ERROR ? "fatal error" : "error";
        String meaning = type == FATAL_ERROR ? switch (code) {
            case 1 -> "poorly formed message header";
            case 2 -> "attempt to use connection without both channels established";
            case 3 -> "invalid initialization sequence";
            case 4 -> "server refused connection due to maximum number of clients exceeded";
            default -> "unidentified error";
        } : switch (code) {
            case 1 -> "unrecognized message type";
            case 2 -> "unrecognized control code";
            case 3 -> "unrecognized vendor defined message";
            case 4 -> "message too large";
            default -> "unidentified error";
        };
        String t = text == null || text.length == 0 ? "" : ": " + new String(text, StandardCharsets.US_ASCII).strip();
        return "HiSLIP " + kind + " " + code + " (" + meaning + ")" + t;
    }

    private ConnectionLostException fail(String why) {
        ConnectionLostException broken = state.broke(why);
        sync.close();
        async.close();
        return broken;
    }

    /** Closes both channels; never throws. */
    @Override
    public void close() {
        state.close();
        sync.close();
        async.close();
    }
}
