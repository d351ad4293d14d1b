package org.zweep.driver.transport.vxi11;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.ServerSocket;
import java.time.Duration;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.Vxi11Address;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.server.SimulatorServer;
import org.zweep.driver.transport.LanTestMeter;
import org.zweep.simulator.vxi11.Vxi11Options;
import org.zweep.simulator.vxi11.Vxi11Server;

/**
 * zweep's VXI-11 client against the simulator's VXI-11 server (separate code on both sides, both
 * from VXI-11 rev. 1.0 and RFC 5531 / 4506 / 1833): pieces, fragments, the abort channel, locks,
 * device clear, the status byte and the ways connecting fails.
 */
class Vxi11TransportIT {
    private static final TransportOptions OPTIONS = TransportOptions.DEFAULT;

    private SimulatorServer meter;
    private Vxi11Server server;

    private Vxi11Address start(Vxi11Options options) throws IOException {
        meter = LanTestMeter.start();
        server = Vxi11Server.start(meter, options);
        return (Vxi11Address) Address.parse("vxi11://127.0.0.1:" + server.portmapperPort() + "/inst0");
    }

    @AfterEach
    void stop() {
        if (server != null) {
            server.close();
        }
        if (meter != null) {
            meter.close();
        }
    }

    private static String readMessage(Vxi11Transport t, long timeoutMillis) {
        return LanTestMeter.readLine(t, timeoutMillis);
    }

    private static void send(Vxi11Transport t, String message) {
        LanTestMeter.send(t, message);
    }

    @Test
    void repliesLongerThanTheReadSizeComeInPiecesAndLongMessagesSplitAtTheServersMaximum() throws IOException {
        Vxi11Address a = start(Vxi11Options.defaults().withMaxReceiveBytes(16));
        // 7 bytes per device_read: *IDN?'s 57-byte reply takes nine reads, ended by END on the last
        try (ScpiClient c = ScpiClient.connect(Vxi11Transport.connect(a, OPTIONS, 7), ScpiSettings.DEFAULTS)) {
            assertEquals(Instrument.IDENTIFICATION, c.query("*IDN?"));
            // 33 bytes in three device_write pieces of at most 16, END on the last only
            assertEquals(1234, c.queryNumber(":SOUR:FREQ 1234;:SOUR:FREQ?;*OPC"), 0);
            assertEquals(220, c.queryNumbers(":READ?")[0], 1e-9); // the resistor itself (ideal bench)
            assertEquals(java.util.List.of(), c.drainErrors());
        }
    }

    @Test
    void repliesInRecordFragmentsOfThreeBytesAreReassembled() throws IOException {
        Vxi11Address a = start(Vxi11Options.defaults().withReplyFragmentBytes(3));
        try (ScpiClient c = ScpiClient.open(a, ScpiSettings.DEFAULTS)) {
            assertEquals(Instrument.IDENTIFICATION, c.query("*IDN?"));
            assertEquals(220, c.queryNumbers(":READ?")[0], 1e-9);
        }
    }

