package org.zweep.driver.transport;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/** The meter behind the LAN transport ITs (a 220 Ω resistor, no timing) and line I/O over any transport. */
public final class LanTestMeter {
    private static final BenchSpec R = BenchSpec.ofNetlist("R1 hi lo 220", "test").ideal();

    private LanTestMeter() {
    }

    /** Starts the simulator on a free port, untimed; the caller closes it. */
    public static SimulatorServer start() throws IOException {
        return SimulatorServer.start(new SimulatedBench(R), ServerOptions.defaults().withPort(0)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
    }

    /** Writes {@code message} as it is (ISO-8859-1). */
    public static void send(Transport t, String message) {
        byte[] b = message.getBytes(StandardCharsets.ISO_8859_1);
        t.write(b, 0, b.length);
    }

    /** Reads up to and including a line feed, each read waiting up to {@code timeoutMillis}. */
    public static String readLine(Transport t, long timeoutMillis) {
        StringBuilder sb = new StringBuilder();
        byte[] buf = new byte[256];
        while (sb.indexOf("\n") < 0) {
            int n = t.read(buf, 0, buf.length, timeoutMillis);
            if (n == 0) {
                throw new AssertionError("no reply within " + timeoutMillis + " ms, got '" + sb + "'");
            }
            sb.append(new String(buf, 0, n, StandardCharsets.ISO_8859_1));
        }
        return sb.toString();
    }
}
