package org.zweep.simulator.lan;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import org.zweep.simulator.server.InMemoryConnection;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Reads the instrument's status byte with {@code *STB?} over a side connection of its own, opened
 * on first use, so that a protocol's status query does not disturb the replies of the connection
 * it is asked for. The MAV bit (16) of the answer is about the side connection (always clear);
 * the caller adds its own. Thread-safe.
 */
public final class StatusProbe implements AutoCloseable {
    private final SimulatorServer meter;
    private InMemoryConnection conn;

    public StatusProbe(SimulatorServer meter) {
        this.meter = meter;
    }

    /**
     * The status byte, 0 to 255, or -1 when the instrument does not answer within {@code timeoutMillis}.
     *
     * @throws IOException if the simulator closed the side connection
     */
    public synchronized int statusByte(long timeoutMillis) throws IOException {
        if (conn == null) {
            conn = meter.connectInMemory();
        }
        conn.output().write("*STB?\n".getBytes(StandardCharsets.US_ASCII));
        conn.output().flush();
        StringBuilder sb = new StringBuilder();
        byte[] buf = new byte[64];
        long deadline = System.nanoTime() + Math.max(1, timeoutMillis) * 1_000_000L;
        while (sb.indexOf("\n") < 0) {
            long left = (deadline - System.nanoTime()) / 1_000_000L;
            if (left <= 0) {
                return -1;
            }
            int n = conn.read(buf, 0, buf.length, left);
            if (n < 0) {
                throw new IOException("the simulator closed the status connection");
            }
            sb.append(new String(buf, 0, Math.max(0, n), StandardCharsets.US_ASCII));
        }
        try {
            return Integer.parseInt(sb.toString().strip()) & 0xff;
        } catch (NumberFormatException e) {
            return -1;
        }
    }

    /** Closes the side connection; never throws. */
    @Override
    public synchronized void close() {
        if (conn != null) {
            conn.close();
        }
    }
}
