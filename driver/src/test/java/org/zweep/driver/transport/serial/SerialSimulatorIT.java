package org.zweep.driver.transport.serial;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.dialect.DialectMeter;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/** The serial transport end to end: a pty bridged by socat to the simulator's TCP port. */
class SerialSimulatorIT {
    private static final int PINGS = 20;

    @TempDir
    Path dir;

    private SimulatorServer server;
    private PtyPair bridge;

    @BeforeEach
    void start() throws Exception {
        BenchSpec rc = BenchSpec.ofNetlist("R1 hi a 10; C1 a lo 100n", "test").ideal();
        server = SimulatorServer.start(new SimulatedBench(rc), ServerOptions.defaults().withPort(0)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        bridge = PtyPair.bridgeToTcp(dir, server.port());
    }

    @AfterEach
    void stop() throws Exception {
        if (bridge != null) {
            bridge.close();
        }
        if (server != null) {
            server.close();
        }
    }

    @Test
    void theStandardDialectMeasuresAPointAndAListOverTheSerialLink() {
        try (DialectMeter meter = DialectMeter.open(
                ScpiClient.open("serial:" + bridge.host + "?baud=115200", ScpiSettings.DEFAULTS), "standard")) {
            assertEquals(Instrument.MODEL, meter.identify().model());
            meter.apply(MeasurementSetting.at(1000));
            Reading r = meter.measure();
            assertEquals(10, r.real(), 1e-9);
            assertEquals(-1591.5494, r.imaginary(), 1e-4); // 100 nF at 1 kHz: X_C = −1/(2πfC), computed
            List<Reading> list = meter.measureList(List.of(MeasurementSetting.at(1e4), MeasurementSetting.at(1e5)));
            Complex z = new Complex(list.get(1).real(), list.get(1).imaginary());
            // Z = R − j/(2πfC)
            assertTrue(z.subtract(new Complex(10, -1 / (2 * Math.PI * 1e5 * 100e-9))).abs() < 1e-9, z.toString());
            assertTrue(meter.safeShutdown());
        }
    }

    @Test
    void pingRoundTripsWorkOverTheSerialLinkAndOverTcp() {
        for (String address : List.of("serial:" + bridge.host + "?baud=115200", "tcp://127.0.0.1:" + server.port())) {
            // what zweep ping does: one warm-up query, then PINGS timed ones, each answered in turn
            try (ScpiClient c = ScpiClient.open(address, ScpiSettings.DEFAULTS)) {
                for (int i = 0; i <= PINGS; i++) {
                    assertEquals(Instrument.IDENTIFICATION, c.query("*IDN?"), address + ", query " + i);
                }
                assertEquals(List.of(), c.drainErrors(), address);
            }
        }
    }
}
