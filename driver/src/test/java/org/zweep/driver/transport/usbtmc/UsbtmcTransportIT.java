package org.zweep.driver.transport.usbtmc;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.MeterException;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.UsbtmcAddress;
import org.zweep.driver.dialect.DialectMeter;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.serial.PtyPair;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * The USBTMC transport's real code (JNA open/read/write/poll/close) against a stand-in for the
 * kernel's {@code /dev/usbtmcN}: a raw pseudo-terminal bridged by socat to the simulator. The
 * stand-in has no usbtmc ioctls, so reads wait with {@code poll}; one write is one message and
 * replies come as the simulator sends them, as through the kernel driver.
 */
class UsbtmcTransportIT {
    @TempDir
    Path dir;

    private SimulatorServer server;
    private PtyPair node;

    @BeforeEach
    void start() throws Exception {
        BenchSpec rc = BenchSpec.ofNetlist("R1 hi a 10; C1 a lo 100n", "test").ideal();
        server = SimulatorServer.start(new SimulatedBench(rc), ServerOptions.defaults().withPort(0)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        node = PtyPair.bridgeToTcp(dir, server.port());
    }

    @AfterEach
    void stop() {
        if (node != null) {
            node.close();
        }
        if (server != null) {
            server.close();
        }
    }

    private String address() {
        return "usbtmc:" + node.host;
    }

    @Test
    void theStandardDialectMeasuresOverTheNode() {
        try (ScpiClient c = ScpiClient.open(address(), ScpiSettings.DEFAULTS);
                DialectMeter meter = DialectMeter.open(c, "standard")) {
            assertEquals(Instrument.MODEL, meter.identify().model());
            meter.apply(MeasurementSetting.at(1000));
            Reading r = meter.measure();
            assertEquals(10, r.real(), 1e-9);
            // Z = R - j/(2 pi f C) of 10 ohm and 100 nF at 1 kHz; common practice, no source
            assertEquals(-1 / (2 * Math.PI * 1000 * 100e-9), r.imaginary(), 1e-6);
            List<Reading> list = meter.measureList(List.of(MeasurementSetting.at(1e4), MeasurementSetting.at(1e5)));
            assertEquals(-1 / (2 * Math.PI * 1e5 * 100e-9), list.get(1).imaginary(), 1e-6);
            assertEquals(List.of(), c.drainErrors());
            assertTrue(meter.safeShutdown());
        }
    }

    @Test
    void theStandInIsNoKernelNodeSoDeviceClearSaysWhatItNeeds() {
        UsbtmcTransport t = UsbtmcTransport.open((UsbtmcAddress) Address.parse(address()), TransportOptions.DEFAULT);
        try (t) {
            assertFalse(t.kernelDriver());
            MeterException e = assertThrows(MeterException.class, t::clear);
            assertEquals(address() + ": device clear needs the kernel's usbtmc driver; " + node.host + " is not one",
                    e.getMessage());
        }
    }

    @Test
    void aLateReplyIsATimeoutAndTheNextQueryGetsItsOwnAnswer() {
        ScpiSettings fast = ScpiSettings.builder().readTimeout(Duration.ofMillis(300)).build();
        try (ScpiClient c = ScpiClient.open(address(), fast)) {
            c.write(":SIM:FAUL:DEL 0.6");
            assertThrows(MeterTimeoutException.class, () -> c.query("*IDN?"));
            assertEquals(1000, c.queryNumber(":SOUR:FREQ 1000;:SOUR:FREQ?"), 0);
        }
    }

    @Test
    void aDroppedLinkIsConnectionLostAndStaysLost() {
        try (ScpiClient c = ScpiClient.open(address(), ScpiSettings.DEFAULTS)) {
            c.write(":SIM:FAUL:DROP 0"); // close once this message is handled
            assertThrows(ConnectionLostException.class, () -> c.query("*IDN?"));
            assertThrows(ConnectionLostException.class, () -> c.query("*IDN?"));
        }
    }

    @Test
    void aMissingNodeIsAConnectFailureNamingIt() {
        ConnectFailedException e = assertThrows(ConnectFailedException.class,
                () -> ScpiClient.open("usbtmc:" + dir.resolve("usbtmc9"), ScpiSettings.DEFAULTS));
        assertEquals("usbtmc:" + dir.resolve("usbtmc9") + ": no device " + dir.resolve("usbtmc9") + " (is the instrument"
                + " plugged in and switched to USBTMC, and the usbtmc kernel module loaded? ls /dev/usbtmc*)",
                e.getMessage());
    }
}
