package org.zweep.driver.scpi;

import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.locks.ReentrantLock;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.MeterException;
import org.zweep.driver.address.Address;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.Transports;

/**
 * The SCPI conversation with one meter over any {@link Transport}: program messages, queries,
 * numbers, lists, IEEE 488.2 arbitrary blocks, binary {@code REAL,64} data, the error queue and
 * {@code *OPC?} synchronisation.
 *
 * <p>Open one with {@link #open(String, ScpiSettings)}. Every method blocks until the meter has
 * answered or its reply's deadline has passed: the meter's expected work for that query (none,
 * unless given with {@link #query(String, Duration)}) plus the slack {@link ScpiSettings#readTimeout()},
 * counted once per reply from when the query was sent, however the bytes trickle in. Failures are typed: {@link ConnectFailedException}
 * and {@link ConnectionLostException} (the link), {@link MeterTimeoutException} (keeps the bytes
 * received), {@link ScpiProtocolException} (a reply that breaks the rules), {@link MeterErrorException}
 * (the meter's error queue). After a timeout or a broken reply the client resynchronises before the
 * next command ({@link ScpiSettings#resync()}), so a late reply is never returned for a new query;
 * while resynchronising, each reply line may take twice the slack (the late reply comes first).
 * After a lost connection every call fails at once; reconnecting is the caller's decision.
 *
 * <p>Bytes are read and written as ISO-8859-1 (SCPI messages are 7-bit ASCII). A message written
 * with {@link #write} must not be a query: its reply would be left unread.
 *
 * <p>Thread-safe: one conversation at a time. Calls from several threads are serialised by a lock,
 * never interleaved; {@link #close()} does not wait for the lock and releases a blocked caller.
 */
public final class ScpiClient implements ScpiSession {
    /** Size of the receive buffer; replies longer than this are read in several chunks. */
    static final int BUFFER_SIZE = 8192;
    private static final int MAX_ERROR_ENTRIES = 256;
    private static final int MAX_RESYNC_LINES = 1000;
    private static final int DRAIN_LIMIT_TIMEOUTS = 10;
    private static final String RESYNC = "*OPC? (resynchronising after an earlier failure)";
    /** Below this expected work, a reply that never starts may well be a terminator mismatch. */
    static final long SHORT_WORK_MILLIS = 1000;
    /** How many slacks one reply line may take while resynchronising after a timeout. */
    static final int RESYNC_SLACKS = 2;

    private final Transport transport;
    private final ScpiSettings settings;
    private final TrafficTrace trace;
    private final ReentrantLock lock = new ReentrantLock();
    private final byte[] writeTerminator;
    private final byte[] readTerminator;
    private final boolean dropCr;
    private final int lineLimit;
    private final long readTimeoutMillis;
    private final byte[] buf = new byte[BUFFER_SIZE];
    private int pos;
    private int lim;
    private byte[] line = new byte[256];
    private boolean outOfStep;
    private ConnectionLostException lost;
    private volatile boolean closed;

    private ScpiClient(Transport transport, ScpiSettings settings, TrafficTrace trace) {
        this.transport = transport;
        this.settings = settings;
        this.trace = trace;
        this.writeTerminator = settings.writeTerminator().getBytes(StandardCharsets.ISO_8859_1);
        this.readTerminator = settings.readTerminator().getBytes(StandardCharsets.ISO_8859_1);
        this.dropCr = settings.readTerminator().equals("\n");
        this.lineLimit = settings.maxResponseBytes() + readTerminator.length + (dropCr ? 1 : 0);
        this.readTimeoutMillis = millis(settings.readTimeout());
    }

    /**
     * Parses {@code address}, opens its transport and connects (see {@link #connect}).
     *
     * @throws InvalidInputException if the address is malformed or has no transport
     * @throws ConnectFailedException if the link cannot be opened
     * @throws MeterException if the initial {@code *CLS} fails
     */
    public static ScpiClient open(String address, ScpiSettings settings) {
        return open(Address.parse(address), settings);
    }

