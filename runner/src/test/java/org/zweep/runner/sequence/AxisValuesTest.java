package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;

class AxisValuesTest {
    @TempDir
    Path dir;

    private List<Double> frequencies(String frequency) {
        Plan plan = SequenceTestFiles.load(dir, "{max_level_voltage: 1 V}", "{kind: capacitor, nominal: 1 nF}",
                "steps: [{name: s, frequency: " + frequency + ", level: 1 V}]\n");
        return plan.points().stream().map(p -> p.setting().frequencyHz()).toList();
    }

    @Test
    void logSweepWithPointsPerDecadeLandsOnDecadesAndIncludesBothEnds() {
        List<Double> f = frequencies("{start: 100 Hz, stop: 10 MHz, per_decade: 10}");
        assertEquals(51, f.size()); // 5 decades × 10 + 1, arithmetic
        assertEquals(100.0, f.get(0), 0.0);
        assertEquals(1000.0, f.get(10), 0.0); // 100 Hz × 10^(10/10)
        assertEquals(125.893, f.get(1), 1e-3); // 100 Hz × 10^(1/10) = 125.8925…, arithmetic
        assertEquals(1e7, f.get(50), 0.0);
    }

    @Test
    void logSweepEndingOffTheGridAppendsTheStop() {
        List<Double> f = frequencies("{start: 1 kHz, stop: 20 kHz, per_decade: 1}");
        assertEquals(List.of(1000.0, 10000.0, 20000.0), f); // decades, then the stop; arithmetic
    }

    @Test
    void linearSweepSpacesPointsEvenly() {
        List<Double> f = frequencies("{start: 1 kHz, stop: 2 kHz, points: 5}");
        assertEquals(List.of(1000.0, 1250.0, 1500.0, 1750.0, 2000.0), f); // steps of (2 − 1)/4 kHz, arithmetic
    }

    @Test
    void logSweepWithAPointCountSpacesPointsByEqualRatios() {
        List<Double> f = frequencies("{start: 10 Hz, stop: 1 kHz, points: 3, spacing: log}");
        assertEquals(List.of(10.0, 100.0, 1000.0), f); // ratio (1000/10)^(1/2) = 10, arithmetic
    }

    @Test
    void explicitListKeepsItsOrderAndUnitsPrefixes() {
        assertEquals(List.of(10e3, 1e3, 1.5e6), frequencies("[10 kHz, 1kHz, 1.5 MHz]")); // SI prefixes, from memory
    }

    @Test
    void statedOrderPutsFrequencyOutermost() {
        Plan plan = SequenceTestFiles.load(dir, "{max_level_voltage: 1 V, max_bias_voltage: 5 V}",
                "{kind: capacitor, nominal: 1 nF}", """
                steps:
                  - {name: s, frequency: [1 kHz, 2 kHz], level: 1 V, bias: [0 V, 5 V], order: [frequency, bias]}
                """);
        List<PlannedPoint> p = plan.points();
        assertEquals(List.of(1000.0, 1000.0, 2000.0, 2000.0), p.stream().map(x -> x.setting().frequencyHz()).toList());
        assertEquals(List.of(0.0, 5.0, 0.0, 5.0), p.stream().map(x -> x.setting().bias().value()).toList());
    }

    @Test
    void levelsInAmperesMakeACurrentDrive() {
        Plan plan = SequenceTestFiles.load(dir, "{max_level_current: 20 mA}", "{kind: inductor, nominal: 1 mH}",
                "steps: [{name: s, frequency: 1 kHz, level: [1 mA, 10 mA]}]\n");
        assertEquals(org.zweep.driver.meter.SourceMode.CURRENT, plan.points().get(0).setting().drive().mode());
        assertEquals(0.01, plan.points().get(1).setting().drive().levelRms(), 0.0); // 10 mA, SI prefix m, from memory
    }
}
