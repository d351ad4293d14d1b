package org.zweep.simulator.server;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.net.Socket;
import java.nio.charset.StandardCharsets;

/** A bare-socket SCPI client for the tests: no driver code, just bytes. */
final class RawClient implements AutoCloseable {
    private final Socket socket;
    private final InputStream in;
    private final OutputStream out;

    RawClient(InetSocketAddress address) throws IOException {
        socket = new Socket();
        socket.connect(address, 2000);
        socket.setTcpNoDelay(true);
        socket.setSoTimeout(5000);
        in = socket.getInputStream();
        out = socket.getOutputStream();
    }

    RawClient(SimulatorServer server) throws IOException {
        this(server.address());
    }

    void timeout(int ms) throws IOException {
        socket.setSoTimeout(ms);
    }

    void send(String message) throws IOException {
        out.write((message + "\n").getBytes(StandardCharsets.ISO_8859_1));
        out.flush();
    }

    void sendRaw(byte[] bytes) throws IOException {
        out.write(bytes);
        out.flush();
    }

    /** Reads one reply up to LF (LF removed); throws SocketTimeoutException; null at end of stream. */
    String readLine() throws IOException {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        while (true) {
            int c = in.read();
            if (c < 0) {
                return b.size() == 0 ? null : b.toString(StandardCharsets.ISO_8859_1);
            }
            if (c == '\n') {
                return b.toString(StandardCharsets.ISO_8859_1);
            }
            b.write(c);
        }
    }

    String query(String message) throws IOException {
        send(message);
        return readLine();
    }

    /** One read call: what arrives in one go, or -1 bytes at end of stream (then an empty array). */
    byte[] readSome() throws IOException {
        byte[] buf = new byte[4096];
        int n = in.read(buf);
        return n < 0 ? new byte[0] : java.util.Arrays.copyOf(buf, n);
    }

    /** Whether the server closed the connection (a read returns end of stream within the timeout). */
    boolean closedByServer() throws IOException {
        try {
            return in.read() < 0;
        } catch (java.net.SocketException e) {
            return true; // reset by the peer
        }
    }

    @Override
    public void close() throws IOException {
        socket.close();
    }
}