    /** Opens {@code address}'s transport and connects (see {@link #connect}). */
    public static ScpiClient open(Address address, ScpiSettings settings) {
        return connect(Transports.open(address, settings.transportOptions()), settings);
    }

    /**
     * Starts a conversation over an open transport, which the client then owns (closes). Opens the
     * trace file if one is configured and sends {@code *CLS} if {@link ScpiSettings#clearOnConnect()}.
     */
    public static ScpiClient connect(Transport transport, ScpiSettings settings) {
        TrafficTrace trace = null;
        Transport t = transport;
        try {
            if (settings.tracePath() != null) {
                trace = TrafficTrace.open(settings.tracePath());
                trace.event("connected to " + transport.name());
                t = new TracingTransport(transport, trace);
            }
            ScpiClient client = new ScpiClient(t, settings, trace);
            if (settings.clearOnConnect()) {
                client.write("*CLS");
            }
            return client;
        } catch (RuntimeException e) {
            t.close();
            if (trace != null) {
                trace.close();
            }
            throw e;
        }
    }

    @Override
    public String address() {
        return transport.name();
    }

    /** The settings this client was opened with. */
    public ScpiSettings settings() {
        return settings;
    }

    @Override
    public void write(String message) {
        lock.lock();
        try {
            begin();
            send(message);
        } finally {
            lock.unlock();
        }
    }

    @Override
    public String query(String message) {
        return query(message, Duration.ZERO);
    }

    /**
     * {@link #query(String)} for a query the meter works on for about {@code expectedWork} (a
     * measurement, a sweep): the reply must be complete within {@code expectedWork} plus the read
     * timeout (the slack) after the query was sent.
     */
    @Override
    public String query(String message, Duration expectedWork) {
        lock.lock();
        try {
            return queryUnlocked(message, work(expectedWork));
        } finally {
            lock.unlock();
        }
    }

    @Override
    public List<String> queryLines(String message, int queries, Duration expectedWork) {
        lock.lock();
        try {
            List<String> lines = new ArrayList<>(queries);
            lines.add(queryUnlocked(message, work(expectedWork)));
            for (int i = 1; i < queries; i++) {
                int n = readLine(message, deadline(0));
                lines.add(new String(line, 0, n, StandardCharsets.ISO_8859_1));
            }
            return lines;
        } finally {
            lock.unlock();
        }
    }

    /**
     * Looks for bytes that answer no query (a reply sent twice, or one that came after its query
     * timed out), waiting at most {@code quiet} for them. When there are some, they are discarded
     * and the client resynchronises at once as after a failure (the late replies drained, then
     * {@code *OPC?} answered in the {@link Resync#OPC} mode), so that the next query gets its own
     * reply. Blocking; costs {@code quiet} when nothing is waiting.
     *
     * @return the discarded bytes, escaped as one line (at most 60 characters), or empty
     */
    public java.util.Optional<String> discardUnasked(Duration quiet) {
        lock.lock();
        try {
            if (closed || lost != null) {
                return java.util.Optional.empty();
            }
            if (pos >= lim) {
                pos = 0;
                lim = 0;
                int n = read(buf, 0, buf.length, Math.max(1, millis(quiet)), "(nothing: bytes nobody asked for)", 0);
                lim = n;
            }
            if (pos >= lim) {
                return java.util.Optional.empty();
            }
            String stray = ScpiValues.escape(buf, pos, lim - pos, 60);
            event("unasked bytes: " + stray);
            resync();
            return java.util.Optional.of(stray);
        } finally {
            lock.unlock();
        }
    }

    /**
     * Sends a query and returns the reply as bytes, without its terminator. A reply that starts
     * with a definite-length block ({@code #<n><len>}) is read by its length, so binary payloads
     * come back whole, header included; anything else is read up to the read terminator.
     */
    public byte[] queryBytes(String message) {
        lock.lock();
        try {
            begin();
            send(message);
            Deadline d = deadline(0);
            int first = nextByte(message, d, 0);
            if (first != '#') {
                pos -= 1;
                return Arrays.copyOf(line, readLine(message, d));
            }
            line[0] = '#';
            int digit = nextByte(message, d, 1);
            pos -= 1;
            if (digit >= '1' && digit <= '9') {
                return readDefiniteBlock(message, d, true);
            }
            return Arrays.copyOf(line, readLine(message, d, 1));
        } finally {
            lock.unlock();
        }
    }

