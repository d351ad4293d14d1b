package org.zweep.driver.testpeer;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;

/**
 * A real TCP server on 127.0.0.1, port 0, serving one connection with a {@link ScriptedPeer}.
 * {@link #close()} releases the peer, closes the sockets, complains if the serving thread is
 * still running, and verifies the script.
 */
public final class LoopbackServer implements AutoCloseable {
    private final ServerSocket server;
    private final ScriptedPeer peer;
    private final Thread thread;
    private volatile Socket socket;

    public LoopbackServer(ScriptedPeer peer) {
        this.peer = peer;
        try {
            server = new ServerSocket(0, 1, InetAddress.getLoopbackAddress());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        thread = new Thread(this::run, "loopback-scpi-peer");
        thread.setDaemon(true);
        thread.start();
    }

    private void run() {
        try (Socket s = server.accept()) {
            socket = s;
            s.setTcpNoDelay(true);
            peer.serve(new java.io.BufferedInputStream(s.getInputStream()), s.getOutputStream());
        } catch (IOException e) {
            // the server was closed before a client came, or the connection broke
        }
    }

    public int port() {
        return server.getLocalPort();
    }

    /** {@code tcp://127.0.0.1:PORT}. */
    public String address() {
        return "tcp://127.0.0.1:" + port();
    }

    public ScriptedPeer peer() {
        return peer;
    }

    @Override
    public void close() throws IOException {
        peer.stop();
        server.close();
        Socket s = socket;
        if (s != null) {
            s.close();
        }
        join(thread);
        if (thread.isAlive()) {
            throw new AssertionError("the peer thread is still running after close");
        }
        peer.verify();
    }

    private static void join(Thread t) {
        try {
            t.join(2000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
