package org.zweep.driver.transport.tcp;

import java.io.EOFException;
import java.io.IOException;
import java.net.ConnectException;
import java.net.InetSocketAddress;
import java.net.NoRouteToHostException;
import java.net.SocketTimeoutException;
import java.net.UnknownHostException;
import org.zweep.driver.address.TcpAddress;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.Deadline;
import org.zweep.driver.transport.TimedSocket;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;

/**
 * A blocking TCP socket with TCP_NODELAY (each message leaves at once, no Nagle delay) and
 * keep-alive (a dead peer is noticed eventually on an idle link). Not thread-safe; see {@link Transport}.
 */
public final class TcpTransport implements Transport {
    private final String name;
    private final TimedSocket socket;

    private TcpTransport(String name, TimedSocket socket) {
        this.name = name;
        this.socket = socket;
    }

    /**
     * Connects to {@code address}; blocks up to {@link TransportOptions#connectTimeout()}.
     *
     * @throws ConnectFailedException if the host is unknown, refuses, is unreachable or does not answer in time
     */
    public static TcpTransport connect(TcpAddress address, TransportOptions options) {
        String name = address.text();
        String where = address.host() + ":" + address.port();
        InetSocketAddress target = new InetSocketAddress(address.host(), address.port());
        if (target.isUnresolved()) {
            throw new ConnectFailedException(name + ": unknown host '" + address.host() + "'");
        }
        try {
            return new TcpTransport(name, TimedSocket.connect(target, options.connectTimeout(), options.replySpin()));
        } catch (SocketTimeoutException e) {
            throw new ConnectFailedException(name + ": no answer from " + where + " within "
                    + options.connectTimeout().toMillis() + " ms while connecting (is the meter on the network?)", e);
        } catch (ConnectException e) {
            throw new ConnectFailedException(name + ": connection refused by " + where
                    + " (is the meter on and listening on port " + address.port() + "?)", e);
        } catch (NoRouteToHostException | UnknownHostException e) {
            throw new ConnectFailedException(name + ": cannot reach " + where + ": " + e.getMessage(), e);
        } catch (IOException e) {
            throw new ConnectFailedException(name + ": cannot connect to " + where + ": " + e.getMessage(), e);
        }
    }

    /** Whether TCP_NODELAY is on (it always is: each message leaves at once). */
    public boolean noDelay() {
        return socket.noDelay();
    }

    /** Whether SO_KEEPALIVE is on (it always is). */
    public boolean keepAlive() {
        return socket.keepAlive();
    }

    @Override
    public String name() {
        return name;
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        try {
            socket.write(data, offset, length);
        } catch (IOException e) {
            throw new ConnectionLostException(name + ": link broke while sending: " + e.getMessage(), e);
        }
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        try {
            return socket.readSome(buffer, offset, length, Deadline.after(timeoutMillis));
        } catch (EOFException e) {
            throw new ConnectionLostException(name + ": the meter closed the connection");
        } catch (IOException e) {
            throw new ConnectionLostException(name + ": link broke while receiving: " + e.getMessage(), e);
        }
    }

    @Override
    public void close() {
        socket.close();
    }
}
