package org.zweep.driver.transport.hislip;

import java.io.IOException;
import java.net.InetSocketAddress;
import java.time.Duration;
import org.zweep.driver.transport.Deadline;
import org.zweep.driver.transport.TimedSocket;

/**
 * One HiSLIP TCP connection (IVI-6.1 §2): messages of a 16-byte header (prologue {@code HS},
 * message type, control code, 32-bit message parameter, 64-bit payload length, network byte order)
 * and a payload. Reading is resumable: a header or payload cut short by a timeout is finished by
 * the next call. Not thread-safe.
 */
final class HislipChannel implements AutoCloseable {
    static final int HEADER_BYTES = 16;

    /** A message header. */
    record Header(int type, int control, int parameter, long length) {
    }

    private final TimedSocket socket;
    private final byte[] header = new byte[HEADER_BYTES];
    private int headerGot;

    private HislipChannel(TimedSocket socket) {
        this.socket = socket;
    }

    static HislipChannel connect(InetSocketAddress target, Duration connectTimeout, Duration replySpin)
            throws IOException {
        return new HislipChannel(TimedSocket.connect(target, connectTimeout, replySpin));
    }

    /** Sends one message, header and payload in one write. */
    void send(int type, int control, int parameter, byte[] payload, int offset, int length) throws IOException {
        byte[] m = new byte[HEADER_BYTES + length];
        m[0] = 'H';
        m[1] = 'S';
        m[2] = (byte) type;
        m[3] = (byte) control;
        m[4] = (byte) (parameter >>> 24);
        m[5] = (byte) (parameter >>> 16);
        m[6] = (byte) (parameter >>> 8);
        m[7] = (byte) parameter;
        for (int i = 0; i < 8; i++) {
            m[8 + i] = (byte) ((long) length >>> (56 - 8 * i));
        }
        System.arraycopy(payload, offset, m, HEADER_BYTES, length);
        socket.write(m, 0, m.length);
    }

    void send(int type, int control, int parameter) throws IOException {
        send(type, control, parameter, new byte[0], 0, 0);
    }

    /**
     * The next header, waiting up to {@code timeoutMillis}; null if it did not come in time.
     *
     * @throws HislipException if the prologue is not {@code HS}
     */
    Header readHeader(long timeoutMillis) throws IOException {
        Deadline deadline = Deadline.after(timeoutMillis);
        while (headerGot < HEADER_BYTES) {
            int n = socket.readSome(header, headerGot, HEADER_BYTES - headerGot, deadline);
            if (n == 0) {
                return null;
            }
            headerGot += n;
        }
        headerGot = 0;
        if (header[0] != 'H' || header[1] != 'S') {
            throw new HislipException(String.format("a message without the HS prologue (%02X %02X)", header[0] & 0xff,
                    header[1] & 0xff));
        }
        long length = 0;
        for (int i = 0; i < 8; i++) {
            length = (length << 8) | (header[8 + i] & 0xff);
        }
        int parameter = ((header[4] & 0xff) << 24) | ((header[5] & 0xff) << 16) | ((header[6] & 0xff) << 8)
                | (header[7] & 0xff);
        return new Header(header[2] & 0xff, header[3] & 0xff, parameter, length);
    }

    /** Reads payload bytes, at least one unless the time runs out (then 0). */
    int readPayload(byte[] into, int offset, int length, long timeoutMillis) throws IOException {
        return socket.readSome(into, offset, length, Deadline.after(timeoutMillis));
    }

    /** A whole (small) payload, or null when it did not come in time. */
    byte[] readAll(long length, long timeoutMillis) throws IOException {
        byte[] b = new byte[(int) length];
        Deadline deadline = Deadline.after(timeoutMillis);
        int got = 0;
        while (got < b.length) {
            int n = socket.readSome(b, got, b.length - got, deadline);
            if (n == 0) {
                return null;
            }
            got += n;
        }
        return b;
    }

    @Override
    public void close() {
        socket.close();
    }

    /** The peer broke the HiSLIP protocol. */
    static final class HislipException extends RuntimeException {
        private static final long serialVersionUID = 1L;

        HislipException(String message) {
            super(message);
        }
    }
}
