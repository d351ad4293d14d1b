package org.zweep.simulator.server;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.zweep.simulator.server.ServerIT.assertTimesOut;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TestBench;
import org.zweep.simulator.scpi.TimingModel;

/** Every fault kind, observed from a raw socket client; set by a plan (command line) or SIMulate:FAULt. */
class FaultIT {
    private static final String IDN = Instrument.IDENTIFICATION;
    private SimulatorServer server;

    private SimulatorServer start(FaultPlan plan) throws IOException {
        server = SimulatorServer.start(TestBench.resistor(), ServerOptions.defaults().withPort(0).withFaults(plan)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        return server;
    }

    @AfterEach
    void stop() {
        if (server != null) {
            server.close();
        }
    }

    @Test
    void dropAfterNMessagesFromThePlanClosesEachConnectionAfterItsNthMessage() throws IOException {
        start(FaultPlan.parse("drop@2", 0));
        for (int k = 0; k < 2; k++) { // each connection counts its own messages
            try (RawClient c = new RawClient(server)) {
                assertEquals(IDN, c.query("*IDN?"));
                assertEquals(IDN, c.query("*IDN?"));
                assertTrue(c.closedByServer());
            }
        }
    }

    @Test
    void dropAfterNMessagesBySimulateCountsFromTheSettingMessage() throws IOException {
        start(FaultPlan.none());
        try (RawClient c = new RawClient(server)) {
            c.send("SIM:FAUL:DROP 2");
            assertEquals(IDN, c.query("*IDN?"));
            assertEquals(IDN, c.query("*IDN?"));
            assertTrue(c.closedByServer());
        }
    }

    @Test
    void anIdleConnectionIsDropped() throws IOException {
        start(FaultPlan.none());
        try (RawClient c = new RawClient(server)) {
            c.send("SIM:FAUL:DROP:IDLE 0.3");
            assertEquals(IDN, c.query("*IDN?"));
            long t0 = System.nanoTime();
            assertTrue(c.closedByServer());
            assertTrue(System.nanoTime() - t0 > 200_000_000L, "dropped before the idle time");
        }
    }

    @Test
    void randomDropsFollowTheSeedAndTheConnectionNumberAndHappen() throws IOException {
        int[][] answered = new int[2][3];
        for (int run = 0; run < 2; run++) {
            start(FaultPlan.parse("drop-random=0.2", 7));
            for (int k = 0; k < 3; k++) {
                answered[run][k] = answeredBeforeDrop();
            }
            server.close();
        }
        assertTrue(answered[0][0] < 200, "p = 0.2 should drop within 200 messages");
        // the same seed and the same connection numbers (1, 2, 3 on a fresh server) drop at the same messages
        assertArrayEquals(answered[0], answered[1]);
    }

    private int answeredBeforeDrop() throws IOException {
        int answered = 0;
        try (RawClient c = new RawClient(server)) {
            while (answered < 200) {
                c.send("*IDN?");
                if (c.readLine() == null) {
                    break;
                }
                answered++;
            }
        } catch (java.net.SocketException e) {
            // reset by the server counts as dropped
        }
        return answered;
    }

    @Test
    void anIdleTimeBelowAMillisecondIsRefusedWithAnErrorNotAStackTrace() throws IOException {
        // issue 17, item 7: SIM:FAUL:DROP:IDLE 1E-10 printed a stack trace
        start(FaultPlan.none());
        try (RawClient c = new RawClient(server)) {
            c.send("SIM:FAUL:DROP:IDLE 1E-10");
            assertTrue(c.query("SYST:ERR?").startsWith("-222,"));
            assertEquals(IDN, c.query("*IDN?"));
        }
    }

    @Test
    void aDelayedReplyArrivesAfterTheClientsTimeout() throws IOException {
        start(FaultPlan.none());
        try (RawClient c = new RawClient(server)) {
            c.send("SIM:FAUL:DEL 2");
            c.send("SOUR:FREQ?");
            assertTimesOut(c, 200); // the client gives up (2 s leaves room for a loaded machine)...
            c.send("*IDN?");
            assertEquals("1.0E+03", c.readLine()); // ...and then the stale reply arrives first
            assertEquals(IDN, c.readLine());
        }
    }

    @Test
    void aFragmentedReplyComesInSmallPieces() throws IOException {
        start(FaultPlan.none());
        int pieces = (IDN.length() + 1 + 4) / 5;
        int firstPieceMin = Integer.MAX_VALUE;
        try (RawClient c = new RawClient(server)) {
            for (int attempt = 0; attempt < 3; attempt++) {
                c.send("SIM:FAUL:FRAG 5");
                long t0 = System.nanoTime();
                c.send("*IDN?");
                byte[] first = c.readSome();
                firstPieceMin = Math.min(firstPieceMin, first.length);
                ByteArrayOutputStream all = new ByteArrayOutputStream();
                all.writeBytes(first);
                if (first[first.length - 1] != '\n') {
                    all.writeBytes(c.readLine().getBytes(StandardCharsets.US_ASCII));
                }
                double tookMs = (System.nanoTime() - t0) / 1e6;
                // pieces FRAGMENT_GAP apart: a load on the machine can only make this longer
                assertTrue(tookMs >= (pieces - 1) * FaultPlan.FRAGMENT_GAP.toNanos() / 1e6, "took " + tookMs + " ms");
                assertEquals(IDN, all.toString(StandardCharsets.US_ASCII).strip());
            }
        }
        // a read that comes in time sees one piece; of three, at least one does even on a busy machine
        assertTrue(firstPieceMin <= 5, "smallest first piece " + firstPieceMin + " bytes");
    }

    @Test
    void aStalledConnectionNeverAnswersButStaysOpenAndOthersGoOn() throws IOException {
        start(FaultPlan.none());
        try (RawClient c = new RawClient(server); RawClient other = new RawClient(server)) {
            c.send("SIM:FAUL:STAL");
            c.send("*IDN?");
            assertTimesOut(c, 500);
            assertEquals(IDN, other.query("*IDN?"));
            assertEquals(2, server.connectionCount());
        }
    }

    @Test
    void aReplyWithoutItsTerminatorIsSentAsIs() throws IOException {
        start(FaultPlan.parse("omit-terminator@2", 0));
        try (RawClient c = new RawClient(server)) {
            assertEquals(IDN, c.query("*IDN?"));
            c.send("*IDN?");
            c.timeout(300);
            ByteArrayOutputStream got = new ByteArrayOutputStream();
            try {
                while (true) {
                    byte[] b = c.readSome();
                    if (b.length == 0) {
                        break;
                    }
                    got.writeBytes(b);
                }
            } catch (java.net.SocketTimeoutException e) {
                // expected: no LF ever comes
            }
            assertArrayEquals(IDN.getBytes(StandardCharsets.US_ASCII), got.toByteArray());
        }
    }

    @Test
    void anInjectedErrorIsInTheQueueAndSetsItsClassBit() throws IOException {
        start(FaultPlan.parse("error=-310@2", 0));
        try (RawClient c = new RawClient(server)) {
            c.query("*ESR?"); // message 1 clears the power-on bit
            c.send("SIM:FAUL:ERR -350"); // the plan pushes -310 on receiving message 2, before it runs
            assertEquals("-310,\"Injected fault\"", c.query("SYST:ERR?"));
            assertEquals("-350,\"Queue overflow\"", c.query("SYST:ERR?"));
            c.send("SIM:FAUL:ERR 7,\"Bridge unbalanced\"");
            assertEquals("7,\"Bridge unbalanced\"", c.query("SYST:ERR?"));
            assertEquals("8", c.query("*ESR?")); // IEEE 488.2 §11.5.1: DDE (bit 3) for -3xx and positive codes
        }
    }

    @Test
    void aGarbledReplyKeepsItsLengthAndTerminatorButNotItsText() throws IOException {
        start(FaultPlan.none());
        try (RawClient c = new RawClient(server)) {
            c.send("SIM:FAUL:GARB");
            String g = c.query("*IDN?");
            assertEquals(IDN.length(), g.length());
            assertNotEquals(IDN, g);
            assertEquals(IDN, c.query("*IDN?")); // only the next reply
        }
    }

    @Test
    void faultsClearWithSimulateFaultClear() throws IOException {
        start(FaultPlan.parse("garble", 0));
        try (RawClient c = new RawClient(server)) {
            c.send("SIM:FAUL:CLE");
            assertEquals(IDN, c.query("*IDN?"));
        }
    }

    @Test
    void strictModeReportsQueryInterruptedWhenANewMessageArrivesBeforeTheReply() throws IOException {
        // IEEE 488.2 §6.3.2.3: the output queue is discarded, -410 Query INTERRUPTED
        start(FaultPlan.none());
        try (RawClient c = new RawClient(server)) {
            c.query("*ESR?");
            c.send("SIM:STR ON;:SIM:FAUL:DEL 0.5");
            c.send("SOUR:FREQ?");
            c.send("*IDN?");
            assertEquals(IDN, c.readLine());
            assertTrue(c.query("SYST:ERR?").startsWith("-410,\"Query INTERRUPTED"));
            assertEquals("4", c.query("*ESR?")); // IEEE 488.2 §11.5.1: QYE (bit 2)
        }
    }

    @Test
    void theInMemoryConnectionReportsQueryUnterminatedOnAReadWithNoQueryPending() throws Exception {
        // IEEE 488.2 §6.3.2.2: -420 when the controller reads with no query pending (strict mode only)
        start(FaultPlan.none());
        InMemoryConnection m = server.connectInMemory();
        m.output().write("SIM:STR ON\n".getBytes(StandardCharsets.US_ASCII));
        CompletableFuture<Integer> read = CompletableFuture.supplyAsync(() -> {
            try {
                return m.input().read();
            } catch (IOException e) {
                return -2;
            }
        });
        try (RawClient other = new RawClient(server)) {
            String err = "0";
            for (int i = 0; i < 100 && err.startsWith("0"); i++) {
                err = other.query("SYST:ERR?");
                TimeUnit.MILLISECONDS.sleep(20);
            }
            assertTrue(err.startsWith("-420,\"Query UNTERMINATED"), err);
        }
        m.close();
        assertEquals(-1, read.get(5, TimeUnit.SECONDS));
    }

    @Test
    void lenientModeQueuesRepliesInOrder() throws IOException {
        start(FaultPlan.none());
        try (RawClient c = new RawClient(server)) {
            c.send("SIM:FAUL:DEL 0.3");
            c.send("SOUR:FREQ?");
            c.send("*IDN?");
            assertEquals("1.0E+03", c.readLine());
            assertEquals(IDN, c.readLine());
            assertEquals("0,\"No error\"", c.query("SYST:ERR?"));
        }
    }
}
