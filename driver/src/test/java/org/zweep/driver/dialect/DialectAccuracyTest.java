package org.zweep.driver.dialect;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.zweep.driver.uncertainty.MeterAccuracy;

class DialectAccuracyTest {

    private static final String TINY = """
            zweep-dialect 1
            [meter]
            name = tiny
            [capabilities]
            frequency = 10 .. 1e6 Hz
            voltage-level = 0.01 .. 1 V
            integration-time = 1e-3 .. 1 s
            [commands]
            identify = *IDN?
            reset = *RST
            measure = :READ?
            bias-off = :SOUR:VOLT:OFFS:STAT OFF
            frequency = :SOUR:FREQ {frequency}
            drive-voltage = :SOUR:VOLT {level}
            integration-time = :SENS:IMP:APER {seconds}
            """;

    @Test
    void anAccuracySectionIsReadIntoBands() {
        Dialect d = Dialect.parse("tiny.dialect", TINY + """
                [accuracy]
                distribution = normal-k2
                band-low  = 10 .. 1e5 Hz; 0.01 .. 1 V; 0.01 s; 0.05 %; 2e-3 ohm; 1e-9 S   # long integration
                band-fast = 10 .. 1e6 Hz; 0.01 .. 1 V; 0 s; 0.2 %; 1e-2 ohm; 1e-8 S; phase 0.1 deg
                """);
        MeterAccuracy a = d.accuracy().orElseThrow();
        assertEquals(MeterAccuracy.Distribution.NORMAL_K2, a.distribution());
        assertEquals(2, a.bands().size());
        MeterAccuracy.Band low = a.band(1e3, 0.5, false, 0.1).orElseThrow();
        assertEquals("low", low.name());
        assertEquals(0.0005, low.relative(), 1e-15);
        assertEquals(2e-3, low.shortOhm(), 0);
        assertEquals(1e-9, low.openS(), 0);
        assertTrue(Double.isNaN(low.phaseRad()));
        MeterAccuracy.Band fast = a.band(5e5, 0.5, false, 0.1).orElseThrow();
        assertEquals(Math.toRadians(0.1), fast.phaseRad(), 1e-15);
    }

    @Test
    void aDialectWithoutTheSectionStatesNoAccuracy() {
        assertTrue(Dialect.parse("tiny.dialect", TINY).accuracy().isEmpty());
    }
}
