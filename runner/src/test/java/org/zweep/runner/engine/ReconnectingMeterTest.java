package org.zweep.runner.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.runner.plan.BiasControl;

/** The reconnecting decorator around a meter, on the in-test bench ({@link FakeBench}: a fake link, a virtual clock). */
class ReconnectingMeterTest {
    final FakeBench bench = new FakeBench();
    final FakeBench.Link link = bench.new Link();
    final List<String> notes = new ArrayList<>();
    ReconnectPolicy policy = new ReconnectPolicy(0.1, 1.0, 2.0, 10.0, 5);

    ReconnectingMeter meter() {
        return new ReconnectingMeter(link, policy, bench.waiter, notes::add);
    }

    /** The bench's trace from the first reconnect on. */
    List<String> afterReconnect() {
        int i = bench.trace.indexOf("reconnect");
        assertTrue(i >= 0, "no reconnect in " + bench.trace);
        return bench.trace.subList(i + 1, bench.trace.size());
    }

    @Test
    void reconnectRestoresLastSettingBeforeNextMeasurement() {
        ReconnectingMeter m = meter();
        MeasurementSetting tenK = MeasurementSetting.at(10_000);
        m.apply(tenK);
        bench.dropAtMeasure.add(1);
        Reading r = m.measure();
        assertEquals(10_000, r.setting().frequencyHz());
        // bias off at once (the meter cannot tell its bias), the setting again, then the measurement
        assertEquals(List.of("bias off", "apply 10000.0 1.0 0.0", "measure 10000.0 Hz"), afterReconnect());
        assertEquals(1, m.reconnects());
        assertTrue(notes.get(notes.size() - 1).startsWith("reconnected to fake:bench (attempt 1); bias is off,"
                + " repeating measuring at 10 kHz"), notes.toString());
    }

    @Test
    void thePointsDelayIsWaitedAgainBeforeARepeatedTrigger() {
        ReconnectingMeter m = meter();
        m.apply(MeasurementSetting.at(1000));
        bench.dropAtMeasure.add(1);
        Reading r = m.measure(0.3);
        // arithmetic from the inputs above: 0.1 s back-off, the setting again, then 0.3 s before the trigger
        double measuredS = (r.timestamp().getEpochSecond() - 1_700_000_000L) + r.timestamp().getNano() / 1e9;
        assertEquals(0.1 + 0.3 + 0.01, measuredS, 1e-9);
    }

    @Test
    void reconnectSwitchesTheMetersOwnCorrectionBackOnBeforeRepeatingTheCall() {
        ReconnectingMeter m = meter();
        m.setCorrectionEnabled(true);
        m.apply(MeasurementSetting.at(1000));
        bench.dropAtMeasure.add(1);
        m.measure();
        assertEquals(List.of("bias off", "correction true", "apply 1000.0 1.0 0.0", "measure 1000.0 Hz"),
                afterReconnect());
    }

    @Test
    void biasLostWithTheLinkIsRampedBackUpAtItsRateAndSettledBeforeTheRepeatedMeasurement() {
        ReconnectingMeter m = meter();
        m.rampControl(new BiasControl(1.0, 0.5)); // 1 V/s, 0.5 s settling
        m.apply(MeasurementSetting.at(1000).withBias(Bias.voltage(2.0)));
        bench.dropAtMeasure.add(1);
        double lostAtS = bench.nowS;
        Reading r = m.measure();
        assertEquals(2.0, r.setting().bias().value());
        List<FakeBench.BiasEvent> after = bench.biasHistory.stream().filter(e -> e.timeS() > lostAtS).toList();
        assertFalse(after.get(0).on(), "switched off first: " + after);
        for (int i = 1; i < after.size(); i++) {
            double dv = Math.abs(after.get(i).value() - after.get(i - 1).value());
            assertTrue(dv <= 1.0 * (after.get(i).timeS() - after.get(i - 1).timeS()) + 1.0 * Station.RAMP_STEP_S + 1e-9,
                    "step " + after.get(i - 1) + " -> " + after.get(i));
        }
        assertEquals(2.0, after.get(after.size() - 1).value());
        // arithmetic from the inputs above: off, then 0 -> 2 V at 1 V/s in 20 steps of 0.1 V (2 s), then 0.5 s settling
        assertEquals(21, after.size());
        double reached = after.get(after.size() - 1).timeS();
        double measuredS = (r.timestamp().getEpochSecond() - 1_700_000_000L) + r.timestamp().getNano() / 1e9;
        assertTrue(measuredS - reached >= 0.5 + 0.1 - 1e-6, "measured " + (measuredS - reached) + " s after 2 V");
    }

