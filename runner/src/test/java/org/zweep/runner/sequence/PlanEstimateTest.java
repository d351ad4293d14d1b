package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.plan.Plan;

class PlanEstimateTest {
    @TempDir
    Path dir;

    @Test
    void countsIntegrationAveragingOverheadRampsAndSettling() {
        Plan plan = SequenceTestFiles.load(dir, "{max_bias_voltage: 10 V, max_level_voltage: 1 V}",
                "{kind: capacitor, nominal: 1 µF}", """
                steps:
                  - name: s
                    frequency: [10 Hz, 1 kHz]
                    level: 1 V
                    averaging: 2
                    integration: 100 ms
                    bias: {values: [0 V, 10 V], ramp: 5 V/s, settle: 1 s}
                """);
        // no outside source: arithmetic from the sequence above, 0.01 s overhead per point as input, and our own
        // estimate rule (PlanEstimate: integration covers at least 2 periods).
        // by hand: 10 Hz needs 2 periods = 200 ms > 100 ms; per bias value 2·0.2 + 2·0.1 + 2·0.01 = 0.62 s;
        // bias 0 V → 10 V: 2 s ramp + 1 s settle; back to 0 V at the end: 2 s
        assertEquals(2 * 0.62 + 3.0 + 2.0, PlanEstimate.seconds(plan, 0.01), 1e-12);
    }

    @Test
    void formatsForPeople() {
        // our own display format; arithmetic from the inputs (185 s = 3 min 5 s, 3720 s = 1 h 2 min), no source
        assertEquals("42 s", PlanEstimate.format(42.4));
        assertEquals("3 min 5 s", PlanEstimate.format(185));
        assertEquals("1 h 2 min", PlanEstimate.format(3720));
    }
}
