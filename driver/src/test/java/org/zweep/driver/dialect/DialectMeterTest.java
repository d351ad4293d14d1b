package org.zweep.driver.dialect;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.function.UnaryOperator;
import java.util.stream.IntStream;
import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.MeterException;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.scpi.MeterErrorException;
import org.zweep.driver.scpi.ScpiError;
import org.zweep.driver.scpi.ScpiProtocolException;
import org.zweep.driver.scpi.ScpiSession;

class DialectMeterTest {
    private static final String BIAS_OFF = ":SOUR:VOLT:OFFS:STAT OFF;:SOUR:CURR:OFFS:STAT OFF";

    /**
     * Answers like a meter on the standard dialect that accepts every command: the error query
     * answers 0, and READ? (and FETC?, the same result again) one R,X pair per point of the last
     * list (or one pair in CW mode).
     */
    static UnaryOperator<String> acceptingStandardMeter() {
        int[] listPoints = {0};
        boolean[] listMode = {false};
        return message -> {
            for (String unit : message.split(";")) {
                if (unit.startsWith(":SOUR:LIST:FREQ ")) {
                    listPoints[0] = unit.split(",").length;
                } else if (unit.equals(":SOUR:FREQ:MODE LIST")) {
                    listMode[0] = true;
                } else if (unit.equals(":SOUR:FREQ:MODE CW")) {
                    listMode[0] = false;
                }
            }
            if (message.startsWith(":READ?") || message.startsWith(":FETC?")) {
                int n = listMode[0] ? listPoints[0] : 1;
                String result = String.join(",", Collections.nCopies(n, "+1.0E+01,-2.0E+01"));
                return (message.startsWith(":READ?;:FETC?") ? result + ";" + result : result) + ";0,\"No error\"";
            }
            return "0,\"No error\"";
        };
    }

    private final AnsweringMeter fake = new AnsweringMeter(acceptingStandardMeter());
    private final DialectMeter meter = DialectMeter.open(fake, "standard");

    @Test
    void steadyStatePointCostsTwoRoundTripsAndSendsOnlyTheChangedFrequency() {
        MeasurementSetting s = MeasurementSetting.at(100);
        meter.apply(s);
        meter.measure();

        for (double f : new double[] {200, 500, 1000, 2000, 5000, 1e4, 2e4, 5e4, 1e5, 2e5}) {
            int before = fake.roundTrips();
            int firstMessage = fake.messages().size();
            meter.apply(s.withFrequencyHz(f));
            Reading r = meter.measure();

            assertEquals(2, fake.roundTrips() - before, "round trips at " + f + " Hz");
            assertEquals(List.of(":SOUR:FREQ " + Nr3.format(f, 0) + ";:SYST:ERR?", ":READ?;:FETC?;:SYST:ERR?"),
                    fake.messages().subList(firstMessage, fake.messages().size()));
            assertEquals(f, r.setting().frequencyHz());
        }
    }

    @Test
    void repeatingTheSameSettingSendsNothing() {
        MeasurementSetting s = MeasurementSetting.at(1000).withBias(Bias.voltage(2));
        meter.apply(s);
        int before = fake.messages().size();

        meter.apply(s);
        meter.measure();

        assertEquals(List.of(":READ?;:FETC?;:SYST:ERR?"), fake.messages().subList(before, fake.messages().size()));
    }

    @Test
    void wholeListIsOneConfigurationThenOneTriggerAndRead() {
        MeasurementSetting s = MeasurementSetting.at(1000);
        List<MeasurementSetting> sweep = IntStream.rangeClosed(1, 50).mapToObj(i -> s.withFrequencyHz(100.0 * i))
                .toList();

        List<Reading> readings = meter.measureList(sweep);

        assertEquals(50, readings.size());
        assertEquals(2, fake.roundTrips());
        assertEquals(1, fake.messages().stream().filter(m -> m.contains(":READ?")).count());
        assertEquals(sweep.get(49), readings.get(49).setting());
    }

    @Test
    void listLongerThanTheMeterHoldsIsSplitIntoFullSweeps() {
        MeasurementSetting s = MeasurementSetting.at(1000);
        List<MeasurementSetting> sweep = IntStream.range(0, 450).mapToObj(i -> s.withFrequencyHz(10.0 + i))
                .toList();

        List<Reading> readings = meter.measureList(sweep);

        assertEquals(450, readings.size());
        // the standard dialect declares list-points = 201: 201 + 201 + 48
        assertEquals(List.of(201, 201, 48), fake.messages().stream().filter(m -> m.contains(":SOUR:LIST:FREQ "))
                .map(DialectMeterTest::listLength).toList());
        assertEquals(6, fake.roundTrips());
    }

    private static int listLength(String message) {
        for (String unit : message.split(";")) {
            if (unit.startsWith(":SOUR:LIST:FREQ ")) {
                return unit.split(",").length;
            }
        }
        throw new AssertionError(message);
    }

