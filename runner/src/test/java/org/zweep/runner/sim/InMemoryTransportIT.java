package org.zweep.runner.sim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.Transport;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/** The pump-free transport to an in-process simulator keeps the {@link Transport} contract. */
class InMemoryTransportIT {
    private SimulatorServer server;

    @AfterEach
    void stop() {
        if (server != null) {
            server.close();
        }
    }

    private Transport open() throws Exception {
        BenchSpec spec = BenchSpec.load(java.nio.file.Path.of("../sequences/benches/kp-c0805-104.bench.yaml"))
                .withTiming(Timing.NONE);
        server = SimulatorServer.start(new SimulatedBench(spec), ServerOptions.defaults().withTcp(false)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        return InProcessSimulator.transport(server.connectInMemory(), "sim:test");
    }

    private static String readLine(Transport t) {
        StringBuilder b = new StringBuilder();
        byte[] buf = new byte[256];
        while (b.indexOf("\n") < 0) {
            int n = t.read(buf, 0, buf.length, 5_000);
            b.append(new String(buf, 0, n, StandardCharsets.US_ASCII));
        }
        return b.toString();
    }

    @Test
    void aQueryIsAnsweredAndAnIdleReadTimesOutWithZero() throws Exception {
        Transport t = open();
        byte[] buf = new byte[16];
        assertEquals(0, t.read(buf, 0, buf.length, 5), "nothing asked, nothing to read");
        byte[] q = "*IDN?\n".getBytes(StandardCharsets.US_ASCII);
        t.write(q, 0, q.length);
        // IEEE 488.2 §10.14: *IDN? answers the four identification fields
        assertEquals(Instrument.IDENTIFICATION + "\n", readLine(t));
        t.close();
    }

    @Test
    void aClosedPeerIsALostConnection() throws Exception {
        Transport t = open();
        server.close();
        byte[] buf = new byte[16];
        assertThrows(ConnectionLostException.class, () -> t.read(buf, 0, buf.length, 1_000));
        t.close();
        assertThrows(ConnectionLostException.class, () -> t.write(buf, 0, 1));
    }
}
