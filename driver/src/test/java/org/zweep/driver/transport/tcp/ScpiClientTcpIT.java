package org.zweep.driver.transport.tcp;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.zweep.driver.testpeer.Action.close;
import static org.zweep.driver.testpeer.Action.pause;
import static org.zweep.driver.testpeer.Action.send;
import static org.zweep.driver.testpeer.Action.stall;

import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.scpi.Resync;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiProtocolException;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.driver.testpeer.Action;
import org.zweep.driver.testpeer.LoopbackServer;
import org.zweep.driver.testpeer.ScriptedPeer;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.Transports;

/** The SCPI client over a real loopback socket against a scripted peer. */
class ScpiClientTcpIT {
    private static final Duration WAIT = Duration.ofSeconds(5);
    private static final ScpiSettings FAST = ScpiSettings.builder().clearOnConnect(false)
            .readTimeout(Duration.ofMillis(300)).connectTimeout(Duration.ofSeconds(2)).build();

    private LoopbackServer server;
    private ScpiClient client;

    private ScpiClient connect(ScriptedPeer peer, ScpiSettings settings) {
        server = new LoopbackServer(peer);
        client = ScpiClient.open(server.address(), settings);
        return client;
    }

    @AfterEach
    void tearDown() throws Exception {
        if (client != null) {
            client.close();
        }
        if (server != null) {
            server.close();
        }
    }

    @Test
    void openFromAnAddressSendsClearStatusThenQueries() throws Exception {
        ScriptedPeer peer = ScriptedPeer.scripted().on("*CLS").reply("*IDN?", "Korvane Passives,KP-LCR-1,0001,1.0\n");
        ScpiClient c = connect(peer, ScpiSettings.DEFAULTS);
        assertEquals("Korvane Passives,KP-LCR-1,0001,1.0", c.query("*IDN?"));
        assertEquals("*CLS", peer.takeCommand(WAIT));
        assertEquals("*IDN?", peer.takeCommand(WAIT));
    }

    @Test
    void visaSocketAddressReachesTheSameServer() {
        ScriptedPeer peer = ScriptedPeer.scripted().reply("*OPC?", "1\n");
        server = new LoopbackServer(peer);
        client = ScpiClient.open("TCPIP0::127.0.0.1::" + server.port() + "::SOCKET", FAST);
        client.waitForCompletion(WAIT);
    }

    @Test
    void transportsOpenFindsTheTcpProviderWithNoDelayAndKeepAlive() throws Exception {
        server = new LoopbackServer(ScriptedPeer.scripted());
        try (Transport t = Transports.open(server.address(), TransportOptions.DEFAULT)) {
            TcpTransport tcp = assertInstanceOf(TcpTransport.class, t);
            assertTrue(tcp.noDelay() && tcp.keepAlive());
        }
    }

    @Test
    void withoutAReplySpinTheTimedReadAloneStillReadsEveryReply() {
        ScriptedPeer peer = ScriptedPeer.scripted().reply("A?", "1\n").on("B?", pause(30), send("2\n"));
        server = new LoopbackServer(peer);
        TransportOptions noSpin = TransportOptions.DEFAULT.withReplySpin(java.time.Duration.ZERO);
        client = ScpiClient.connect(Transports.open(server.address(), noSpin), FAST);
        assertEquals("1", client.query("A?"));
        assertEquals("2", client.query("B?"));
    }