    @Test
    void biasTheMeterStillHoldsWhereItWasLeftIsKeptAndNotSwitchedOff() {
        bench.readsBias = true;
        ReconnectingMeter m = meter();
        m.apply(MeasurementSetting.at(1000).withBias(Bias.voltage(2.0)));
        bench.dropAtMeasure.add(1);
        m.measure();
        assertEquals(List.of("read bias", "apply 1000.0 1.0 2.0", "measure 1000.0 Hz bias 2.0"), afterReconnect());
        assertEquals(Bias.voltage(2.0), m.appliedBias());
        assertTrue(notes.stream().anyMatch(n -> n.contains("bias held at 2 V")), notes.toString());
    }

    @Test
    void anErrorTheMeterReportsIsNotRepeated() {
        ReconnectingMeter m = meter();
        m.apply(MeasurementSetting.at(1000));
        bench.meterErrorAtMeasure = 1;
        assertThrows(FakeBench.MeterError.class, m::measure);
        assertFalse(bench.trace.contains("reconnect"), bench.trace.toString());
    }

    @Test
    void givesUpWithLinkLostWhenTheReconnectBudgetIsSpent() {
        policy = new ReconnectPolicy(0.1, 1.0, 2.0, 10.0, 3);
        ReconnectingMeter m = meter();
        m.apply(MeasurementSetting.at(1000));
        bench.dropAtMeasure.add(1);
        bench.failingReconnects = 10;
        LinkLostException e = assertThrows(LinkLostException.class, m::measure);
        // arithmetic from the inputs above: waits 0.1 + 0.2 + 0.4 s
        assertTrue(e.getMessage().startsWith("lost the link to fake:bench while measuring at 1 kHz and could not"
                + " reconnect (3 attempts in 0.7 s since the last successful operation)"), e.getMessage());
    }

    @Test
    void theBudgetStartsAgainOnceACallSucceeds() {
        policy = new ReconnectPolicy(0.1, 1.0, 2.0, 10.0, 2);
        ReconnectingMeter m = meter();
        m.apply(MeasurementSetting.at(1000));
        bench.dropAtMeasure.addAll(List.of(1, 2, 4, 5)); // two lost links for each of two measurements
        m.measure();
        m.measure();
        assertEquals(4, m.reconnects());
    }

    @Test
    void theMetersOwnFixtureIsBroughtBackToWhatItHeldAfterAReconnect() {
        ReconnectingMeter m = meter();
        m.fixture().orElseThrow().hold(FixtureState.OPEN);
        m.apply(MeasurementSetting.at(1000));
        bench.dropAtMeasure.add(1);
        m.measure();
        assertEquals(List.of("bias off", "fixture OPEN", "apply 1000.0 1.0 0.0", "measure 1000.0 Hz"), afterReconnect());
    }

    @Test
    void biasOffAtOnceOpensOneNewConnectionWhenTheLinkIsDown() {
        policy = new ReconnectPolicy(0.1, 1.0, 2.0, 10.0, 1);
        ReconnectingMeter m = meter();
        m.apply(MeasurementSetting.at(1000).withBias(Bias.voltage(2.0)));
        bench.dropAtMeasure.add(1);
        bench.failingReconnects = 1;
        assertThrows(LinkLostException.class, m::measure);
        assertEquals(Bias.voltage(2.0), bench.instrumentBias, "the meter kept its bias while the link was down");
        assertTrue(m.biasOffAtOnce());
        assertEquals(Bias.OFF, bench.instrumentBias);
        assertEquals(Bias.OFF, m.appliedBias());
    }
}
