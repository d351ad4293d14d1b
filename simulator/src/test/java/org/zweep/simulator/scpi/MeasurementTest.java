package org.zweep.simulator.scpi;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.bench.PointRequest;
import org.zweep.simulator.bench.SourceKind;

/** Overlapped measurements, the trigger model, data formats, list sweeps and meter-side correction. */
class MeasurementTest {
    private final GatedSleeper gate = new GatedSleeper();
    // 100 Ω in series with 1 mH behind a topology-A fixture: 0.05 Ω + 20 nH, 5 pF across the slot
    private final TestBench bench = new TestBench(100, 1e-3, 0.05, 20e-9, 5e-12);
    private final Console c = new Console(bench, InstrumentOptions.defaults(), gate);
    private final Session other = c.instrument.openSession(Session.Hooks.NONE);

    @AfterEach
    void close() {
        gate.release(1000);
        c.close();
    }

    private String otherSend(String m) {
        byte[] r = other.execute(m.getBytes(StandardCharsets.US_ASCII));
        return r == null ? null : new String(r, 0, r.length - 1, StandardCharsets.US_ASCII);
    }

    private CompletableFuture<String> async(String m) {
        return CompletableFuture.supplyAsync(() -> c.send(m));
    }

    private static double[] numbers(String csv) {
        return Arrays.stream(csv.split(",")).mapToDouble(Double::parseDouble).toArray();
    }

    @Test
    void opcQueryAnswersOnlyOnceTheOverlappedInitiateHasFinished() throws Exception {
        // IEEE 488.2 §10.19 / §12.5.3: *OPC? puts 1 in the output queue when no operation is pending
        c.send("INIT");
        gate.awaitPointStarted();
        CompletableFuture<String> opc = async("*OPC?");
        assertEquals("16", otherSend("STAT:OPER:COND?")); // SCPI-1999 Vol 2 §20: bit 4 MEASuring
        assertFalse(opc.isDone());
        gate.release(1);
        assertEquals("1", opc.get(5, TimeUnit.SECONDS));
        assertEquals("0", otherSend("STAT:OPER:COND?"));
    }

    @Test
    void waiHoldsBackTheRestOfTheMessageUntilTheMeasurementIsDone() throws Exception {
        // IEEE 488.2 §10.39 / §12.5.1
        CompletableFuture<String> r = async("INIT;*WAI;FETC?");
        gate.awaitPointStarted();
        assertFalse(r.isDone());
        gate.release(1);
        assertEquals(2, numbers(r.get(5, TimeUnit.SECONDS)).length);
    }

    @Test
    void opcSetsOperationCompleteWhenTheMeasurementEnds() throws Exception {
        // IEEE 488.2 §10.18 / §12.5.2
        c.send("*ESR?");
        c.send("INIT;*OPC");
        gate.awaitPointStarted();
        assertEquals("0", otherSend("*ESR?"));
        gate.release(1);
        assertEquals("1", otherSend("*OPC?"));
        assertEquals("1", otherSend("*ESR?"));
    }

    @Test
    void initiateWhileMeasuringIsIgnored() throws Exception {
        // SCPI-1999 Vol 2 §21.8.10: -213 Init ignored
        c.send("INIT");
        gate.awaitPointStarted();
        assertEquals(null, otherSend("INIT"));
        gate.release(1);
        c.send("*OPC?");
        assertEquals(List.of(-213), c.codes());
    }

    @Test
    void abortEndsARunningMeasurement() throws Exception {
        // SCPI-1999 Vol 2, ABORt and the trigger model: ABORt returns to IDLE
        c.send("INIT");
        gate.awaitPointStarted();
        c.send("ABOR");
        assertEquals("1", c.send("*OPC?"));
        assertEquals("0", c.send("STAT:OPER:COND?"));
    }

    @Test
    void fetchWithoutACompletedMeasurementIsStale() {
        // SCPI-1999 Vol 2 §21.8.10: -230 Data corrupt or stale (FETCh? with no completed reading)
        assertEquals(null, c.send("FETC?"));
        assertEquals(List.of(-230), c.codes());
    }

    @Test
    void readReturnsRealAndImaginaryOhmsAsNr3() {
        c.close();
        Console ideal = new Console(new TestBench(100, 1e-3, 0, 0, 0),
                InstrumentOptions.defaults().withTiming(TimingModel.NONE), Sleeper.THREAD);
        String reply = ideal.send("READ?");
        assertTrue(reply.matches("[-+]?\\d\\.\\d+E[-+]\\d\\d,[-+]?\\d\\.\\d+E[-+]\\d\\d"), reply); // IEEE 488.2 §8.7.4
        double[] z = numbers(reply);
        assertEquals(100, z[0], 1e-12);
        assertEquals(2 * Math.PI * 1000 * 1e-3, z[1], 1e-12); // X = ωL, common practice, no source
        ideal.close();
    }

