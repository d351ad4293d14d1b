package org.zweep.driver.transport.serial;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.zweep.driver.testpeer.Action.pause;
import static org.zweep.driver.testpeer.Action.send;
import static org.zweep.driver.testpeer.Action.stall;

import java.io.FileInputStream;
import java.io.FileOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.SerialAddress;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.driver.testpeer.ScriptedPeer;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.Transports;

/** The serial transport and the SCPI client over a real pseudo-terminal pair made by socat. */
class SerialTransportIT {
    private static final ScpiSettings FAST = ScpiSettings.builder().clearOnConnect(false)
            .readTimeout(Duration.ofMillis(300)).build();

    @TempDir
    Path dir;

    private PtyPair pty;
    private ScriptedPeer peer;
    private Thread peerThread;
    private FileInputStream meterIn;
    private FileOutputStream meterOut;
    private ScpiClient client;

    private ScpiClient connect(ScriptedPeer script, String options, ScpiSettings settings) throws Exception {
        pty = PtyPair.start(dir);
        peer = script;
        meterIn = new FileInputStream(pty.meter.toFile());
        meterOut = new FileOutputStream(pty.meter.toFile());
        peerThread = new Thread(() -> peer.serve(meterIn, meterOut), "pty-peer");
        peerThread.setDaemon(true);
        peerThread.start();
        client = ScpiClient.open("serial:" + pty.host + options, settings);
        return client;
    }

    @AfterEach
    void tearDown() throws Exception {
        if (client != null) {
            client.close();
        }
        if (peer != null) {
            peer.stop();
        }
        if (pty != null) {
            pty.close();
        }
        if (peerThread != null) {
            peerThread.join(5000);
            assertTrue(!peerThread.isAlive(), "the pty peer is still running");
            meterIn.close();
            meterOut.close();
            peer.verify();
        }
    }

    @Test
    void queryRoundTripOverAPty() throws Exception {
        ScriptedPeer script = ScriptedPeer.scripted().on("*CLS").reply("*IDN?", "Korvane Passives,KP-LCR-1,0001,1.0\n");
        ScpiClient c = connect(script, "?baud=115200", ScpiSettings.DEFAULTS);
        assertEquals("Korvane Passives,KP-LCR-1,0001,1.0", c.query("*IDN?"));
        assertEquals("*CLS", peer.takeCommand(Duration.ofSeconds(5)));
    }

    @Test
    void visaSerialAddressOpensThePty() throws Exception {
        pty = PtyPair.start(dir);
        Address a = Address.parse("ASRL" + pty.host + "::INSTR?baud=19200&parity=even");
        assertEquals(pty.host.toString(), assertInstanceOf(SerialAddress.class, a).device());
        try (Transport t = Transports.open(a, TransportOptions.DEFAULT)) {
            assertInstanceOf(SerialTransport.class, t);
        }
    }

    @Test
    void splitReplyWithCrLfIsReassembled() throws Exception {
        ScriptedPeer script = ScriptedPeer.scripted()
                .on("FREQ?", send("+1.0000"), pause(80), send("00E+03\r"), pause(80), send("\n"));
        assertEquals(1000.0, connect(script, "", FAST).queryNumber("FREQ?"));
    }

    @Test
    void binaryBlockWithTerminatorBytesPassesUnchanged() throws Exception {
        byte[] payload = new byte[256];
        for (int i = 0; i < payload.length; i++) {
            payload[i] = (byte) i;
        }
        ScriptedPeer script = ScriptedPeer.scripted().on("DATA?",
                send(ScriptedPeer.concat("#3256".getBytes(StandardCharsets.ISO_8859_1), payload, new byte[] {'\n'})));
        assertArrayEquals(payload, connect(script, "?baud=115200", FAST).queryBlock("DATA?"));
    }

    @Test
    void stallIsATimeoutWithinTheGranularity() throws Exception {
        ScriptedPeer script = ScriptedPeer.scripted().on("MEAS?", send("1.2"), stall());
        ScpiClient c = connect(script, "", FAST);
        long t0 = System.nanoTime();
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> c.query("MEAS?"));
        long ms = (System.nanoTime() - t0) / 1_000_000;
        assertTrue(ms >= 290 && ms < 3000, "waited " + ms + " ms for a 300 ms timeout");
        assertArrayEquals("1.2".getBytes(StandardCharsets.ISO_8859_1), e.received());
        assertTrue(e.getMessage().startsWith("serial:" + pty.host), e.getMessage());
    }

    @Test
    void hangUpOfTheOtherEndIsConnectionLost() throws Exception {
        ScriptedPeer script = ScriptedPeer.scripted().on("MEAS?", stall());
        ScpiClient c = connect(script, "", ScpiSettings.builder().clearOnConnect(false)
                .readTimeout(Duration.ofSeconds(10)).build());
        Thread hangUp = new Thread(() -> {
            try {
                Thread.sleep(200);
                pty.close();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        });
        hangUp.start();
        assertThrows(ConnectionLostException.class, () -> c.query("MEAS?"));
        hangUp.join();
    }

    @Test
    void missingDeviceIsConnectFailed() {
        ConnectFailedException e = assertThrows(ConnectFailedException.class,
                () -> ScpiClient.open("serial:" + dir.resolve("no-such-tty"), FAST));
        assertTrue(e.getMessage().contains("no-such-tty"), e.getMessage());
    }
}
