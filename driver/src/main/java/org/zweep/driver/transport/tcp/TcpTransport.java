package org.zweep.driver.transport.tcp;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.ConnectException;
import java.net.InetSocketAddress;
import java.net.NoRouteToHostException;
import java.net.Socket;
import java.net.SocketTimeoutException;
import java.net.UnknownHostException;
import java.time.Duration;
import org.zweep.driver.address.TcpAddress;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;

/**
 * A blocking TCP socket with TCP_NODELAY (each message leaves at once, no Nagle delay) and
 * keep-alive (a dead peer is noticed eventually on an idle link). Not thread-safe; see {@link Transport}.
 */
public final class TcpTransport implements Transport {
    private final String name;
    private final Socket socket;
    private final InputStream in;
    private final OutputStream out;
    private final long replySpinNanos;
    private int soTimeoutMillis = -1;

    private TcpTransport(String name, Socket socket, Duration replySpin) throws IOException {
        this.name = name;
        this.socket = socket;
        this.replySpinNanos = replySpin.toNanos();
        this.in = socket.getInputStream();
        this.out = socket.getOutputStream();
    }

    /**
     * Connects to {@code address}; blocks up to {@link TransportOptions#connectTimeout()}.
     *
     * @throws ConnectFailedException if the host is unknown, refuses, is unreachable or does not answer in time
     */
    public static TcpTransport connect(TcpAddress address, TransportOptions options) {
        String name = address.text();
        String where = address.host() + ":" + address.port();
        Socket socket = new Socket();
        try {
            socket.setTcpNoDelay(true);
            socket.setKeepAlive(true);
            InetSocketAddress target = new InetSocketAddress(address.host(), address.port());
            if (target.isUnresolved()) {
                throw new ConnectFailedException(name + ": unknown host '" + address.host() + "'");
            }
            socket.connect(target, (int) Math.max(1, Math.min(Integer.MAX_VALUE, options.connectTimeout().toMillis())));
            return new TcpTransport(name, socket, options.replySpin());
        } catch (ConnectFailedException e) {
            closeQuietly(socket);
            throw e;
        } catch (SocketTimeoutException e) {
            closeQuietly(socket);
            throw new ConnectFailedException(name + ": no answer from " + where + " within "
                    + options.connectTimeout().toMillis() + " ms while connecting (is the meter on the network?)", e);
        } catch (ConnectException e) {
            closeQuietly(socket);
            throw new ConnectFailedException(name + ": connection refused by " + where
                    + " (is the meter on and listening on port " + address.port() + "?)", e);
        } catch (NoRouteToHostException | UnknownHostException e) {
            closeQuietly(socket);
            throw new ConnectFailedException(name + ": cannot reach " + where + ": " + e.getMessage(), e);
        } catch (IOException e) {
            closeQuietly(socket);
            throw new ConnectFailedException(name + ": cannot connect to " + where + ": " + e.getMessage(), e);
        }
    }

    /** Whether TCP_NODELAY is on (it always is: each message leaves at once). */
    public boolean noDelay() {
        try {
            return socket.getTcpNoDelay();
        } catch (IOException e) {
            return false;
        }
    }

    /** Whether SO_KEEPALIVE is on (it always is). */
    public boolean keepAlive() {
        try {
            return socket.getKeepAlive();
        } catch (IOException e) {
            return false;
        }
    }

    @Override
    public String name() {
        return name;
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        try {
            out.write(data, offset, length);
        } catch (IOException e) {
            throw new ConnectionLostException(name + ": link broke while sending: " + e.getMessage(), e);
        }
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        try {
            int t = (int) Math.max(1, Math.min(Integer.MAX_VALUE, timeoutMillis));
            // A reply that arrives within the spin is read without the timed wait's poll and wake-up.
            long spinEnd = System.nanoTime() + replySpinNanos;
            while (replySpinNanos > 0 && in.available() == 0 && System.nanoTime() < spinEnd) {
                Thread.onSpinWait();
            }
            if (t != soTimeoutMillis) {
                socket.setSoTimeout(t);
                soTimeoutMillis = t;
            }
            int n = in.read(buffer, offset, length);
            if (n < 0) {
                throw new ConnectionLostException(name + ": the meter closed the connection");
            }
            return n;
        } catch (SocketTimeoutException e) {
            return 0;
        } catch (IOException e) {
            throw new ConnectionLostException(name + ": link broke while receiving: " + e.getMessage(), e);
        }
    }

    @Override
    public void close() {
        closeQuietly(socket);
    }

    private static void closeQuietly(Socket s) {
        try {
            s.close();
        } catch (IOException e) {
            // nothing more can be done for a socket being abandoned
        }
    }
}