    /**
     * Sends a query and parses the reply as one NR1/NR2/NR3 number; SCPI's 9.91E37 is
     * {@link Double#NaN}, ±9.9E37 are ±infinity.
     *
     * @throws ScpiProtocolException if the reply is not a number
     */
    public double queryNumber(String message) {
        String reply = query(message);
        try {
            return ScpiValues.parseNumber(reply);
        } catch (NumberFormatException e) {
            throw new ScpiProtocolException(address() + ": the reply to '" + message + "' is not a number: '"
                    + reply + "'", e);
        }
    }

    /**
     * Sends a query and parses the reply as a whole number (NR1, or an NR2/NR3 with an integral value).
     *
     * @throws ScpiProtocolException if the reply is not a whole number
     */
    public long queryInteger(String message) {
        String reply = query(message).strip();
        try {
            if (reply.matches("[+-]?\\d{1,18}")) {
                return Long.parseLong(reply.startsWith("+") ? reply.substring(1) : reply);
            }
            double v = ScpiValues.parseNumber(reply);
            if (v == Math.rint(v) && Math.abs(v) < 0x1p53) {
                return (long) v;
            }
        } catch (NumberFormatException e) {
            // reported below, with the reply
        }
        throw new ScpiProtocolException(address() + ": the reply to '" + message + "' is not a whole number: '"
                + reply + "'");
    }

    /** Sends a query and splits the reply at commas outside quoted strings (see {@link ScpiValues#splitList}). */
    public List<String> queryList(String message) {
        return ScpiValues.splitList(query(message));
    }

    /**
     * Sends a query whose reply is a comma-separated list of numbers; special values as in
     * {@link #queryNumber}. An empty reply is an empty array.
     *
     * @throws ScpiProtocolException naming the first element that is not a number
     */
    public double[] queryNumbers(String message) {
        String reply = query(message);
        List<String> items = ScpiValues.splitList(reply);
        double[] out = new double[items.size()];
        for (int i = 0; i < out.length; i++) {
            try {
                out[i] = ScpiValues.parseNumber(items.get(i));
            } catch (NumberFormatException e) {
                throw new ScpiProtocolException(address() + ": element " + (i + 1) + " of the reply to '" + message
                        + "' is not a number: '" + items.get(i) + "'", e);
            }
        }
        return out;
    }

    @Override
    public byte[] queryBlock(String message) {
        return queryBlock(message, Duration.ZERO);
    }

    @Override
    public byte[] queryBlock(String message, Duration expectedWork) {
        lock.lock();
        try {
            begin();
            send(message);
            return readBlock(message, deadline(work(expectedWork)));
        } finally {
            lock.unlock();
        }
    }

    @Override
    public BlocksReply queryBlocksThenText(String message, int blocks, Duration expectedWork) {
        lock.lock();
        try {
            begin();
            send(message);
            Deadline d = deadline(work(expectedWork));
            List<byte[]> got = new ArrayList<>(blocks);
            for (int k = 0; k < blocks; k++) {
                int first = nextByte(message, d, 0);
                if (first != '#') {
                    // no response to a failed query: what follows is the text unit
                    pos -= 1;
                    break;
                }
                line[0] = '#';
                int digit = nextByte(message, d, 1);
                if (digit == '0') {
                    outOfStep = true;
                    throw new ScpiProtocolException(address() + ": the reply to '" + message
                            + "' holds an indefinite-length block (#0), which ends the reply: no query may follow it");
                }
                pos -= 1;
                got.add(readDefinitePayload(message, d, false));
                int sep = nextByte(message, d, 0);
                if (sep == '\n') {
                    return new BlocksReply(got, ""); // no text unit followed
                }
                if (sep != ';') {
                    outOfStep = true;
                    throw new ScpiProtocolException(address() + ": expected ';' and the next response after block "
                            + (k + 1) + " of the reply to '" + message + "' but got '"
                            + ScpiValues.escape(new byte[] {(byte) sep}, 0, 1, 1) + "'");
                }
            }
            int n = readLine(message, d);
            return new BlocksReply(got, new String(line, 0, n, StandardCharsets.ISO_8859_1));
        } finally {
            lock.unlock();
        }
    }

