package org.zweep.runner.safety;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;

import org.junit.jupiter.api.Test;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.Drive;
import org.zweep.driver.meter.MeasurementSetting;

class BiasGuardFeedTest {

    @Test
    void theGuardReadsBackTheSettingAndRampTheRunSent() {
        MeasurementSetting s = MeasurementSetting.at(100e3).withDrive(Drive.voltage(0.5)).withBias(Bias.current(2.35));
        BiasGuardMain.Last last = BiasGuardMain.Last.parse(BiasGuard.line(s, 0.5));
        assertEquals(s, last.setting(2.35));
        assertEquals(0.5, last.rampPerS());
        assertEquals(2.35, last.value());
    }

    @Test
    void noRampLimitAndBiasOffTravelToo() {
        MeasurementSetting s = MeasurementSetting.at(1e3).withDrive(Drive.current(0.01)).withBias(Bias.voltage(-3));
        assertEquals(Double.POSITIVE_INFINITY, BiasGuardMain.Last.parse(BiasGuard.line(s, Double.POSITIVE_INFINITY))
                .rampPerS());
        assertFalse(BiasGuardMain.Last.parse(BiasGuard.line(s.withBias(Bias.OFF), 1.0)).on());
    }

    @Test
    void aLineCutShortByTheRunsDeathIsIgnored() {
        assertNull(BiasGuardMain.Last.parse("on V 12.5 2.0 1000.0 V"));
        assertNull(BiasGuardMain.Last.parse("on V 12.x 2.0 1000.0 V 0.5"));
    }
}
