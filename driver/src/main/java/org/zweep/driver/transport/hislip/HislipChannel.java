package org.zweep.driver.transport.hislip;

import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.net.Socket;
import java.net.SocketTimeoutException;
import java.time.Duration;

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

    private final Socket socket;
    private final InputStream in;
    private final OutputStream out;
    private final long replySpinNanos;
    private final byte[] header = new byte[HEADER_BYTES];
    private int headerGot;
    private int soTimeoutMillis = -1;

    private HislipChannel(Socket socket, Duration replySpin) throws IOException {
        this.socket = socket;
        this.in = socket.getInputStream();
        this.out = socket.getOutputStream();
        this.replySpinNanos = replySpin.toNanos();
    }

    static HislipChannel connect(InetSocketAddress target, Duration connectTimeout, Duration replySpin)
            throws IOException {
        Socket s = new Socket();
        try {
            s.setTcpNoDelay(true);
            s.setKeepAlive(true);
            s.connect(target, (int) Math.max(1, Math.min(Integer.MAX_VALUE, connectTimeout.toMillis())));
            return new HislipChannel(s, replySpin);
        } catch (IOException | RuntimeException e) {
            s.close();
            throw e;
        }
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
        out.write(m);
        out.flush();
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
        long deadline = System.nanoTime() + Math.max(1, timeoutMillis) * 1_000_000L;
        while (headerGot < HEADER_BYTES) {
            int n = readSome(header, headerGot, HEADER_BYTES - headerGot, deadline);
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
        return readSome(into, offset, length, System.nanoTime() + Math.max(1, timeoutMillis) * 1_000_000L);
    }

    /** A whole (small) payload, or null when it did not come in time. */
    byte[] readAll(long length, long timeoutMillis) throws IOException {
        byte[] b = new byte[(int) length];
        long deadline = System.nanoTime() + Math.max(1, timeoutMillis) * 1_000_000L;
        int got = 0;
        while (got < b.length) {
            int n = readSome(b, got, b.length - got, deadline);
            if (n == 0) {
                return null;
            }
            got += n;
        }
        return b;
    }

    private int readSome(byte[] into, int offset, int length, long deadline) throws IOException {
        long spinEnd = System.nanoTime() + replySpinNanos;
        while (replySpinNanos > 0 && in.available() == 0 && System.nanoTime() - spinEnd < 0) {
            Thread.onSpinWait();
        }
        long left = deadline - System.nanoTime();
        if (left <= 0 && in.available() == 0) {
            return 0;
        }
        int t = (int) Math.max(1, Math.min(Integer.MAX_VALUE, (left + 999_999) / 1_000_000));
        if (t != soTimeoutMillis) {
            socket.setSoTimeout(t);
            soTimeoutMillis = t;
        }
        try {
            int n = in.read(into, offset, length);
            if (n < 0) {
                throw new EOFException("the server closed the connection");
            }
            return n;
        } catch (SocketTimeoutException e) {
            return 0;
        }
    }

    @Override
    public void close() {
        try {
            socket.close();
        } catch (IOException e) {
            // closing is best effort
        }
    }

    /** The peer broke the HiSLIP protocol. */
    static final class HislipException extends RuntimeException {
        private static final long serialVersionUID = 1L;

        HislipException(String message) {
            super(message);
        }
    }
}