    @Test
    void aReplyTricklingOneByteEveryHalfSecondTimesOutAtItsDeadlineNotPerRead() {
        // issue 17: a peer that sends one byte every 0.5 s kept a 1 s read timeout waiting for 90 s
        List<Action> trickle = new ArrayList<>();
        for (int i = 0; i < 40; i++) {
            trickle.add(send("1"));
            trickle.add(pause(500));
        }
        ScriptedPeer peer = ScriptedPeer.scripted().on("SLOW?", trickle.toArray(Action[]::new));
        ScpiSettings oneSecond = ScpiSettings.builder().clearOnConnect(false).resync(Resync.DRAIN)
                .readTimeout(Duration.ofSeconds(1)).connectTimeout(Duration.ofSeconds(2)).build();
        ScpiClient c = connect(peer, oneSecond);
        long t0 = System.nanoTime();
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class,
                () -> c.query("SLOW?", Duration.ofMillis(500)));
        double waitedS = (System.nanoTime() - t0) / 1e9;
        // the deadline is 0.5 s of expected work plus 1 s of slack; one more read's wake-up at most
        assertTrue(waitedS >= 1.45 && waitedS < 2.5, "waited " + waitedS + " s: " + e.getMessage());
        assertTrue(e.getMessage().contains("was incomplete (the meter was expected to take about 500 ms; waited 1.5 s"),
                e.getMessage());
        assertTrue(e.received().length >= 2 && e.received().length <= 5, e.received().length + " bytes");
    }

    @Test
    void aBlockTricklingInTimesOutAtItsDeadline() {
        List<Action> trickle = new ArrayList<>(List.of(send("#210")));
        for (int i = 0; i < 20; i++) {
            trickle.add(send("x"));
            trickle.add(pause(400));
        }
        ScriptedPeer peer = ScriptedPeer.scripted().on("DATA?", trickle.toArray(Action[]::new));
        ScpiSettings oneSecond = ScpiSettings.builder().clearOnConnect(false).resync(Resync.DRAIN)
                .readTimeout(Duration.ofSeconds(1)).connectTimeout(Duration.ofSeconds(2)).build();
        ScpiClient c = connect(peer, oneSecond);
        long t0 = System.nanoTime();
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> c.queryBlock("DATA?"));
        double waitedS = (System.nanoTime() - t0) / 1e9;
        assertTrue(waitedS >= 0.95 && waitedS < 2.0, "waited " + waitedS + " s: " + e.getMessage());
        assertTrue(e.getMessage().contains("stopped after"), e.getMessage());
    }

    @Test
    void replySplitAcrossPacketsWithPausesIsReassembled() {
        ScriptedPeer peer = ScriptedPeer.scripted()
                .on("FREQ?", send("+1.0"), pause(60), send("00000E"), pause(60), send("+03\r"), pause(60), send("\n"));
        assertEquals(1000.0, connect(peer, FAST).queryNumber("FREQ?"));
    }

    @Test
    void crLfTerminatedRepliesReadLikeLf() {
        ScriptedPeer peer = ScriptedPeer.scripted().reply("A?", "1\r\n").reply("B?", "2\r\n");
        ScpiClient c = connect(peer, FAST);
        assertEquals("1", c.query("A?"));
        assertEquals("2", c.query("B?"));
    }

    @Test
    void definiteBlocksAtBufferBoundariesSplitAcrossPackets() {
        int[] sizes = {8192 - 6, 8192, 8193, 65536};
        ScriptedPeer peer = ScriptedPeer.scripted();
        List<byte[]> payloads = new ArrayList<>();
        for (int size : sizes) {
            byte[] p = new byte[size];
            for (int i = 0; i < size; i++) {
                p[i] = (byte) (i * 7 + size);
            }
            payloads.add(p);
            byte[] all = ScriptedPeer.concat(("#" + String.valueOf(size).length() + size).getBytes(
                    StandardCharsets.ISO_8859_1), p, new byte[] {'\n'});
            int cut = Math.min(8192, all.length - 1);
            peer.on("DATA?", send(java.util.Arrays.copyOfRange(all, 0, cut)), pause(30),
                    send(java.util.Arrays.copyOfRange(all, cut, all.length)));
        }
        ScpiClient c = connect(peer, FAST);
        for (byte[] p : payloads) {
            assertArrayEquals(p, c.queryBlock("DATA?"));
        }
    }

    @Test
    void indefiniteBlockEndsAtTheTerminator() {
        ScriptedPeer peer = ScriptedPeer.scripted().reply("DATA?", "#0 1,2,3\n");
        assertArrayEquals(" 1,2,3".getBytes(StandardCharsets.ISO_8859_1), connect(peer, FAST).queryBlock("DATA?"));
    }

    @Test
    void stallIsATimeoutNamingTheAddressAndTheQuery() {
        ScriptedPeer peer = ScriptedPeer.scripted().on("MEAS?", stall());
        ScpiClient c = connect(peer, FAST);
        long t0 = System.nanoTime();
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> c.query("MEAS?"));
        long ms = (System.nanoTime() - t0) / 1_000_000;
        assertTrue(ms >= 290 && ms < 3000, "waited " + ms + " ms for a 300 ms timeout");
        assertTrue(e.getMessage().startsWith(server.address() + ": no reply to 'MEAS?' (waited 300 ms; nothing received"), e.getMessage());
        assertEquals(0, e.received().length);
    }

    @Test
    void partialReplyThenStallKeepsTheBytes() {
        ScriptedPeer peer = ScriptedPeer.scripted().on("MEAS?", send("1.2"), stall());
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> connect(peer, FAST).query("MEAS?"));
        assertArrayEquals("1.2".getBytes(StandardCharsets.ISO_8859_1), e.received());
    }

    @Test
    void peerClosingMidReplyIsConnectionLost() {
        ScriptedPeer peer = ScriptedPeer.scripted().on("*IDN?", send("Korvane Pass"), close());
        ConnectionLostException e = assertThrows(ConnectionLostException.class, () -> connect(peer, FAST).query("*IDN?"));
        assertTrue(e.getMessage().contains(server.address()) && e.getMessage().contains("'*IDN?'"), e.getMessage());
    }

    @Test
    void peerClosingMidBlockIsConnectionLost() {
        ScriptedPeer peer = ScriptedPeer.scripted().on("DATA?", send("#3100abc"), close());
        assertThrows(ConnectionLostException.class, () -> connect(peer, FAST).queryBlock("DATA?"));
    }

    @Test
    void overLongReplyIsAProtocolErrorAndTheNextQueryStillWorks() {
        ScriptedPeer peer = ScriptedPeer.scripted()
                .on("BIG?", send("x".repeat(5000)), pause(30), send("x".repeat(5000) + "\n"))
                .reply("*OPC?", "1\n")
                .reply("SMALL?", "ok\n");
        ScpiClient c = connect(peer, FAST.toBuilder().maxResponseBytes(4096).build());
        assertThrows(ScpiProtocolException.class, () -> c.query("BIG?"));
        assertEquals("ok", c.query("SMALL?"));
    }

    @Test
    void staleLateReplyAfterATimeoutIsNotReturnedToTheNextQuery() {
        ScriptedPeer peer = ScriptedPeer.scripted()
                .on("SLOW?", pause(600), send("stale\n"))
                .reply("*OPC?", "1\n")
                .reply("FAST?", "fresh\n");
        ScpiClient c = connect(peer, FAST);
        assertThrows(MeterTimeoutException.class, () -> c.query("SLOW?"));
        assertEquals("fresh", c.query("FAST?"));
    }

    @Test
    void drainModeDiscardsALateReplyThatComesWithinTheQuietTime() {
        ScriptedPeer peer = ScriptedPeer.scripted()
                .on("SLOW?", pause(800), send("stale\n")) // 500 ms after the 300 ms deadline: late even on a loaded machine
                .reply("FAST?", "fresh\n");
        ScpiClient c = connect(peer, FAST.toBuilder().resync(Resync.DRAIN).drainQuiet(Duration.ofMillis(1000)).build());
        assertThrows(MeterTimeoutException.class, () -> c.query("SLOW?"));
        assertEquals("fresh", c.query("FAST?"));
    }

    @Test
    void connectionRefusedIsConnectFailedNamingTheAddress() throws Exception {
        int port;
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            port = s.getLocalPort();
        }
        String address = "tcp://127.0.0.1:" + port;
        ConnectFailedException e = assertThrows(ConnectFailedException.class, () -> ScpiClient.open(address, FAST));
        assertTrue(e.getMessage().startsWith(address + ": connection refused"), e.getMessage());
    }

    @Test
    void unknownHostIsConnectFailed() {
        ConnectFailedException e = assertThrows(ConnectFailedException.class,
                () -> ScpiClient.open("tcp://no-such-host.invalid:5025", FAST));
        assertTrue(e.getMessage().contains("no-such-host.invalid"), e.getMessage());
    }

    @Test
    void traceFileRecordsBothDirectionsAndTimeouts(@TempDir Path dir) throws Exception {
        Path trace = dir.resolve("trace.log");
        ScriptedPeer peer = ScriptedPeer.scripted().reply("*IDN?", "Korvane\r\n").on("X?", stall());
        ScpiClient c = connect(peer, FAST.toBuilder().tracePath(trace).build());
        c.query("*IDN?");
        assertThrows(MeterTimeoutException.class, () -> c.query("X?"));
        c.close();
        List<String> lines = Files.readAllLines(trace);
        assertTrue(lines.get(0).matches("\\S+Z ! connected to tcp://127\\.0\\.0\\.1:\\d+"), lines.get(0));
        assertTrue(lines.get(1).endsWith(" > *IDN?\\n"), lines.get(1));
        assertTrue(lines.get(2).endsWith(" < Korvane\\r\\n"), lines.get(2));
        assertTrue(lines.get(3).endsWith(" > X?\\n"), lines.get(3));
        assertTrue(lines.get(4).contains(" ! deadline passed after 300 ms"), lines.get(4));
    }

    @Test
    void concurrentCallersNeverInterleave() throws Exception {
        ScpiClient c = connect(ScriptedPeer.echo(), FAST.toBuilder().readTimeout(Duration.ofSeconds(5)).build());
        ExecutorService pool = Executors.newFixedThreadPool(3);
        try {
            List<Future<Integer>> results = new ArrayList<>();
            for (int t = 0; t < 3; t++) {
                int id = t;
                results.add(pool.submit(() -> {
                    int ok = 0;
                    for (int i = 0; i < 300; i++) {
                        String q = "T" + id + ":" + i + "?";
                        if (c.query(q).equals(q)) {
                            ok++;
                        }
                    }
                    return ok;
                }));
            }
            for (Future<Integer> f : results) {
                assertEquals(300, f.get());
            }
        } finally {
            pool.shutdownNow();
        }
    }
}
