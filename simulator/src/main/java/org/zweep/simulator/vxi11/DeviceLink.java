package org.zweep.simulator.vxi11;

import java.io.IOException;
import java.io.InterruptedIOException;
import java.io.OutputStream;
import java.util.Arrays;
import org.zweep.simulator.lan.ResponseEnd;
import org.zweep.simulator.lan.StatusProbe;
import org.zweep.simulator.server.InMemoryConnection;
import org.zweep.simulator.server.SimulatorServer;

/**
 * One VXI-11 link: an in-memory connection to the simulator and the reply bytes not yet read,
 * with the position of the next response message end. Called by the core channel's thread of the
 * link's connection; {@link #abort()} comes from the abort channel's thread.
 */
final class DeviceLink {
    /** What one {@code device_read} returns. */
    record Piece(int error, int reason, byte[] data) {
    }

    private static final byte[] NONE = new byte[0];

    final int id;
    final RpcListener.Channel channel;
    private final ResponseEnd ends = new ResponseEnd();
    private final Object abortGuard = new Object();
    private final SimulatorServer meter;
    private InMemoryConnection conn;
    private final StatusProbe probe;
    private byte[] buf = new byte[8192];
    private int pos;
    private int lim;
    private int scanPos;
    private int endMark = -1;
    private int endReason;
    private Thread reader;
    private boolean aborted;

    DeviceLink(int id, RpcListener.Channel channel, SimulatorServer meter) {
        this.id = id;
        this.channel = channel;
        this.meter = meter;
        this.conn = meter.connectInMemory();
        this.probe = new StatusProbe(meter);
    }

    /** Passes a program message (piece) on; END without a final newline adds one (the simulator frames by newline). */
    void write(byte[] data, boolean end) throws IOException {
        OutputStream o = conn.output();
        o.write(data);
        if (end && (data.length == 0 || data[data.length - 1] != '\n')) {
            o.write('\n');
        }
        o.flush();
    }

    /**
     * Up to {@code requestSize} bytes: to the end of the next response message (reason END), or
     * to {@code termChar} (CHR) when one is set, or {@code requestSize} bytes (REQCNT); error 15 with
     * what arrived when {@code ioTimeoutMillis} passes first, error 23 when aborted.
     *
     * @throws IOException when the simulator closed the connection (a dropped link)
     */
    Piece read(int requestSize, long ioTimeoutMillis, int termChar) throws IOException {
        long deadline = System.nanoTime() + ioTimeoutMillis * 1_000_000L;
        synchronized (abortGuard) {
            reader = Thread.currentThread();
            aborted = false;
        }
        try {
            while (true) {
                while (endMark < 0 && scanPos < lim) {
                    byte b = buf[scanPos++];
                    if (ends.endsAt(b)) {
                        endMark = scanPos;
                        endReason = Vxi11Server.REASON_END;
                    } else if (termChar >= 0 && (b & 0xff) == termChar) {
                        endMark = scanPos;
                        endReason = Vxi11Server.REASON_CHR;
                    }
                }
                if (endMark >= 0 && endMark - pos <= requestSize) {
                    return take(endMark - pos, 0, endReason);
                }
                if (lim - pos >= requestSize) {
                    return take(requestSize, 0, Vxi11Server.REASON_REQCNT);
                }
                long left = deadline - System.nanoTime();
                if (left <= 0) {
                    return take(lim - pos, Vxi11Server.ERR_TIMEOUT, 0);
                }
                left = (left + 999_999L) / 1_000_000L; // rounded up: never time out before the deadline
                makeRoom();
                int n;
                try {
                    n = conn.read(buf, lim, buf.length - lim, left);
                } catch (InterruptedIOException e) {
                    synchronized (abortGuard) {
                        if (aborted) {
                            return new Piece(Vxi11Server.ERR_ABORT, 0, NONE);
                        }
                    }
                    throw e;
                }
                if (n < 0) {
                    throw new IOException("the simulator closed the connection");
                }
                lim += n;
            }
        } finally {
            synchronized (abortGuard) {
                reader = null;
                Thread.interrupted(); // an abort that came too late must not hit the next call
            }
        }
    }

    private Piece take(int n, int error, int reason) {
        byte[] data = Arrays.copyOfRange(buf, pos, pos + n);
        pos += n;
        if (endMark >= 0 && pos >= endMark) {
            endMark = -1;
        }
        if (pos == lim) {
            pos = 0;
            lim = 0;
            scanPos = 0;
        }
        return new Piece(error, reason, data);
    }

    private void makeRoom() {
        if (lim < buf.length) {
            return;
        }
        if (pos > 0) {
            System.arraycopy(buf, pos, buf, 0, lim - pos);
            lim -= pos;
            scanPos -= pos;
            if (endMark >= 0) {
                endMark -= pos;
            }
            pos = 0;
        } else {
            buf = Arrays.copyOf(buf, buf.length * 2);
        }
    }

    /** Interrupts a {@link #read} in progress, which then answers error 23. */
    void abort() {
        synchronized (abortGuard) {
            if (reader != null) {
                aborted = true;
                reader.interrupt();
            }
        }
    }

    /**
     * Device clear (IEEE 488.2 §5.8): unread replies and half-received messages are discarded by
     * starting a fresh connection to the simulator (a new parser, an empty output queue).
     */
    void clear() {
        conn.close();
        conn = meter.connectInMemory();
        pos = 0;
        lim = 0;
        scanPos = 0;
        endMark = -1;
        ends.reset();
    }

    /**
     * The status byte: the instrument's {@code *STB?} (read over a side connection), with MAV
     * (bit 4) from this link's own unread replies. -1 when the simulator does not answer in time.
     */
    int statusByte(long ioTimeoutMillis) throws IOException {
        int stb = probe.statusByte(ioTimeoutMillis);
        if (stb < 0) {
            return -1;
        }
        if (lim == pos) {
            makeRoom();
            int n = conn.read(buf, lim, buf.length - lim, 1);
            if (n > 0) {
                lim += n;
            }
        }
        return lim > pos ? stb | 0x10 : stb & ~0x10;
    }

    void close() {
        conn.close();
        probe.close();
    }
}
