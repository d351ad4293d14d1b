package org.zweep.simulator.server;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.SocketTimeoutException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TestBench;
import org.zweep.simulator.scpi.TimingModel;

/** The TCP server over loopback: framing, several clients, the state model and slow clients. */
class ServerIT {
    private final List<String> log = new java.util.concurrent.CopyOnWriteArrayList<>();
    private SimulatorServer server;

    private SimulatorServer start(ServerOptions o) throws IOException {
        server = SimulatorServer.start(TestBench.resistor(), o.withPort(0).withLog(log::add));
        return server;
    }

    private SimulatorServer start() throws IOException {
        return start(ServerOptions.defaults().withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
    }

    @AfterEach
    void stop() {
        if (server != null) {
            server.close();
        }
    }

    @Test
    void itListensOnLoopbackOnAnEphemeralPortAndIdentifiesItself() throws IOException {
        start();
        assertTrue(server.port() > 0);
        assertTrue(server.address().getAddress().isLoopbackAddress());
        try (RawClient c = new RawClient(server)) {
            assertEquals(Instrument.IDENTIFICATION, c.query("*IDN?"));
        }
    }

    @Test
    void lfAndCrLfTerminatedMessagesAreBothAccepted() throws IOException {
        // IEEE 488.2 §7.5 (NL terminator) with CR as white space (§7.4.1.2)
        start();
        try (RawClient c = new RawClient(server)) {
            c.sendRaw("SOUR:FREQ 2E3\r\nSOUR:FREQ?\r\n*IDN?\n".getBytes(StandardCharsets.US_ASCII));
            assertEquals("2.0E+03", c.readLine());
            assertEquals(Instrument.IDENTIFICATION, c.readLine());
            assertEquals("0,\"No error\"", c.query("SYST:ERR?"));
        }
    }

    @Test
    void clientsShareOneInstrumentButEachHasItsOwnParser() throws IOException {
        start();
        try (RawClient a = new RawClient(server); RawClient b = new RawClient(server)) {
            a.sendRaw("SOUR:FREQ 3E3;VOLT".getBytes(StandardCharsets.US_ASCII)); // half a message on A
            assertEquals("1.0E+03", b.query("SOUR:FREQ?")); // B unaffected by A's partial message
            a.sendRaw(" 0.5\n".getBytes(StandardCharsets.US_ASCII));
            assertEquals("1", a.query("*OPC?")); // A's message has been executed before B looks
            assertEquals("5.0E-01", b.query("SOUR:VOLT?")); // shared settings
            assertEquals("3.0E+03", b.query("SOUR:FREQ?"));
            assertEquals(2, server.connectionCount());
        }
    }

    @Test
    void anOverlongMessageIsAnErrorAndTheConnectionGoesOn() throws IOException {
        start(ServerOptions.defaults().withMaxMessageBytes(1024)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        try (RawClient c = new RawClient(server)) {
            byte[] junk = new byte[4 << 20];
            java.util.Arrays.fill(junk, (byte) 'A');
            c.sendRaw(junk);
            c.send("");
            String err = c.query("SYST:ERR?");
            assertTrue(err.startsWith("-363,\"Input buffer overrun"), err); // SCPI-1999 Vol 2 §21.8.11
            assertEquals(Instrument.IDENTIFICATION, c.query("*IDN?"));
        }
    }

    @Test
    void aSilentOrNonReadingClientDoesNotHoldUpAnother() throws Exception {
        start();
        try (RawClient silent = new RawClient(server); RawClient flooding = new RawClient(server);
                RawClient b = new RawClient(server)) {
            silent.sendRaw("SOUR:FR".getBytes(StandardCharsets.US_ASCII));
            // a client that sends queries and never reads: its replies back up until its socket is full
            CompletableFuture<Void> flood = CompletableFuture.runAsync(() -> {
                try {
                    byte[] q = "*IDN?\n".repeat(1000).getBytes(StandardCharsets.US_ASCII);
                    for (int i = 0; i < 100_000; i++) {
                        flooding.sendRaw(q);
                    }
                } catch (IOException e) {
                    // the test closes the socket while this may still be blocked in write
                }
            });
            for (int i = 0; i < 200; i++) {
                assertEquals(Instrument.IDENTIFICATION, b.query("*IDN?"));
            }
            assertTrue(!flood.isDone(), "the flooding client should be blocked by its own unread replies");
        }
    }

    @Test
    void opcQueryWaitsForAnOverlappedInitiateInRealTime() throws IOException {
        // IEEE 488.2 §12.5.3; the test bench's point takes averages × aperture = 0.3 s
        start(ServerOptions.defaults());
        try (RawClient c = new RawClient(server)) {
            c.send("IMP:APER 0.3;:INIT");
            long t0 = System.nanoTime();
            assertEquals("1", c.query("*OPC?"));
            assertTrue(System.nanoTime() - t0 > 250_000_000L, "*OPC? answered before the point could finish");
            String z = c.query("FETC?");
            assertEquals(2, z.split(",").length);
        }
    }

    @Test
    void closingTheServerClosesItsConnections() throws IOException {
        start();
        try (RawClient c = new RawClient(server)) {
            c.query("*IDN?");
            server.close();
            assertTrue(c.closedByServer());
        }
        assertTrue(log.stream().anyMatch(l -> l.contains("opened")), log.toString());
    }

    @Test
    void theInMemoryConnectionBehavesLikeTcp() throws IOException {
        start();
        try (InMemoryConnection m = server.connectInMemory()) {
            m.output().write("SOUR:FREQ 4E3\n*IDN?;:SOUR:FREQ?\n".getBytes(StandardCharsets.US_ASCII));
            m.output().flush();
            StringBuilder b = new StringBuilder();
            int ch;
            while ((ch = m.input().read()) != '\n') {
                b.append((char) ch);
            }
            assertEquals(Instrument.IDENTIFICATION + ";4.0E+03", b.toString());
        }
    }

    @Test
    void aTimedInMemoryReadReturnsZeroWhenNothingArrivesAndTheReplyWhenItDoes() throws IOException {
        start();
        try (InMemoryConnection m = server.connectInMemory()) {
            byte[] buf = new byte[64];
            assertEquals(0, m.read(buf, 0, buf.length, 5), "no query sent: nothing to read");
            m.output().write("*TST?\n".getBytes(StandardCharsets.US_ASCII));
            int n = m.read(buf, 0, buf.length, 5_000);
            // IEEE 488.2 §10.38: *TST? answers 0 when the self-test passed
            assertEquals("0\n", new String(buf, 0, n, StandardCharsets.US_ASCII));
            m.close();
            assertEquals(-1, m.read(buf, 0, buf.length, 5), "closed: end of stream");
        }
    }

    @Test
    void aServerWithoutTcpStillServesInMemory() throws IOException {
        server = SimulatorServer.start(TestBench.resistor(), ServerOptions.defaults().withTcp(false));
        assertEquals(-1, server.port());
        try (InMemoryConnection m = server.connectInMemory()) {
            m.output().write("*TST?\n".getBytes(StandardCharsets.US_ASCII));
            assertEquals('0', m.input().read());
        }
    }

    @Test
    void aBusyPortIsReportedWithItsAddress() throws IOException {
        start();
        IOException e = assertThrows(IOException.class, () -> SimulatorServer.start(TestBench.resistor(),
                ServerOptions.defaults().withPort(server.port())));
        assertTrue(e.getMessage().contains(":" + server.port()), e.getMessage());
    }

    static List<String> readAll(RawClient c, int n) throws IOException {
        List<String> out = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            String l = c.readLine();
            assertNotNull(l);
            out.add(l);
        }
        return out;
    }

    static void assertTimesOut(RawClient c, int ms) throws IOException {
        c.timeout(ms);
        assertThrows(SocketTimeoutException.class, c::readLine);
        c.timeout(5000);
    }

    static void sleep(long ms) {
        try {
            TimeUnit.MILLISECONDS.sleep(ms);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