    @Test
    void settingsDifferingInMoreThanTheListableFieldsAreMeasuredPointByPoint() {
        MeasurementSetting s = MeasurementSetting.at(1000);

        List<Reading> readings = meter.measureList(List.of(s, s.withAveragingCount(4), s.withFrequencyHz(2000)));

        assertEquals(3, readings.size());
        assertTrue(fake.messages().stream().noneMatch(m -> m.contains(":SOUR:LIST:")));
        assertEquals(6, fake.roundTrips());
    }

    @Test
    void biasBeyondTheDialectsLimitIsRefusedBeforeAnythingIsSent() {
        MeasurementSetting s = MeasurementSetting.at(1000).withBias(Bias.voltage(40.5));

        InvalidInputException e = assertThrows(InvalidInputException.class, () -> meter.apply(s));

        // standard.yaml: bias-voltage = -40 .. 40 V
        assertEquals("DC bias 40.5 V is above the maximum 40 V of the meter (dialect standard)", e.getMessage());
        assertEquals(List.of(), fake.messages());
    }

    @Test
    void oneBadPointInAListRefusesTheWholeListBeforeAnythingIsSent() {
        MeasurementSetting s = MeasurementSetting.at(1000);

        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> meter.measureList(List.of(s, s.withFrequencyHz(5), s.withFrequencyHz(2000))));

