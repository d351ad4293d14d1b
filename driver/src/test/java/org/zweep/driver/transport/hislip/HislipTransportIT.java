package org.zweep.driver.transport.hislip;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.time.Duration;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.Test;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.HislipAddress;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.LanTestMeter;
import org.zweep.simulator.hislip.HislipOptions;
import org.zweep.simulator.hislip.HislipServer;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.server.SimulatorServer;

/**
 * zweep's HiSLIP client against the simulator's HiSLIP server (separate code on both sides, both
 * from IVI-6.1): both modes, message size negotiation, device clear, the status query, trigger,
 * locks and the ways connecting fails.
 */
class HislipTransportIT {
    private static final TransportOptions OPTIONS = TransportOptions.DEFAULT;

    private SimulatorServer meter;
    private HislipServer server;

    private HislipAddress start(HislipOptions options) throws IOException {
        meter = LanTestMeter.start();
        server = HislipServer.start(meter, options);
        return (HislipAddress) Address.parse("TCPIP::127.0.0.1::hislip0," + server.port() + "::INSTR");
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

    private static void send(HislipTransport t, String message) {
        LanTestMeter.send(t, message);
    }

    private static String readMessage(HislipTransport t) {
        return LanTestMeter.readLine(t, 5000);
    }

    @ParameterizedTest(name = "overlapped={0}")
    @ValueSource(booleans = {false, true})
    void bothModesAnswerQueriesAndTheClientKnowsWhichItGot(boolean overlapped) throws IOException {
        HislipAddress a = start(HislipOptions.defaults().withOverlapped(overlapped));
        try (HislipTransport t = HislipTransport.connect(a, OPTIONS)) {
            assertEquals(overlapped, t.overlapped());
            try (ScpiClient c = ScpiClient.connect(t, ScpiSettings.DEFAULTS)) {
                assertEquals(Instrument.IDENTIFICATION, c.query("*IDN?"));
                assertEquals(220, c.queryNumbers(":READ?")[0], 1e-9); // the resistor itself (ideal bench)
                assertEquals(List.of(), c.drainErrors());
            }
        }
    }

    @Test
    void messagesLongerThanTheServersMaximumGoInDataPiecesEndedByDataEnd() throws IOException {
        HislipAddress a = start(HislipOptions.defaults().withMaxMessageBytes(64));
        try (HislipTransport t = HislipTransport.connect(a, OPTIONS); ScpiClient c = ScpiClient.connect(t,
                ScpiSettings.DEFAULTS)) {
            assertEquals(64, t.serverMaxMessageBytes());
            String longMessage = ":SOUR:FREQ 1234;:SOUR:FREQ 1235;:SOUR:FREQ 1236;:SOUR:FREQ 1237;:SOUR:FREQ?";
            assertTrue(longMessage.length() > 64);
            assertEquals(1237, c.queryNumber(longMessage), 0);
        }
    }

    @Test
    void deviceClearDiscardsAReplyStillOnItsWay() throws IOException {
        HislipAddress a = start(HislipOptions.defaults());
        try (HislipTransport t = HislipTransport.connect(a, OPTIONS)) {
            // IEEE 488.2 §11.2: bit 4 (16), MAV, is clear with no response waiting
            assertEquals(0, t.readStatusByte() & 0x10, "MAV with nothing to read");
            send(t, ":SIM:FAUL:DEL 0.5;*IDN?\n");
            sleep(150);
            t.clear();
            send(t, "*OPC?\n");
            assertEquals("1\n", readMessage(t), "the first reply after the clear is the new query's");
            sleep(600);
            send(t, "*OPC?\n");
            assertEquals("1\n", readMessage(t), "the delayed reply from before the clear never arrives");
        }
    }

    @Test
    void aTriggerMessageStartsABusTriggeredMeasurement() throws IOException {
        HislipAddress a = start(HislipOptions.defaults());
        try (HislipTransport t = HislipTransport.connect(a, OPTIONS)) {
            send(t, ":TRIG:SOUR BUS;:INIT\n");
            t.trigger();
            send(t, ":FETC?;:SYST:ERR?\n");
            String[] reply = readMessage(t).strip().split(";");
            assertEquals(220, Double.parseDouble(reply[0].split(",")[0]), 1e-9);
            assertEquals("0,\"No error\"", reply[1]);
        }
    }

    @Test
    void aLockHeldByAnotherSessionIsRefusedAfterTheLockTimeoutAndHoldsItsMessages() throws IOException {
        HislipAddress a = start(HislipOptions.defaults());
        try (HislipTransport holder = HislipTransport.connect(a, OPTIONS);
                HislipTransport other = HislipTransport.connect(a, OPTIONS)) {
            holder.lock(Duration.ofSeconds(1));
            long t0 = System.nanoTime();
            assertThrows(MeterTimeoutException.class, () -> other.lock(Duration.ofMillis(300)));
            long ms = (System.nanoTime() - t0) / 1_000_000;
            assertTrue(ms >= 300, "refused after " + ms + " ms, before the 300 ms lock timeout");
            send(other, "*IDN?\n");
            assertEquals(0, other.read(new byte[64], 0, 64, 300), "a locked-out session's query waits");
            assertTrue(holder.unlock());
            assertFalse(holder.unlock(), "a second release: this session holds no lock");
            assertEquals(Instrument.IDENTIFICATION + "\n", readMessage(other), "answered once the lock is released");
        }
    }

    @Test
    void aLateReplyIsATimeoutAndTheNextQueryGetsItsOwnAnswer() throws IOException {
        HislipAddress a = start(HislipOptions.defaults());
        ScpiSettings fast = ScpiSettings.builder().readTimeout(Duration.ofMillis(300)).build();
        try (ScpiClient c = ScpiClient.open(a, fast)) {
            c.write(":SIM:FAUL:DEL 0.6");
            assertThrows(MeterTimeoutException.class, () -> c.query("*IDN?"));
            assertEquals(1000, c.queryNumber(":SOUR:FREQ 1000;:SOUR:FREQ?"), 0);
        }
    }

    @Test
    void aStalledReplyTimesOutAtTheReadTimeoutAndOtherSessionsGoOn() throws IOException {
        HislipAddress a = start(HislipOptions.defaults());
        ScpiSettings fast = ScpiSettings.builder().readTimeout(Duration.ofMillis(300)).build();
        try (ScpiClient c = ScpiClient.open(a, fast); ScpiClient other = ScpiClient.open(a, ScpiSettings.DEFAULTS)) {
            c.write(":SIM:FAUL:STAL");
            long t0 = System.nanoTime();
            assertThrows(MeterTimeoutException.class, () -> c.query("*IDN?"));
            long ms = (System.nanoTime() - t0) / 1_000_000;
            assertTrue(ms >= 300 && ms < 1300, "timed out after " + ms + " ms");
            assertEquals(Instrument.IDENTIFICATION, other.query("*IDN?"));
        }
    }

    @Test
    void anUnknownSubAddressIsAConnectFailureSayingWhatIsOffered() throws IOException {
        HislipAddress a = start(HislipOptions.defaults());
        ConnectFailedException e = assertThrows(ConnectFailedException.class, () -> ScpiClient.open(
                "hislip://127.0.0.1:" + a.port() + "/hislip7", ScpiSettings.DEFAULTS));
        assertTrue(e.getMessage().contains("refused Initialize: HiSLIP fatal error 3 (invalid initialization "
                + "sequence): no sub-address 'hislip7' here (this server offers hislip0)"), e.getMessage());
    }

    @Test
    void aServerThatIsNotHislipIsAConnectFailure() throws IOException {
        start(HislipOptions.defaults());
        // the simulator's raw SCPI port waits for a newline that the Initialize message never brings
        ConnectFailedException e = assertThrows(ConnectFailedException.class, () -> ScpiClient.open(
                "hislip://127.0.0.1:" + meter.port(), ScpiSettings.builder()
                        .connectTimeout(Duration.ofMillis(500)).build()));
        assertTrue(e.getMessage().startsWith("hislip://127.0.0.1:" + meter.port() + ": "), e.getMessage());
    }

    private static void sleep(long ms) {
        try {
            Thread.sleep(ms);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
