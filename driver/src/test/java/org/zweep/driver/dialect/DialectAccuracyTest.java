package org.zweep.driver.dialect;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.zweep.driver.uncertainty.MeterAccuracy;

class DialectAccuracyTest {

    private static final String TINY = """
            format: zweep-dialect/2
            meter: {name: tiny}
            capabilities:
              frequency: 10 .. 1e6 Hz
              voltage-level: 0.01 .. 1 V
              integration-time: 1e-3 .. 1 s
            messages: {error-query-after: none}
            commands:
              identify: '*IDN?'
              measure: ':READ?'
              frequency: ':SOUR:FREQ {frequency}'
              drive-voltage: ':SOUR:VOLT {level}'
              integration-time: ':SENS:IMP:APER {seconds}'
            """;

    @Test
    void anAccuracySectionIsReadIntoBands() {
        Dialect d = Dialect.parse("tiny.yaml", TINY + """
                accuracy:
                  distribution: normal-k2
                  bands:
                    low: 10 .. 1e5 Hz; 0.01 .. 1 V; 0.01 s; 0.05 %; 2e-3 ohm; 1e-9 S   # long integration
                    fast: 10 .. 1e6 Hz; 0.01 .. 1 V; 0 s; 0.2 %; 1e-2 ohm; 1e-8 S; phase 0.1 deg
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
    void theReadmeExampleParsesAndGivesTheFiguresReadmeQuotes() throws java.io.IOException {
        String readme = java.nio.file.Files.readString(java.nio.file.Path.of("..", "README.md"));
        int start = readme.indexOf("```yaml\naccuracy:");
        assertTrue(start >= 0, "README has no [accuracy] example");
        start += "```yaml\n".length();
        Dialect d = Dialect.parse("readme", TINY + readme.substring(start, readme.indexOf("```", start)));
        MeterAccuracy a = d.accuracy().orElseThrow();
        org.zweep.driver.uncertainty.UncertainImpedance u = a.uncertainty(
                new org.zweep.driver.impedance.Impedance(1e3, 1000, 0), 1.0, false, 0.01).orElseThrow();
        // README: e = 0.101 %, u(|Z|) = 0.58 Ω, u(θ) = 0.033° (arithmetic of the made-up example)
        assertEquals(0.58, u.standardUncertainty(org.zweep.driver.impedance.DerivedParameter.Z), 0.005);
        assertEquals(0.033, u.standardUncertainty(org.zweep.driver.impedance.DerivedParameter.THETA), 0.0005);
        assertEquals(0.006, a.band(1e3, 1.0, false, 0.01).orElseThrow().magnitudeLimit(1.0), 1e-8);
    }

    @Test
    void aDialectWithoutTheSectionStatesNoAccuracy() {
        assertTrue(Dialect.parse("tiny.yaml", TINY).accuracy().isEmpty());
    }
}
