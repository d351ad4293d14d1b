package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.meter.SourceMode;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;

class PlanOrderingTest {
    @TempDir
    Path dir;

    @BeforeEach
    void bench() throws IOException {
        Files.writeString(dir.resolve("b.bench.yaml"), "# placeholder bench for loader tests\n");
    }

    private Plan load(String steps) {
        String text = """
                format: zweep-sequence/1
                meter: {bench: b.bench.yaml}
                safety: {max_bias_voltage: 25 V, max_level_voltage: 1 V}
                part: {kind: capacitor, nominal: 100 nF, tolerance: K}
                steps:
                """ + steps;
        return SequenceLoader.parse(text, dir.resolve("s.yaml"));
    }

    @Test
    void biasIsOutermostByDefaultSoEachBiasValueIsSetOnce() {
        Plan plan = load("""
                  - name: derating
                    frequency: [1 kHz, 10 kHz]
                    level: 0.5 V
                    bias: {start: 0 V, stop: 20 V, points: 3, ramp: 1 V/s, settle: 2 s}
                """);
        List<PlannedPoint> pts = plan.points();
        assertEquals(6, pts.size());
        // bias 0, 0, 10, 10, 20, 20 with frequency turning fastest
        double[] bias = {0, 0, 10, 10, 20, 20};
        double[] freq = {1e3, 1e4, 1e3, 1e4, 1e3, 1e4};
        for (int i = 0; i < 6; i++) {
            assertEquals(i, pts.get(i).index());
            assertEquals(bias[i], pts.get(i).setting().bias().value(), 0.0);
            assertEquals(SourceMode.VOLTAGE, pts.get(i).setting().bias().mode());
            assertEquals(freq[i], pts.get(i).setting().frequencyHz(), 0.0);
        }
        assertEquals(1.0, plan.steps().get(0).bias().rampPerS(), 0.0);
        assertEquals(2.0, plan.steps().get(0).bias().settleS(), 0.0);
    }

    @Test
    void indicesRunOnAcrossStepsAndRepeatsNestInsideBias() {
        Plan plan = load("""
                  - name: first
                    frequency: 1 kHz
                    level: 1 V
                  - name: second
                    frequency: [100 Hz, 1 kHz]
                    level: 1 V
                    bias: [0 V, 5 V]
                    repeats: 2
                """);
        List<PlannedPoint> pts = plan.points();
        assertEquals(1 + 2 * 2 * 2, pts.size());
        for (int i = 0; i < pts.size(); i++) {
            assertEquals(i, pts.get(i).index());
        }
        assertEquals(0, pts.get(0).stepIndex());
        // second step: bias outermost, then repeat, then frequency
        int[] repeat = {0, 0, 1, 1, 0, 0, 1, 1};
        double[] bias = {0, 0, 0, 0, 5, 5, 5, 5};
        for (int i = 0; i < 8; i++) {
            PlannedPoint p = pts.get(i + 1);
            assertEquals(1, p.stepIndex());
            assertEquals(repeat[i], p.repeat());
            assertEquals(bias[i], p.setting().bias().value(), 0.0);
        }
        assertTrue(plan.steps().get(1).points().get(0).setting().bias().on());
    }
}