    @Test
    void aStalledReplyTimesOutWhenTheDeviceSaysSoAndTheLinkStaysOpen() throws IOException {
        Vxi11Address a = start(Vxi11Options.defaults());
        ScpiSettings fast = ScpiSettings.builder().readTimeout(Duration.ofMillis(300)).resync(
                org.zweep.driver.scpi.Resync.DRAIN).build();
        try (ScpiClient c = ScpiClient.open(a, fast); ScpiClient other = ScpiClient.open(a, ScpiSettings.DEFAULTS)) {
            c.write(":SIM:FAUL:STAL");
            long t0 = System.nanoTime();
            MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> c.query("*IDN?"));
            long ms = (System.nanoTime() - t0) / 1_000_000;
            // the server's device_read gives up at the I/O timeout (error 15), not the RPC grace after it
            assertTrue(ms >= 300 && ms < 300 + Vxi11Transport.RPC_GRACE_MILLIS, ms + " ms: " + e.getMessage());
            assertEquals(Instrument.IDENTIFICATION, other.query("*IDN?"));
        }
    }

    @Test
    void anAbortOverTheAbortChannelEndsAWaitingRead() throws Exception {
        Vxi11Address a = start(Vxi11Options.defaults());
        try (Vxi11Transport t = Vxi11Transport.connect(a, OPTIONS)) {
            send(t, ":SIM:FAUL:DEL 3;*IDN?\n");
            CompletableFuture<Void> aborter = CompletableFuture.runAsync(() -> {
                sleep(200);
                t.abort();
            });
            long t0 = System.nanoTime();
            assertEquals(0, t.read(new byte[64], 0, 64, 5000), "an aborted read brings nothing");
            long ms = (System.nanoTime() - t0) / 1_000_000;
            assertTrue(ms < 2000, "the read waited " + ms + " ms despite the abort");
            aborter.get(5, TimeUnit.SECONDS);
            // the delayed reply still comes, on the same link
            assertEquals(Instrument.IDENTIFICATION + "\n", readMessage(t, 5000));
        }
    }

    @Test
    void aLockHeldByAnotherLinkHoldsWritesForTheirLockTimeout() throws IOException {
        Vxi11Address a = start(Vxi11Options.defaults());
        TransportOptions shortWrites = new TransportOptions(Duration.ofSeconds(5), Duration.ofMillis(300));
        try (Vxi11Transport holder = Vxi11Transport.connect(a, OPTIONS);
                Vxi11Transport waiter = Vxi11Transport.connect(a, shortWrites)) {
            holder.lock(Duration.ofSeconds(1));
            long t0 = System.nanoTime();
            MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> send(waiter, "*IDN?\n"));
            long ms = (System.nanoTime() - t0) / 1_000_000;
            assertTrue(e.getMessage().contains("VXI-11 error 11 (device locked by another link)"), e.getMessage());
            assertTrue(ms >= 300, "gave up after " + ms + " ms, before the 300 ms lock timeout");
            assertThrows(MeterTimeoutException.class, () -> waiter.lock(Duration.ofMillis(100)));
            assertTrue(holder.unlock());
            assertFalse(holder.unlock(), "a second unlock: this link holds no lock");
            send(waiter, "*IDN?\n");
            assertEquals(Instrument.IDENTIFICATION + "\n", readMessage(waiter, 5000));
        }
    }

    @Test
    void deviceClearDiscardsAnUnreadReplyAndTheStatusByteShowsIt() throws IOException {
        Vxi11Address a = start(Vxi11Options.defaults());
        try (Vxi11Transport t = Vxi11Transport.connect(a, OPTIONS)) {
            assertEquals(0, t.readStatusByte() & 0x10, "MAV with nothing to read");
            send(t, "*IDN?\n");
            // IEEE 488.2 §11.2: bit 4 (16), MAV, is set while the output queue holds a message (once the
            // device has executed the query, which it does after device_write has returned)
            long until = System.nanoTime() + 2_000_000_000L;
            int stb = t.readStatusByte();
            while ((stb & 0x10) == 0 && System.nanoTime() < until) {
                stb = t.readStatusByte();
            }
            assertEquals(0x10, stb & 0x10, "MAV with the reply unread");
            t.clear();
            assertEquals(0, t.readStatusByte() & 0x10, "MAV after device clear");
            send(t, "*OPC?\n");
            assertEquals("1\n", readMessage(t, 5000), "the first reply after the clear is the new query's");
        }
    }

    @Test
    void aTriggerOverTheLinkStartsABusTriggeredMeasurement() throws IOException {
        Vxi11Address a = start(Vxi11Options.defaults());
        try (Vxi11Transport t = Vxi11Transport.connect(a, OPTIONS)) {
            send(t, ":TRIG:SOUR BUS;:INIT\n");
            t.trigger();
            send(t, ":FETC?;:SYST:ERR?\n");
            String[] reply = readMessage(t, 5000).strip().split(";");
            assertEquals(220, Double.parseDouble(reply[0].split(",")[0]), 1e-9);
            assertEquals("0,\"No error\"", reply[1]);
        }
    }

    @Test
    void aHostWithoutPortmapperIsAConnectFailureNamingThePortmapper() throws IOException {
        int closed;
        try (ServerSocket s = new ServerSocket(0)) {
            closed = s.getLocalPort();
        }
        ConnectFailedException e = assertThrows(ConnectFailedException.class,
                () -> ScpiClient.open("vxi11://127.0.0.1:" + closed, ScpiSettings.DEFAULTS));
        assertTrue(e.getMessage().contains("cannot reach the portmapper at 127.0.0.1:" + closed), e.getMessage());
    }

    @Test
    void anUnknownDeviceNameIsAConnectFailureNamingIt() throws IOException {
        Vxi11Address a = start(Vxi11Options.defaults());
        ConnectFailedException e = assertThrows(ConnectFailedException.class, () -> ScpiClient.open(
                "vxi11://127.0.0.1:" + a.portmapperPort() + "/inst7", ScpiSettings.DEFAULTS));
        assertTrue(e.getMessage().contains("device 'inst7': VXI-11 error 3 (device not accessible)"), e.getMessage());
    }

    @Test
    void theLinkIsDestroyedOnCloseAndAClosedTransportRefusesWork() throws IOException {
        Vxi11Address a = start(Vxi11Options.defaults());
        Vxi11Transport t = Vxi11Transport.connect(a, OPTIONS);
        assertEquals(1, server.linkCount());
        t.close();
        assertEquals(0, server.linkCount(), "destroy_link on close");
        assertThrows(ConnectionLostException.class, () -> send(t, "*IDN?\n"));
    }

    private static void sleep(long ms) {
        try {
            Thread.sleep(ms);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