    /**
     * Sends a query whose reply is a definite-length block of IEEE 754 doubles ({@code FORMat REAL,64})
     * in the given byte order ({@code FORMat:BORDer}); SCPI's special values are mapped as in
     * {@link #queryNumber}.
     *
     * @throws ScpiProtocolException if the payload length is not a multiple of 8
     */
    public double[] queryReal64(String message, BlockByteOrder order) {
        byte[] data = queryBlock(message);
        try {
            return ScpiValues.real64(data, order.byteOrder());
        } catch (IllegalArgumentException e) {
            throw new ScpiProtocolException(address() + ": the block replying to '" + message + "' has "
                    + data.length + " bytes, not a whole number of 8-byte REAL,64 values", e);
        }
    }

    @Override
    public List<ScpiError> drainErrors() {
        lock.lock();
        try {
            List<ScpiError> errors = new ArrayList<>();
            for (int i = 0; i < MAX_ERROR_ENTRIES; i++) {
                String reply = queryUnlocked(settings.errorQuery(), 0);
                ScpiError e;
                try {
                    e = ScpiValues.parseError(reply);
                } catch (NumberFormatException ex) {
                    throw new ScpiProtocolException(address() + ": the reply to '" + settings.errorQuery()
                            + "' is not an error entry: '" + reply + "'", ex);
                }
                if (e.code() == 0) {
                    return errors;
                }
                errors.add(e);
            }
            throw new ScpiProtocolException(address() + ": the error queue was not empty after "
                    + MAX_ERROR_ENTRIES + " reads of '" + settings.errorQuery() + "'");
        } finally {
            lock.unlock();
        }
    }

    /**
     * Reads the error queue ({@link #drainErrors()}) and throws if it held anything.
     *
     * @param context what was just done, for the message (e.g. {@code "applying the setting"})
     * @throws MeterErrorException carrying every entry, oldest first
     */
    public void checkErrors(String context) {
        List<ScpiError> errors = drainErrors();
        if (!errors.isEmpty()) {
            StringBuilder sb = new StringBuilder();
            for (ScpiError e : errors) {
                sb.append(sb.length() == 0 ? "" : "; ").append(e);
            }
            throw new MeterErrorException(address() + ": the meter reported " + errors.size()
                    + (errors.size() == 1 ? " error" : " errors") + " after " + context + ": " + sb, errors);
        }
    }

    /**
     * Waits until the meter has finished every pending operation: sends {@code *OPC?} and waits up
     * to {@code timeout} plus the read timeout for its {@code 1} (IEEE 488.2 §10.19); the same as
     * {@link #waitForCompletion(String, Duration) waitForCompletion("*OPC?", timeout)}.
     *
     * @throws MeterTimeoutException if the operations did not finish in time
     */
    public void waitForCompletion(Duration timeout) {
        waitForCompletion("*OPC?", timeout);
    }

    /** Closes the connection (and the trace); never throws, does not wait for a running call. */
    @Override
    public void close() {
        if (closed) {
            return;
        }
        closed = true;
        try {
            transport.close();
        } catch (RuntimeException e) {
            // closing is best effort: the link is being abandoned
        }
    }

    // ---- the conversation, called with the lock held ----

    private String queryUnlocked(String message, long expectedMillis) {
        begin();
        send(message);
        int n = readLine(message, deadline(expectedMillis));
        return new String(line, 0, n, StandardCharsets.ISO_8859_1);
    }

    /**
     * When a reply must be complete: {@code expectedMillis} of the meter's work plus
     * {@code slackMillis}, counted from when the query was sent.
     */
    /** How early a transport's timed-out read may come back (its millisecond rounding) and still be read again. */
    private static final long EARLY_MILLIS = 2;

