package org.zweep.driver.transport;

import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.net.Socket;
import java.net.SocketTimeoutException;
import java.time.Duration;

/**
 * A client TCP socket with TCP_NODELAY and keep-alive whose reads end at a {@link Deadline}: the one
 * socket handling of the TCP, HiSLIP and VXI-11 transports. A read first spins for the reply spin
 * (a reply that comes within it is read without the timed wait's poll and wake-up), then waits with
 * a socket timeout of the time left, rounded up. Not thread-safe, except {@link #close()}.
 */
public final class TimedSocket implements AutoCloseable {
    private final Socket socket;
    private final InputStream in;
    private final OutputStream out;
    private final long replySpinNanos;
    private int soTimeoutMillis = -1;

    private TimedSocket(Socket socket, Duration replySpin) throws IOException {
        this.socket = socket;
        this.in = socket.getInputStream();
        this.out = socket.getOutputStream();
        this.replySpinNanos = replySpin.toNanos();
    }

    /**
     * Connects to {@code target}, waiting up to {@code connectTimeout}.
     *
     * @throws SocketTimeoutException if the connection is not made in time
     * @throws IOException if it is refused or the host unreachable
     */
    public static TimedSocket connect(InetSocketAddress target, Duration connectTimeout, Duration replySpin)
            throws IOException {
        Socket s = new Socket();
        try {
            s.setTcpNoDelay(true);
            s.setKeepAlive(true);
            s.connect(target, (int) Math.max(1, Math.min(Integer.MAX_VALUE, connectTimeout.toMillis())));
            return new TimedSocket(s, replySpin);
        } catch (IOException | RuntimeException e) {
            s.close();
            throw e;
        }
    }

    /**
     * Reads at least one byte into {@code into}, or returns 0 when {@code deadline} passes first.
     *
     * @throws EOFException if the peer closed the connection
     * @throws IOException if the connection broke
     */
    public int readSome(byte[] into, int offset, int length, Deadline deadline) throws IOException {
        long spinEnd = System.nanoTime() + replySpinNanos;
        while (replySpinNanos > 0 && in.available() == 0 && System.nanoTime() - spinEnd < 0) {
            Thread.onSpinWait();
        }
        if (deadline.passed() && in.available() == 0) {
            return 0;
        }
        int t = (int) Math.min(Integer.MAX_VALUE, deadline.millisLeftRoundedUp());
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

    /** Writes {@code length} bytes and flushes. */
    public void write(byte[] data, int offset, int length) throws IOException {
        out.write(data, offset, length);
        out.flush();
    }

    /** Whether TCP_NODELAY is on (false if the socket cannot say). */
    public boolean noDelay() {
        try {
            return socket.getTcpNoDelay();
        } catch (IOException e) {
            return false;
        }
    }

    /** Whether SO_KEEPALIVE is on (false if the socket cannot say). */
    public boolean keepAlive() {
        try {
            return socket.getKeepAlive();
        } catch (IOException e) {
            return false;
        }
    }

    /** Closes the socket, ending a read waiting in another thread; never throws. */
    @Override
    public void close() {
        try {
            socket.close();
        } catch (IOException e) {
            // closing is best effort: the connection is being abandoned
        }
    }
}
