package org.zweep.runner.it;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * A loopback TCP relay to a meter that can be frozen: once frozen it forwards nothing in either
 * direction but keeps every connection open, as a link whose far end stopped answering does (a
 * hung meter, a switch that dropped the path). Connections made while frozen are accepted and hang.
 */
final class FreezableProxy implements AutoCloseable {
    private final ServerSocket listener;
    private final int targetPort;
    private final List<Socket> sockets = new CopyOnWriteArrayList<>();
    private volatile boolean frozen;
    private volatile boolean closed;

    FreezableProxy(int targetPort) throws IOException {
        this.targetPort = targetPort;
        this.listener = new ServerSocket(0, 50, InetAddress.getLoopbackAddress());
        Thread t = new Thread(this::acceptLoop, "proxy-accept");
        t.setDaemon(true);
        t.start();
    }

    int port() {
        return listener.getLocalPort();
    }

    /** Stops forwarding; bytes already in flight inside the relay are held back too. */
    void freeze() {
        frozen = true;
    }

    private void acceptLoop() {
        while (!closed) {
            try {
                Socket client = listener.accept();
                Socket meter = new Socket(InetAddress.getLoopbackAddress(), targetPort);
                client.setTcpNoDelay(true);
                meter.setTcpNoDelay(true);
                sockets.add(client);
                sockets.add(meter);
                pump(client, meter);
                pump(meter, client);
            } catch (IOException e) {
                if (closed) {
                    return;
                }
            }
        }
    }

    private void pump(Socket from, Socket to) {
        Thread t = new Thread(() -> {
            byte[] buf = new byte[8192];
            try (InputStream in = from.getInputStream(); OutputStream out = to.getOutputStream()) {
                int n;
                while ((n = in.read(buf)) >= 0) {
                    while (frozen && !closed) {
                        Thread.sleep(20);
                    }
                    if (closed) {
                        return;
                    }
                    out.write(buf, 0, n);
                    out.flush();
                }
                to.shutdownOutput();
            } catch (IOException | InterruptedException e) {
                // one side went away: the relay ends with it
            }
        }, "proxy-pump");
        t.setDaemon(true);
        t.start();
    }

    @Override
    public void close() throws IOException {
        closed = true;
        listener.close();
        for (Socket s : sockets) {
            s.close();
        }
    }
}