    private record Deadline(long atNanos, long expectedMillis, long slackMillis) {
        long totalMillis() {
            return expectedMillis + slackMillis;
        }

        /** Milliseconds left, rounded up; 0 when the deadline has passed. */
        long remainingMillis() {
            long r = atNanos - System.nanoTime();
            return r <= 0 ? 0 : (r + 999_999) / 1_000_000;
        }
    }

    /** The deadline of a reply to a query just sent, which the meter works on for {@code expectedMillis}. */
    private Deadline deadline(long expectedMillis) {
        return new Deadline(System.nanoTime() + (expectedMillis + readTimeoutMillis) * 1_000_000L, expectedMillis,
                readTimeoutMillis);
    }

    private void begin() {
        if (closed) {
            throw new ConnectionLostException(address() + ": the connection is closed");
        }
        if (lost != null) {
            throw new ConnectionLostException(address() + ": the connection was lost earlier ("
                    + lost.getMessage() + "); reconnect", lost);
        }
        if (outOfStep) {
            resync();
        }
    }

    private void send(String message) {
        byte[] m = message.getBytes(StandardCharsets.ISO_8859_1);
        byte[] out = Arrays.copyOf(m, m.length + writeTerminator.length);
        System.arraycopy(writeTerminator, 0, out, m.length, writeTerminator.length);
        try {
            transport.write(out, 0, out.length);
        } catch (ConnectionLostException e) {
            throw lost(e, "while sending '" + message + "'");
        }
    }

    /** Discards late replies, then (in {@link Resync#OPC} mode) waits for the answer to {@code *OPC?}. */
    private void resync() {
        event("resynchronising: discarding late replies");
        pos = 0;
        lim = 0;
        long discarded = 0;
        long quiet = millis(settings.drainQuiet());
        long giveUp = System.nanoTime() + DRAIN_LIMIT_TIMEOUTS * readTimeoutMillis * 1_000_000L;
        int n;
        while ((n = read(buf, 0, buf.length, quiet, RESYNC, 0)) > 0) {
            discarded += n;
            if (System.nanoTime() - giveUp > 0) {
                throw new ScpiProtocolException(address() + ": the meter keeps sending (" + discarded
                        + " bytes discarded in " + DRAIN_LIMIT_TIMEOUTS + " read timeouts while resynchronising)");
            }
        }
        if (settings.resync() == Resync.OPC) {
            send("*OPC?");
            for (int i = 0; i < MAX_RESYNC_LINES; i++) {
                // the answer queues behind whatever late reply the meter still owes, which arrives
                // later than the slack by definition: recovery waits twice the slack per line
                int len = readLine(RESYNC, new Deadline(System.nanoTime() + RESYNC_SLACKS * readTimeoutMillis
                        * 1_000_000L, 0, RESYNC_SLACKS * readTimeoutMillis));
                if (len == 1 && line[0] == '1') {
                    outOfStep = false;
                    return;
                }
            }
            throw new ScpiProtocolException(address() + ": no answer 1 to '*OPC?' among " + MAX_RESYNC_LINES
                    + " reply lines while resynchronising");
        }
        outOfStep = false;
    }

    /** Reads one response message into {@link #line}; returns its length without the terminator. */
    private int readLine(String message, Deadline d) {
        return readLine(message, d, 0);
    }

    /** As {@link #readLine(String, Deadline)}, with {@code line[0, start)} already received. */
    private int readLine(String message, Deadline d, int start) {
        byte[] term = readTerminator;
        int tl = term.length;
        byte last = term[tl - 1];
        int len = start;
        while (true) {
            if (pos == lim) {
                fill(message, d, len);
            }
            int i = pos;
            int end = lim;
            while (i < end) {
                byte b = buf[i++];
                if (len == line.length) {
                    line = Arrays.copyOf(line, (int) Math.min((long) line.length * 2, lineLimit + 1L));
                }
                line[len++] = b;
                if (b == last && len >= tl && endsWithTerminator(len)) {
                    pos = i;
                    len -= tl;
                    if (dropCr && len > 0 && line[len - 1] == '\r') {
                        len--;
                    }
                    return len;
                }
                if (len > lineLimit) {
                    pos = i;
                    outOfStep = true;
                    throw new ScpiProtocolException(address() + ": the reply to '" + message + "' is longer than "
                            + settings.maxResponseBytes() + " bytes (the maximum response size)");
                }
            }
            pos = end;
        }
    }

