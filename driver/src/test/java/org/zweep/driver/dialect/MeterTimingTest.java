package org.zweep.driver.dialect;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.ImpedanceRange;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Interval;

class MeterTimingTest {
    private static final MeterTiming T = new MeterTiming(0.01, 2, 0.2, 0.1, 2);

    @Test
    void aPointIsOverheadPlusAveragesTimesTheLongerOfApertureAndTheMinimumPeriods() {
        MeasurementSetting s = MeasurementSetting.at(10).withAveragingCount(3).withIntegrationTimeS(0.1);
        // no outside source: our timing model; at 10 Hz two periods are 0.2 s > 0.1 s
        assertEquals(0.01 + 3 * 0.2, T.pointS(s, s), 1e-12);
        assertEquals(0.01 + 3 * 0.1, T.pointS(s.withFrequencyHz(1000), s), 1e-12);
    }

    @Test
    void aBiasOrRangeChangeAddsItsSettling() {
        MeasurementSetting off = MeasurementSetting.at(1000).withIntegrationTimeS(0.1);
        MeasurementSetting on = off.withBias(Bias.voltage(5));
        assertEquals(0.11 + 0.2, T.pointS(on, off), 1e-12);
        assertEquals(0.11 + 0.2, T.pointS(on, null), 1e-12); // a fresh meter has its bias off
        assertEquals(0.11, T.pointS(on, on), 1e-12);
        // off is off, whatever value is kept
        assertEquals(0.11, T.pointS(off.withBias(new Bias(Bias.OFF.mode(), 3, false)), off), 1e-12);
        assertEquals(0.11 + 0.1, T.pointS(off.withRange(ImpedanceRange.hold(1000)), off), 1e-12);
    }

    @Test
    void aSweepIsTheSumOfItsPointsAndAStandardTheSumOverItsGrid() {
        MeasurementSetting s = MeasurementSetting.at(1000).withIntegrationTimeS(0.1);
        assertEquals(3 * 0.11, T.sweepS(List.of(s, s.withFrequencyHz(2000), s.withFrequencyHz(3000)), s), 1e-12);
        // 100 Hz .. 10 kHz at 2 per decade: 5 points, each 0.01 + max(0.1, 2/f) (2/100 Hz = 0.02 s)
        assertEquals(5 * 0.11, T.correctionS(s, new Interval(100, 10_000)), 1e-12);
    }
}
