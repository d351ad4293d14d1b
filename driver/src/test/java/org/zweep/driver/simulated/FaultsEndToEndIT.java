package org.zweep.driver.simulated;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.zweep.driver.dialect.DialectMeter;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.scpi.MeterErrorException;
import org.zweep.driver.scpi.ScpiError;
import org.zweep.driver.scpi.ScpiProtocolException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.FaultPlan;

/**
 * The driver's failure handling against the simulator's fault injection ({@code SIMulate:FAULt}),
 * each fault set by the connection it applies to, just before the operation it hits.
 */
class FaultsEndToEndIT {
    /** R1 = 100 Ω in series with C1 = 1 µF. */
    private static final BenchSpec RC = BenchSpec.ofNetlist("R1 hi a 100; C1 a lo 1u", "test").ideal();

    private static Complex rc(double frequencyHz) {
        return new Complex(100, -1 / (2 * Math.PI * frequencyHz * 1e-6)); // common practice, no source
    }

    private static SimulatorLink open(SimulatorLink.Kind kind) {
        return SimulatorLink.open(kind, RC, SimulatorLink.options(TimingModel.NONE), SimulatorLink.FAST);
    }

    private static void assertIs(Complex expected, Reading r, String what) {
        double err = new Complex(r.real(), r.imaginary()).subtract(expected).abs() / expected.abs();
        assertTrue(err < 1e-9, what + ": read " + r.real() + ", " + r.imaginary() + " expected " + expected);
    }

    @ParameterizedTest
    @EnumSource(SimulatorLink.Kind.class)
    void aReplyLaterThanTheTimeoutIsATimeoutAndTheNextQueryGetsItsOwnAnswer(SimulatorLink.Kind kind) {
        try (SimulatorLink link = open(kind); DialectMeter meter = link.standardMeter()) {
            meter.apply(MeasurementSetting.at(1000));
            link.client.write(":SIM:FAUL:DEL 0.8"); // twice the 400 ms read timeout
            assertThrows(MeterTimeoutException.class, meter::measure);
            // the 1 kHz reply arrives late; the next reading must be the 10 kHz one
            meter.apply(MeasurementSetting.at(10_000));
            assertIs(rc(10_000), meter.measure(), "the reading after the late one");
            assertEquals("Korvane Bench Instruments", link.client.query("*IDN?").split(",")[0]);
            link.assertNoErrors("a late reply");
        }
    }

    @ParameterizedTest
    @EnumSource(SimulatorLink.Kind.class)
    void aDroppedConnectionIsConnectionLostAndStaysLost(SimulatorLink.Kind kind) {
        try (SimulatorLink link = open(kind); DialectMeter meter = link.standardMeter()) {
            meter.apply(MeasurementSetting.at(1000));
            link.client.write(":SIM:FAUL:DROP 0"); // close once this message is handled
            assertThrows(ConnectionLostException.class, meter::measure);
            assertThrows(ConnectionLostException.class, () -> meter.apply(MeasurementSetting.at(2000)));
            assertFalse(meter.safeShutdown(), "bias-off cannot be confirmed over a lost link");
        }
    }

    /**
     * Every reply cut into 3-byte pieces, {@code FaultPlan.FRAGMENT_GAP} (2 ms) apart, still parses.
     * A reply of n bytes takes (n/3 − 1) gaps at least, and each gap is a wake-up of the
     * simulator's writer and of the client's reader: a 110-byte list reply took up to 290 ms on a
     * loaded machine, so the link has the client's default read timeout (5 s), not the fault tests'
     * 400 ms, which a busier machine exceeded once. That the pieces really came slowly is checked
     * from below, which no load can break: the identity reply cannot come sooner than its gaps.
     */
    @ParameterizedTest
    @EnumSource(SimulatorLink.Kind.class)
    void repliesInThreeBytePiecesParse(SimulatorLink.Kind kind) {
        try (SimulatorLink link = SimulatorLink.open(kind, RC, SimulatorLink.options(TimingModel.NONE),
                org.zweep.driver.scpi.ScpiSettings.DEFAULTS); DialectMeter meter = link.standardMeter()) {
            link.client.write(":SIM:FAUL:FRAG 3,10");
            meter.apply(MeasurementSetting.at(1000));
            assertIs(rc(1000), meter.measure(), "fragmented point");
            List<Reading> list = meter.measureList(List.of(MeasurementSetting.at(100), MeasurementSetting.at(1e4),
                    MeasurementSetting.at(1e5)));
            assertIs(rc(100), list.get(0), "fragmented list, first");
            assertIs(rc(1e5), list.get(2), "fragmented list, last");
            long t0 = System.nanoTime();
            String idn = link.client.query("*IDN?");
            long tookNanos = System.nanoTime() - t0;
            assertEquals("Korvane Bench Instruments", idn.split(",")[0]);
            long gaps = (idn.length() + 2) / 3 - 1; // the terminator (where there is one) not counted
            assertTrue(tookNanos >= gaps * FaultPlan.FRAGMENT_GAP.toNanos(), "the identity reply ("
                    + idn.length() + " bytes) came in " + tookNanos / 1e6 + " ms: not in 3-byte pieces 2 ms apart");
            link.assertNoErrors("fragmented replies");
        }
    }