    private boolean endsWithTerminator(int len) {
        int tl = readTerminator.length;
        for (int k = 0; k < tl; k++) {
            if (line[len - tl + k] != readTerminator[k]) {
                return false;
            }
        }
        return true;
    }

    /** Reads an arbitrary block (the header byte '#' not yet consumed) and its terminator. */
    private byte[] readBlock(String message, Deadline d) {
        int first = nextByte(message, d, 0);
        if (first != '#') {
            pos -= 1;
            int n = readLine(message, d);
            throw new ScpiProtocolException(address() + ": the reply to '" + message
                    + "' is not an arbitrary block (#...): '" + ScpiValues.escape(line, 0, n, 80) + "'");
        }
        line[0] = '#';
        int digit = nextByte(message, d, 1);
        if (digit == '0') {
            return Arrays.copyOf(line, readLine(message, d));
        }
        pos -= 1;
        return readDefiniteBlock(message, d, false);
    }

    /**
     * Reads {@code <n><len><payload>} and the terminator after it (the '#' consumed and stored in
     * {@code line[0]}); returns the payload, or with {@code withHeader} header and payload.
     */
    private byte[] readDefiniteBlock(String message, Deadline d, boolean withHeader) {
        byte[] data = readDefinitePayload(message, d, withHeader);
        int trailing = readLine(message, d);
        if (trailing != 0) {
            throw new ScpiProtocolException(address() + ": " + trailing + " unexpected bytes after the "
                    + data.length + "-byte block replying to '" + message + "': '"
                    + ScpiValues.escape(line, 0, trailing, 40) + "'");
        }
        return data;
    }

    /** As {@link #readDefiniteBlock}, leaving what follows the payload unread. */
    private byte[] readDefinitePayload(String message, Deadline d, boolean withHeader) {
        int digit = nextByte(message, d, 1);
        line[1] = (byte) digit;
        if (digit < '1' || digit > '9') {
            outOfStep = true;
            throw new ScpiProtocolException(address() + ": the reply to '" + message + "' starts '#"
                    + ScpiValues.escape(new byte[] {(byte) digit}, 0, 1, 1) + "', which is no block header");
        }
        int digits = digit - '0';
        long length = 0;
        for (int k = 0; k < digits; k++) {
            int c = nextByte(message, d, 2 + k);
            line[2 + k] = (byte) c;
            if (c < '0' || c > '9') {
                outOfStep = true;
                throw new ScpiProtocolException(address() + ": the block header of the reply to '" + message
                        + "' has a non-digit in its length: '" + ScpiValues.escape(line, 0, 3 + k, 16) + "'");
            }
            length = length * 10 + (c - '0');
        }
        if (length > settings.maxResponseBytes()) {
            outOfStep = true;
            throw new ScpiProtocolException(address() + ": the block replying to '" + message + "' announces "
                    + length + " bytes, more than the maximum response size " + settings.maxResponseBytes());
        }
        int header = withHeader ? 2 + digits : 0;
        byte[] data = new byte[header + (int) length];
        System.arraycopy(line, 0, data, 0, header);
        int got = Math.min(lim - pos, (int) length);
        System.arraycopy(buf, pos, data, header, got);
        pos += got;
        while (got < length) {
            long left = d.remainingMillis();
            int n = left == 0 ? 0 : read(data, header + got, (int) length - got, left, message, got);
            // a transport counting whole milliseconds may give up a fraction of one early: wait out the rest
            while (n == 0 && (left = d.remainingMillis()) > 0 && left <= EARLY_MILLIS) {
                n = read(data, header + got, (int) length - got, left, message, got);
            }
            if (n == 0) {
                outOfStep = true;
                event("deadline passed after " + d.totalMillis() + " ms in the block replying to '" + message + "'");
                throw new MeterTimeoutException(address() + ": the block replying to '" + message
                        + "' stopped after " + got + " of " + length + " bytes (" + waited(d) + ")",
                        Arrays.copyOfRange(data, header, header + got));
            }
            got += n;
        }
        return data;
    }