        // standard.yaml: frequency = 10 .. 20e6 Hz
        assertEquals("frequency 5 Hz is below the minimum 10 Hz of the meter (dialect standard)", e.getMessage());
        assertEquals(List.of(), fake.messages());
    }

    @Test
    void aListSweepIsAwaitedForTheTimeTheDialectsTimingModelExpects() {
        List<java.time.Duration> works = new ArrayList<>();
        AnsweringMeter session = new AnsweringMeter(acceptingStandardMeter()) {
            @Override
            public String query(String message, java.time.Duration expectedWork) {
                works.add(expectedWork);
                return query(message);
            }

            @Override
            public BlocksReply queryBlocksThenText(String message, int blocks, java.time.Duration expectedWork) {
                works.add(expectedWork);
                return super.queryBlocksThenText(message, blocks, expectedWork);
            }
        };
        DialectMeter meter = DialectMeter.open(session, "standard");
        MeasurementSetting s = MeasurementSetting.at(100).withAveragingCount(4).withIntegrationTimeS(0.1);
        meter.measureList(List.of(s, s.withFrequencyHz(1000), s.withFrequencyHz(10_000)));
        // no outside source: standard.yaml's [timing] (2 ms per point, at least 2 periods):
        // 100 Hz: 4 · max(0.1, 0.02) + 0.002 = 0.402 s, twice more at 1 kHz and 10 kHz: 1.206 s
        assertEquals(List.of(java.time.Duration.ZERO, java.time.Duration.ofNanos(1_206_000_000)), works);
    }

    @Test
    void aTimeoutNamesTheExchangeItHappenedIn() {
        AnsweringMeter session = new AnsweringMeter(m -> {
            if (m.contains(":READ?")) {
                throw new org.zweep.driver.transport.MeterTimeoutException(
                        "fake:answering: no reply to ':READ?;:SYST:ERR?' (waited 10.0 s; nothing received)", new byte[0]);
            }
            return "0,\"No error\"";
        });
        DialectMeter meter = DialectMeter.open(session, "standard");
        meter.apply(MeasurementSetting.at(1000));
        var e = assertThrows(org.zweep.driver.transport.MeterTimeoutException.class, meter::measure);
        assertEquals("fake:answering: no reply to ':READ?;:SYST:ERR?' (waited 10.0 s; nothing received)"
                + " while measuring at 1 kHz", e.getMessage());
    }

    /** A fake meter answering each query with {@code answer}; records every call, close included. */
    static class AnsweringMeter implements ScpiSession {
        final List<String> calls = new ArrayList<>();
        UnaryOperator<String> answer;
        RuntimeException closeFailure;

        AnsweringMeter(UnaryOperator<String> answer) {
            this.answer = answer;
        }

        /** Every message sent, written or queried. */
        List<String> messages() {
            return calls.stream().filter(c -> !c.equals("close")).map(c -> c.substring(c.indexOf(' ') + 1)).toList();
        }

        int roundTrips() {
            return (int) calls.stream().filter(c -> c.startsWith("query ")).count();
        }

        @Override
        public String address() {
            return "fake:answering";
        }

        @Override
        public void write(String message) {
            calls.add("write " + message);
        }

        @Override
        public String query(String message) {
            calls.add("query " + message);
            return answer.apply(message);
        }

        @Override
        public byte[] queryBlock(String message) {
            throw new AssertionError("not used by the standard dialect");
        }

        /** The standard dialect's list replies: the answer's numeric units as REAL,64 blocks (big-endian), then its text. */
        @Override
        public BlocksReply queryBlocksThenText(String message, int blocks, java.time.Duration expectedWork) {
            calls.add("query " + message);
            List<String> units = org.zweep.driver.scpi.ScpiValues.splitUnits(answer.apply(message));
            List<byte[]> out = new ArrayList<>();
            for (int i = 0; i < blocks && i < units.size(); i++) {
                double[] v = org.zweep.driver.scpi.ScpiValues.parseNumbers(units.get(i));
                java.nio.ByteBuffer b = java.nio.ByteBuffer.allocate(v.length * 8);
                for (double x : v) {
                    b.putDouble(x);
                }
                out.add(b.array());
            }
            return new BlocksReply(out, units.size() > blocks ? units.get(blocks) : "");
        }

        @Override
        public List<ScpiError> drainErrors() {
            throw new AssertionError("not used by DialectMeter");
        }

        @Override
        public void close() {
            calls.add("close");
            if (closeFailure != null) {
                throw closeFailure;
            }
        }
    }

    @Test
    void meterErrorCarriesEveryCodeAndText() {
        List<String> queue = new ArrayList<>(List.of("-222,\"Data out of range\"", "-109,\"Missing parameter\"",
                "0,\"No error\""));
        AnsweringMeter session = new AnsweringMeter(m -> queue.remove(0));
        DialectMeter m = DialectMeter.open(session, "standard");

        MeterErrorException e = assertThrows(MeterErrorException.class, () -> m.apply(MeasurementSetting.at(1000)));

        // SCPI-1999 Vol 2 §21.8: -222 "Data out of range", -109 "Missing parameter"
        assertEquals(List.of(new ScpiError(-222, "Data out of range"), new ScpiError(-109, "Missing parameter")),
                e.errors());
        assertEquals(List.of("query :SYST:ERR?", "query :SYST:ERR?"), session.calls.subList(1, 3));
    }

    @Test
    void safeShutdownSendsBiasOffFirstEvenAfterEveryOtherCallFailed() {
        AnsweringMeter session = new AnsweringMeter(m -> {
            throw new MeterException("fake:answering: timed out");
        });
        DialectMeter m = DialectMeter.open(session, "standard");
        assertThrows(MeterException.class, () -> m.apply(MeasurementSetting.at(1000).withBias(Bias.voltage(5))));
        assertThrows(MeterException.class, m::measure);
        assertThrows(MeterException.class, m::identify);
        session.answer = msg -> msg.equals(BIAS_OFF + ";:SYST:ERR?") ? "0,\"No error\"" : "";
        session.calls.clear();

        boolean off = m.safeShutdown();

        assertTrue(off);
        assertEquals(List.of("query " + BIAS_OFF + ";:SYST:ERR?", "close"), session.calls);
    }

    @Test
    void safeShutdownNeverThrowsAndReportsBiasUnconfirmedWhenTheLinkIsDown() {
        AnsweringMeter session = new AnsweringMeter(m -> {
            throw new MeterException("fake:answering: link broken");
        });
        session.closeFailure = new MeterException("fake:answering: close failed");
        DialectMeter m = DialectMeter.open(session, "standard");

        boolean off = m.safeShutdown();
        boolean again = m.safeShutdown();

        assertFalse(off);
        assertFalse(again);
        assertEquals(List.of("query " + BIAS_OFF + ";:SYST:ERR?", "close"), session.calls);
    }

    @Test
    void biasOffMakesTheNextReadingSayBiasIsOff() {
        meter.apply(MeasurementSetting.at(1000).withBias(Bias.voltage(2)));
        meter.biasOff();

        Reading r = meter.measure();

        assertFalse(r.setting().bias().on());
        assertEquals(BIAS_OFF + ";:SYST:ERR?", fake.messages().get(fake.messages().size() - 2));
    }

    @Test
    void aReadingThatIsNoScpiNumberIsAProtocolErrorEvenWhenJavaWouldParseIt() {
        // IEEE 488.2 §8.7.2-8.7.4: NR1/NR2/NR3 have no type suffix, hex, "NaN" or "Infinity";
        // a garbled "+1.0E+01" can read "+1.0E+0d", which Double.parseDouble takes for 1.0
        for (String garbled : List.of("+1.0E+0d", "+1.0E+01f", "NaN", "Infinity", "0x1p3")) {
            fake.answer = m -> m.startsWith(":READ?") ? garbled + ",-2.0E+01;" + garbled + ",-2.0E+01;0,\"No error\""
                    : "0,\"No error\"";
            meter.apply(MeasurementSetting.at(1000));
            ScpiProtocolException e = assertThrows(ScpiProtocolException.class, meter::measure, garbled);
            assertTrue(e.getMessage().contains("'" + garbled + "'"), e.getMessage());
        }
    }
}