    @ParameterizedTest
    @EnumSource(SimulatorLink.Kind.class)
    void aReplyWithoutTerminatorTimesOutKeepingWhatArrived(SimulatorLink.Kind kind) {
        try (SimulatorLink link = open(kind); DialectMeter meter = link.standardMeter()) {
            meter.apply(MeasurementSetting.at(1000));
            link.client.write(":SIM:FAUL:TERM:OMIT");
            MeterTimeoutException e = assertThrows(MeterTimeoutException.class, meter::measure);
            String got = new String(e.received(), StandardCharsets.ISO_8859_1);
            String[] fields = got.split("[,;]");
            assertTrue(fields.length >= 3, got);
            assertEquals(100, Double.parseDouble(fields[0]), 1e-9, got);
            assertEquals(rc(1000).getImaginary(), Double.parseDouble(fields[1]), 1e-9, got);
            assertTrue(got.endsWith("\"No error\""), got);
            meter.apply(MeasurementSetting.at(2000));
            assertIs(rc(2000), meter.measure(), "the reading after the unterminated one");
        }
    }

    /** Garbling replaces about one character in eight by another printable one. */
    @ParameterizedTest
    @EnumSource(SimulatorLink.Kind.class)
    void aGarbledReadingIsAProtocolErrorNotAWrongNumber(SimulatorLink.Kind kind) {
        try (SimulatorLink link = open(kind); DialectMeter meter = link.standardMeter()) {
            // with seed 1 the garbled reading starts '1{0E+02' (the garbling is drawn from the seed and reply number)
            link.client.write(":SIM:SEED 1");
            meter.apply(MeasurementSetting.at(1000));
            link.client.write(":SIM:FAUL:GARB");
            ScpiProtocolException e = assertThrows(ScpiProtocolException.class, meter::measure);
            assertTrue(e.getMessage().contains("not an NR1/NR2/NR3 number"), e.getMessage());
            assertIs(rc(1000), meter.measure(), "the next reading");
        }
    }

    /**
     * Whatever a garbled reply becomes, the conversation stays in step: the next reading is right.
     * A digit garbled into another digit is still a valid number and cannot be told from a true
     * reading without a checksum; such readings are counted, not failed.
     */
    @ParameterizedTest
    @EnumSource(SimulatorLink.Kind.class)
    void garbledRepliesNeverPutTheConversationOutOfStep(SimulatorLink.Kind kind) {
        try (SimulatorLink link = open(kind); DialectMeter meter = link.standardMeter()) {
            int failed = 0;
            for (int seed = 1; seed <= 40; seed++) {
                link.client.write(":SIM:SEED " + seed);
                meter.apply(MeasurementSetting.at(1000));
                link.client.write(":SIM:FAUL:GARB");
                try {
                    meter.measure();
                } catch (ScpiProtocolException | MeterErrorException e) {
                    // MeterErrorException: the garbling hit the code of the appended error query
                    failed++;
                }
                meter.apply(MeasurementSetting.at(2000));
                assertIs(rc(2000), meter.measure(), "the reading after garbled reply " + seed);
            }
            assertTrue(failed > 0, "no garbled reading failed");
            link.assertNoErrors("40 garbled replies");
        }
    }

    @ParameterizedTest
    @EnumSource(SimulatorLink.Kind.class)
    void anInjectedInstrumentErrorIsAMeterErrorWithItsCodeAndText(SimulatorLink.Kind kind) {
        try (SimulatorLink link = open(kind); DialectMeter meter = link.standardMeter()) {
            meter.apply(MeasurementSetting.at(1000));
            link.client.write(":SIM:FAUL:ERR -240,\"Hardware error;front end\"");
            MeterErrorException e = assertThrows(MeterErrorException.class, meter::measure);
            assertEquals(List.of(new ScpiError(-240, "Hardware error;front end")), e.errors());
            assertTrue(e.getMessage().contains("-240"), e.getMessage());
            assertIs(rc(1000), meter.measure(), "the reading after the error was read");
            link.assertNoErrors("the injected error");
        }
    }
}