    private int nextByte(String message, Deadline d, int receivedSoFar) {
        if (pos == lim) {
            fill(message, d, receivedSoFar);
        }
        return buf[pos++] & 0xff;
    }

    /** Refills the receive buffer; {@code line[0, receivedSoFar)} is what this reply brought so far. */
    private void fill(String message, Deadline d, int receivedSoFar) {
        long left = d.remainingMillis();
        int n = left == 0 ? 0 : read(buf, 0, buf.length, left, message, receivedSoFar);
        // a transport counting whole milliseconds may give up a fraction of one early: wait out the rest
        while (n == 0 && (left = d.remainingMillis()) > 0 && left <= EARLY_MILLIS) {
            n = read(buf, 0, buf.length, left, message, receivedSoFar);
        }
        if (n == 0) {
            outOfStep = true;
            byte[] got = Arrays.copyOf(line, receivedSoFar);
            event("deadline passed after " + d.totalMillis() + " ms waiting for the reply to '" + message + "'");
            if (receivedSoFar == 0) {
                String hint = d.expectedMillis() < SHORT_WORK_MILLIS
                        ? "; is it a query, and does the meter use the terminators set here, write "
                                + show(writeTerminator) + ", read " + show(readTerminator) + "?"
                        : "";
                throw new MeterTimeoutException(address() + ": no reply to '" + message + "' (" + waited(d)
                        + "; nothing received" + hint + ")", got);
            }
            throw new MeterTimeoutException(address() + ": the reply to '" + message + "' was incomplete ("
                    + waited(d) + "): " + receivedSoFar + " bytes without the read terminator "
                    + show(readTerminator) + ": '" + ScpiValues.escape(got, 0, got.length, 80) + "'", got);
        }
        pos = 0;
        lim = n;
    }

    /** What was expected and how long was waited, for a timeout's message. */
    private static String waited(Deadline d) {
        if (d.expectedMillis() == 0) {
            return "waited " + human(d.totalMillis());
        }
        return "the meter was expected to take about " + human(d.expectedMillis()) + "; waited "
                + human(d.totalMillis()) + ", " + human(d.slackMillis()) + " beyond that";
    }

    private static String human(long millis) {
        return millis < 1000 ? millis + " ms" : String.format(java.util.Locale.ROOT, "%.1f s", millis / 1000.0);
    }

    /** A query's expected work in whole milliseconds (rounded up), 0 for none. */
    private static long work(Duration expected) {
        if (expected.isNegative() || expected.isZero()) {
            return 0;
        }
        return Math.max(1, (expected.toNanos() + 999_999) / 1_000_000);
    }

    private int read(byte[] into, int offset, int length, long timeoutMillis, String message, int receivedSoFar) {
        try {
            return transport.read(into, offset, length, timeoutMillis);
        } catch (ConnectionLostException e) {
            throw lost(e, "while waiting for the reply to '" + message + "'"
                    + (receivedSoFar > 0 ? " (" + receivedSoFar + " bytes received)" : ""));
        }
    }

    private ConnectionLostException lost(ConnectionLostException e, String doing) {
        if (closed) {
            return new ConnectionLostException(address() + ": the connection was closed " + doing, e);
        }
        lost = new ConnectionLostException(e.getMessage() + " " + doing, e);
        event("connection lost: " + lost.getMessage());
        return lost;
    }

    private void event(String text) {
        if (trace != null) {
            trace.event(text);
        }
    }

    private static String show(byte[] terminator) {
        String s = new String(terminator, StandardCharsets.ISO_8859_1);
        return switch (s) {
            case "\n" -> "LF";
            case "\r" -> "CR";
            case "\r\n" -> "CR LF";
            default -> "'" + ScpiValues.escape(terminator, 0, terminator.length, 16) + "'";
        };
    }

    private static long millis(Duration d) {
        return Math.max(1, d.toMillis());
    }
}
