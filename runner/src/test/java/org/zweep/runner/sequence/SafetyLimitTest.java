package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.plan.Plan;

/** The sequence's own safety limits refuse a step at load time, so nothing is ever sent. */
class SafetyLimitTest {
    @TempDir
    Path dir;

    private static final String PART = "{kind: inductor, nominal: 10 µH}";

    @Test
    void biasCurrentAboveTheLimitIsRefusedNamingTheStepAndTheValue() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> SequenceTestFiles.load(dir,
                "{max_bias_current: 3 A, max_level_voltage: 1 V}", PART, """
                steps:
                  - {name: warm-up, frequency: 100 kHz, level: 0.5 V}
                  - {name: saturation, frequency: 100 kHz, level: 0.5 V, bias: {start: 0 A, stop: 3.5 A, points: 8}}
                """));
        assertTrue(e.getMessage().endsWith(
                ":7:64: step 'saturation': DC bias 3.5 A exceeds safety max_bias_current 3 A"), e.getMessage());
    }

    @Test
    void aNegativeBiasCountsByItsMagnitude() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> SequenceTestFiles.load(dir,
                "{max_bias_voltage: 10 V, max_level_voltage: 1 V}", "{kind: capacitor, nominal: 1 µF}",
                "steps: [{name: reverse, frequency: 1 kHz, level: 1 V, bias: [-12 V, 0 V]}]\n"));
        // |−12 V| against the 10 V limit above
        assertTrue(e.getMessage().endsWith("step 'reverse': DC bias 12 V exceeds safety max_bias_voltage 10 V"),
                e.getMessage());
    }

    @Test
    void currentDriveAboveTheLimitIsRefused() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> SequenceTestFiles.load(dir,
                "{max_level_current: 10 mA}", PART, "steps: [{name: s, frequency: 1 kHz, level: 20 mA}]\n"));
        assertTrue(e.getMessage().endsWith("step 's': drive level 20 mA rms exceeds safety max_level_current 10 mA"),
                e.getMessage());
    }

    @Test
    void valuesExactlyAtTheLimitsAreAllowed() {
        Plan plan = SequenceTestFiles.load(dir, "{max_bias_current: 3 A, max_level_voltage: 0.5 V}", PART,
                "steps: [{name: s, frequency: 1 kHz, level: 0.5 V, bias: [0 A, 3 A]}]\n");
        assertEquals(3.0, plan.safety().maxBiasCurrentA(), 0.0);
        assertEquals(3.0, plan.points().get(1).setting().bias().value(), 0.0); // the input above
    }

    @Test
    void omittedLimitsAllowNoBiasAtAll() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> SequenceTestFiles.load(dir,
                "{max_level_voltage: 1 V}", "{kind: capacitor, nominal: 1 µF}",
                "steps: [{name: s, frequency: 1 kHz, level: 1 V, bias: 1 V}]\n"));
        // an omitted limit is 0 V: no bias allowed
        assertTrue(e.getMessage().endsWith("step 's': DC bias 1 V exceeds safety max_bias_voltage 0 V"),
                e.getMessage());
    }
}