    @Test
    void aListSweepReturnsEveryPointInOrder() throws Exception {
        c.send("SIM:TIM NONE;:SOUR:LIST:FREQ 100,1000,10000;:SOUR:FREQ:MODE LIST");
        c.send("SOUR:LIST:VOLT 0.1,0.2,0.3");
        double[] z = numbers(c.send("READ?"));
        assertEquals(6, z.length);
        List<PointRequest> reqs = bench.requests();
        assertEquals(List.of(100.0, 1000.0, 10000.0), reqs.stream().map(PointRequest::frequencyHz).toList());
        assertEquals(List.of(0.1, 0.2, 0.3), reqs.stream().map(PointRequest::driveLevelRms).toList());
        for (int i = 0; i < 2; i++) {
            assertTrue(z[2 * i + 1] < z[2 * i + 3], "reactance rises with frequency, point by point in order");
        }
        c.send("SOUR:LIST:VOLT 0.1,0.2");
        c.send("READ?");
        assertEquals(List.of(-226), c.codes()); // SCPI-1999 Vol 2 §21.8.10: Lists not same length
    }

    @Test
    void aListThatTakesNoPartInTheSweepMayHaveAnotherLength() {
        // SCPI-1999 Vol 2 §21.8.10: -226 is for lists swept together; a bias list with the bias
        // off, or a voltage-level list under a current drive, is not swept
        c.send("SIM:TIM NONE;:SOUR:LIST:FREQ 100,1000,10000;:SOUR:LIST:VOLT:OFFS 1,2,3;:SOUR:FREQ:MODE LIST");
        c.send("SOUR:LIST:FREQ 100,200,300,400,500;:SOUR:LIST:VOLT 0.1,0.2,0.3,0.4,0.5");
        assertEquals(10, numbers(c.send("READ?")).length);
        c.send("SOUR:CURR 0.001;:SOUR:LIST:FREQ 100,200,300,400");
        assertEquals(8, numbers(c.send("READ?")).length);
        assertEquals(List.of(), c.codes());
        List<PointRequest> reqs = bench.requests();
        assertEquals(List.of(0.001, 0.001, 0.001, 0.001),
                reqs.subList(reqs.size() - 4, reqs.size()).stream().map(PointRequest::driveLevelRms).toList());
        c.send("SOUR:VOLT 1;:SOUR:LIST:VOLT 0.1;:SOUR:VOLT:OFFS:STAT ON");
        c.send("READ?");
        assertEquals(List.of(-226), c.codes()); // the 3-point bias list is swept now
    }

    @Test
    void real64RepliesAreDefiniteBlocksInEitherByteOrder() {
        // IEEE 488.2 §8.7.9 definite-length block; SCPI-1999 Vol 2 FORMat: NORMal big-endian, SWAPped little
        c.send("SIM:TIM NONE");
        double[] ascii = numbers(c.send("READ?"));
        c.send("FORM REAL,64");
        assertArrayEquals(ascii, block(c.raw("FETC?"), ByteOrder.BIG_ENDIAN));
        c.send("FORM:BORD SWAP");
        assertArrayEquals(ascii, block(c.raw("FETC?"), ByteOrder.LITTLE_ENDIAN));
    }

    private static double[] block(byte[] reply, ByteOrder order) {
        assertEquals('#', reply[0]);
        int digits = reply[1] - '0';
        int len = Integer.parseInt(new String(reply, 2, digits, StandardCharsets.US_ASCII));
        assertEquals(2 + digits + len + 1, reply.length);
        assertEquals('\n', reply[reply.length - 1]);
        ByteBuffer b = ByteBuffer.wrap(reply, 2 + digits, len).order(order);
        double[] out = new double[len / 8];
        for (int i = 0; i < out.length; i++) {
            out[i] = b.getDouble();
        }
        return out;
    }

    @Test
    void aReadingWithNoValueIsNotANumber() {
        // SCPI-1999 Vol 1 §7.2.1.5: NAN is 9.91E37
        c.send("SIM:TIM NONE;:IMP:RANG 1");
        assertEquals("9.91E+37,9.91E+37", c.send("READ?"));
        c.send("FORM REAL,64");
        assertArrayEquals(new double[] {9.91e37, 9.91e37}, block(c.raw("FETC?"), ByteOrder.BIG_ENDIAN));
    }

    @Test
    void aBusTriggerStartsAnInitiatedMeasurement() throws Exception {
        // SCPI-1999 Vol 2, TRIGger subsystem: BUS trigger is *TRG (IEEE 488.2-1992 §10.37); §21.8.10: -211 Trigger
        // ignored when not waiting, -214 Trigger deadlock for READ? with BUS
        c.send("SIM:TIM NONE;:TRIG:SOUR BUS");
        c.send("*TRG");
        c.send("READ?");
        c.send("INIT");
        assertEquals("32", c.send("STAT:OPER:COND?")); // SCPI-1999 Vol 2 §20: bit 5 waiting for TRIGger
        c.send("FETC?");
        assertEquals(List.of(-211, -214, -214), c.codes());
        c.send("*TRG");
        assertEquals(2, numbers(c.send("FETC?")).length);
        assertEquals(List.of(), c.codes());
    }

