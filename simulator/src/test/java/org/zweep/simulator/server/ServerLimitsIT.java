package org.zweep.simulator.server;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.scpi.BenchLoader;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;

/**
 * Issue 17, items 1 and 7: the output queue, the connection cap and the netlist size, each
 * bounded, observed from raw socket clients.
 */
class ServerLimitsIT {
    private static final String IDN = Instrument.IDENTIFICATION;
    private final List<String> log = new java.util.concurrent.CopyOnWriteArrayList<>();
    private SimulatorServer server;

    private SimulatorServer start(ServerOptions o) throws IOException {
        SimulatedBench bench = new SimulatedBench(BenchSpec.ofNetlist("R1 hi lo 100", "test").ideal()
                .withTiming(Timing.NONE));
        server = SimulatorServer.start(bench, o.withPort(0).withLog(log::add).withInstrument(InstrumentOptions.defaults()
                .withTiming(TimingModel.NONE).withBenchLoader(BenchLoader.simulated(true, TimingModel.NONE))));
        return server;
    }

    @AfterEach
    void stop() {
        if (server != null) {
            server.close();
        }
    }

    static byte[] repeated(String message, int times) {
        return (message + "\n").repeat(times).getBytes(StandardCharsets.US_ASCII);
    }

    static void awaitTrue(java.util.function.BooleanSupplier condition, String what) {
        long end = System.nanoTime() + 10_000_000_000L;
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > end) {
                throw new AssertionError("not within 10 s: " + what);
            }
            ServerIT.sleep(10);
        }
    }

    private static String query(RawClient c, String q) {
        try {
            return c.query(q);
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    @Test
    void delayedRepliesThatAreNeverReadFillTheQueueToItsBoundThenGiveQueryDeadlocked() throws IOException {
        // issue 17, item 1: SIM:FAUL:DEL 3600,1e8 and a flood of unread queries grew the server without bound
        start(ServerOptions.defaults().withMaxOutputBytes(4096, 1 << 20));
        try (RawClient flood = new RawClient(server); RawClient observer = new RawClient(server)) {
            flood.send("SIM:FAUL:DEL 3600,100000000");
            flood.sendRaw(repeated("*IDN?", 2000)); // 2000 replies of 56 bytes, far over 4096
            String[] first = new String[1];
            awaitTrue(() -> !(first[0] = query(observer, "SYST:ERR?")).startsWith("0,"), "an error once the queue is full");
            // IEEE 488.2 §6.3.1.7: a full output queue is a deadlock; SCPI-99 Vol 2 §21.8.12: -430
            assertTrue(first[0].startsWith("-430,\"Query DEADLOCKED;"), first[0]);
            // the server's total also holds the observer's own reply while it is on its way (under 64 bytes)
            assertTrue(server.outputQueueBytes() <= 4096 + 64, "queue within its bound: " + server.outputQueueBytes());
            assertEquals(IDN, observer.query("*IDN?")); // the server goes on serving others
        }
        awaitTrue(() -> server.connectionCount() == 0, "both connections closed");
        // the reply being written when the socket closed is given back when its write fails
        awaitTrue(() -> server.outputQueueBytes() == 0, "a closed connection gives its queue back");
    }

    @Test
    void clientsThatNeverReadAreBoundedInAllTogether() throws IOException {
        // issue 17, item 1: twenty clients sending *IDN? without reading took the server to 0.3 GB
        start(ServerOptions.defaults().withMaxOutputBytes(64 << 10, 256 << 10));
        List<RawClient> clients = new ArrayList<>();
        try {
            for (int i = 0; i < 20; i++) {
                RawClient c = new RawClient(server);
                clients.add(c);
                c.send("SIM:FAUL:DEL 3600,100000000");
                c.sendRaw(repeated("*IDN?", 3000)); // 168 kB of replies each
            }
            try (RawClient observer = new RawClient(server)) {
                awaitTrue(() -> server.outputQueueBytes() > 200 << 10, "the queues fill towards the total");
                // a reply always fits an empty queue, so each of the 21 connections may add one (57 bytes) to the total
                assertTrue(server.outputQueueBytes() <= (256 << 10) + 21 * 64, "total within bound: " + server.outputQueueBytes());
                assertEquals(IDN, observer.query("*IDN?"));
            }
        } finally {
            for (RawClient c : clients) {
                c.close();
            }
        }
        awaitTrue(() -> server.connectionCount() == 0, "all connections closed");
        awaitTrue(() -> server.outputQueueBytes() == 0, "the closed connections give their queues back");
    }

    @Test
    void aConnectionBeyondTheCapIsToldWhyAndClosedAndTheNextOneAfterAClosePassesAgain() throws IOException {
        // issue 17, item 7: 6,000 idle connections made 6,021 threads
        start(ServerOptions.defaults().withMaxConnections(3));
        List<RawClient> open = new ArrayList<>();
        try {
            for (int i = 0; i < 3; i++) {
                RawClient c = new RawClient(server);
                open.add(c);
                assertEquals(IDN, c.query("*IDN?"));
            }
            try (RawClient refused = new RawClient(server)) {
                refused.send("*IDN?");
                assertEquals("zweep sim: connection refused: 3 connections are open, the simulator's limit",
                        refused.readLine());
                assertNull(refused.readLine());
            }
            open.remove(0).close();
            awaitTrue(() -> server.connectionCount() == 2, "one slot free");
            try (RawClient again = new RawClient(server)) {
                assertEquals(IDN, again.query("*IDN?"));
            }
        } finally {
            for (RawClient c : open) {
                c.close();
            }
        }
        assertTrue(log.stream().anyMatch(l -> l.startsWith("connection refused: 3 connections are open")), log.toString());
    }

    @Test
    void aDeviceLargerThanTheNetlistLimitIsAnExecutionErrorAndTheConnectionGoesOn() throws IOException {
        // issue 17, item 7: SIM:DEV with 45,000 elements killed its connection, 12,000 held 3.4 GB
        start(ServerOptions.defaults());
        StringBuilder netlist = new StringBuilder();
        for (int i = 1; i <= 12_000; i++) {
            netlist.append('R').append(i).append(' ').append(i == 1 ? "hi" : "n" + (i - 1)).append(' ')
                    .append(i == 12_000 ? "lo" : "n" + i).append(" 1\\n");
        }
        try (RawClient c = new RawClient(server)) {
            c.send("SIM:DEV \"" + netlist + "\"");
            String e = c.query("SYST:ERR?");
            assertTrue(e.startsWith("-200,\"Execution error;SIMulate:DEVice:201:1: more than 200 elements (the limit)\""), e);
            assertEquals(100, Double.parseDouble(c.query("READ?").split(",")[0]), 1e-6); // the 100 Ω device is still in

        }
    }
}
