package org.zweep.runner.cli;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * A minimal meter on a loopback port for command-line tests: answers {@code *IDN?}, remembers
 * {@code FREQ <x>} for {@code FREQ?}, sends a binary block for {@code DATA?}, answers {@code TWICE?}
 * twice (a duplicated reply), {@code *OPC?} with 1, and never answers {@code HANG?}. Serves connections one after another until closed.
 */
final class TinyMeter implements AutoCloseable {
    static final String IDN = "Korvane Passives,KP-LCR-1,0001,1.0";

    private final ServerSocket server;
    private final Thread thread;
    final List<String> received = new CopyOnWriteArrayList<>();

    TinyMeter() {
        try {
            server = new ServerSocket(0, 5, InetAddress.getLoopbackAddress());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        thread = new Thread(this::run, "tiny-meter");
        thread.setDaemon(true);
        thread.start();
    }

    String address() {
        return "tcp://127.0.0.1:" + server.getLocalPort();
    }

    private void run() {
        while (!server.isClosed()) {
            try (Socket s = server.accept()) {
                serve(s);
            } catch (IOException e) {
                // closed, or the client went away: wait for the next one
            }
        }
    }

    private void serve(Socket s) throws IOException {
        BufferedReader in = new BufferedReader(new InputStreamReader(s.getInputStream(), StandardCharsets.ISO_8859_1));
        OutputStream out = s.getOutputStream();
        String freq = "1.000000E+03";
        String line;
        while ((line = in.readLine()) != null) {
            received.add(line);
            String reply = null;
            if (line.equals("*IDN?")) {
                reply = IDN + "\n";
            } else if (line.startsWith("FREQ ")) {
                freq = line.substring(5);
            } else if (line.equals("FREQ?")) {
                reply = freq + "\n";
            } else if (line.equals("TWICE?")) {
                reply = "twice\ntwice\n";
            } else if (line.equals("*OPC?")) {
                reply = "1\n";
            } else if (line.equals("DATA?")) {
                reply = "#14a\n\u0001b\n";
            }
            if (reply != null) {
                out.write(reply.getBytes(StandardCharsets.ISO_8859_1));
                out.flush();
            }
        }
    }

    @Override
    public void close() throws IOException {
        server.close();
        try {
            thread.join(2000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