    @Test
    void theLevelSetLastIsTheDriveMode() {
        c.send("SIM:TIM NONE;:SOUR:VOLT 0.5;CURR 1MA;:READ?");
        PointRequest r = bench.requests().get(0);
        assertEquals(SourceKind.CURRENT, r.drive());
        assertEquals(1e-3, r.driveLevelRms(), 1e-18);
        c.send("SOUR:VOLT 0.2;:READ?");
        assertEquals(SourceKind.VOLTAGE, bench.requests().get(1).drive());
        assertEquals("1.0E-03", c.send("SOUR:CURR?"));
    }

    @Test
    void theBiasSourceIsVoltageOrCurrentAndSwitchingOneOnSwitchesTheOtherOff() {
        c.send("SIM:TIM NONE;:SOUR:VOLT:OFFS 2;OFFS:STAT ON;:READ?");
        PointRequest r = bench.requests().get(0);
        assertTrue(r.biasOn());
        assertEquals(SourceKind.VOLTAGE, r.bias());
        assertEquals(2, r.biasValue());
        c.send("SOUR:CURR:OFFS 0.05;OFFS:STAT ON;:READ?");
        r = bench.requests().get(1);
        assertEquals(SourceKind.CURRENT, r.bias());
        assertEquals(0.05, r.biasValue());
        assertEquals("0", c.send("SOUR:VOLT:OFFS:STAT?"));
        c.send("SOUR:VOLT:OFFS 41");
        assertEquals(List.of(-222), c.codes());
    }

    @Test
    void aListSweepsPointsDrawFromConsecutiveKeysAndARepeatedTriggerFromTheSame() {
        c.send("SIM:TIM NONE;:READ?;READ?");
        c.send(":SOUR:LIST:FREQ 100,200,300;:SOUR:FREQ:MODE LIST;:READ?");
        List<Long> keys = bench.requests().stream().map(PointRequest::noiseKey).toList();
        assertEquals(keys.get(0), keys.get(1)); // the same trigger right after itself
        assertEquals(keys.get(2) + 1, keys.get(3));
        assertEquals(keys.get(2) + 2, keys.get(4));
        assertTrue(!keys.get(0).equals(keys.get(2)));
    }

    @Test
    void aHeldRangeIsTheSmallestThatHoldsTheValue() {
        // SCPI-1999 Vol 2 §21.8 class introduction: rounding inside the range is not an error
        c.send("IMP:RANG 150");
        assertEquals(1000, c.number("IMP:RANG?"));
        assertEquals("0", c.send("IMP:RANG:AUTO?"));
        c.send("IMP:RANG 2E7");
        assertEquals(List.of(-222), c.codes());
    }

    @Test
    void openShortLoadCorrectionReturnsTheDeviceBehindALinearFixture() {
        // open/short/load is exact for any linear fixture (a bilinear map, fixed by three points) at an acquired frequency
        c.send("SIM:TIM NONE");
        c.send("CORR:STAT ON");
        assertEquals(List.of(-221), c.codes());
        for (String std : List.of("OPEN", "SHORT", "LOAD")) {
            c.send("SIM:FIXT " + std + ";:CORR:COLL " + std + ";*WAI");
        }
        c.send("SIM:FIXT DEV;:CORR:LOAD:RES 100;REAC 0;:CORR ON");
        double[] z = numbers(c.send("READ?"));
        assertEquals(100, z[0], 1e-7);
        assertEquals(2 * Math.PI * 1000 * 1e-3, z[1], 1e-9);
        c.send("CORR OFF");
        double[] raw = numbers(c.send("READ?"));
        assertTrue(Math.abs(raw[0] - 100) > 0.04, "the fixture shows without correction");
        assertEquals(List.of(), c.codes());
    }

    @Test
    void openShortCorrectionRemovesTheResidualsBetweenAcquiredFrequencies() {
        // series residual at the meter, stray across the device: exact Yo = 1/(Zo − Zs); residual R + jωL and stray jωC are linear in f
        c.send("SIM:TIM NONE");
        for (String std : List.of("OPEN", "SHORT")) {
            c.send("SIM:FIXT " + std + ";:CORR:COLL " + std + ";*WAI");
        }
        c.send("SIM:FIXT DEV;:SOUR:FREQ 12345;:CORR ON");
        double[] z = numbers(c.send("READ?"));
        assertEquals(100, z[0], 1e-7);
        assertEquals(2 * Math.PI * 12345 * 1e-3, z[1], 1e-7);
    }

    @Test
    void theVoltageRatioFunctionAsksTheBenchForARatio() {
        c.send("SIM:TIM NONE;:FUNC \"VOLT:RAT\";:READ?");
        assertTrue(bench.requests().get(0).voltageRatio());
    }
}
