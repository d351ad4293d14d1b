package org.zweep.bench.driver;

import java.io.BufferedInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.charset.StandardCharsets;

/** A minimal meter on loopback: answers every LF-terminated message with one fixed reply line. */
final class EchoPeer implements AutoCloseable {
    static final byte[] REPLY = "Korvane Passives,KP-LCR-1,0001,1.0\n".getBytes(StandardCharsets.US_ASCII);

    private final ServerSocket server;
    private final Thread thread;

    EchoPeer() {
        try {
            server = new ServerSocket(0, 1, InetAddress.getLoopbackAddress());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        thread = new Thread(this::run, "echo-peer");
        thread.setDaemon(true);
        thread.start();
    }

    int port() {
        return server.getLocalPort();
    }

    private void run() {
        try (Socket s = server.accept()) {
            s.setTcpNoDelay(true);
            InputStream in = new BufferedInputStream(s.getInputStream());
            OutputStream out = s.getOutputStream();
            int b;
            while ((b = in.read()) >= 0) {
                if (b == '\n') {
                    out.write(REPLY);
                }
            }
        } catch (IOException e) {
            // the benchmark closed the connection
        }
    }

    @Override
    public void close() throws IOException {
        server.close();
    }
}
