package org.zweep.runner.safety;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

class BiasRampTest {

    @Test
    void aRampIsEqualStepsNoFasterThanTheRateEndingExactlyAtTheTarget() {
        // arithmetic from the inputs: 25 V at 2 V/s is 12.5 s, so 125 steps of 0.2 V held 0.1 s each
        List<BiasRamp.Step> steps = BiasRamp.plan(0.0, 25.0, 2.0, 0.1);
        assertEquals(125, steps.size());
        assertEquals(25.0, steps.get(124).value(), 0.0);
        double prev = 0.0;
        double total = 0.0;
        for (BiasRamp.Step s : steps) {
            assertTrue(Math.abs(s.value() - prev) <= 2.0 * s.waitS() + 1e-12, s.toString());
            prev = s.value();
            total += s.waitS();
        }
        assertEquals(12.5, total, 1e-9);
        assertEquals(12.5, BiasRamp.durationS(0, 25, 2), 1e-12);
    }

    @Test
    void downwardAndNegativeRampsAreStepsTheOtherWay() {
        // arithmetic: 4 A down to 0 at 0.5 A/s is 8 s in 80 steps of 0.05 A
        List<BiasRamp.Step> steps = BiasRamp.plan(4.0, 0.0, 0.5, 0.1);
        assertEquals(80, steps.size());
        assertEquals(3.95, steps.get(0).value(), 1e-12);
        assertEquals(0.0, steps.get(79).value(), 0.0);
        List<BiasRamp.Step> neg = BiasRamp.plan(-1.0, 0.0, 10.0, 0.1);
        assertEquals(1, neg.size()); // 0.1 s in one step
        assertEquals(new BiasRamp.Step(0.0, 0.1), neg.get(0));
    }

    @Test
    void noChangeIsNoStepAndNoLimitIsOneStepWithoutAWait() {
        assertEquals(List.of(), BiasRamp.plan(2.0, 2.0, 1.0, 0.1));
        assertEquals(List.of(new BiasRamp.Step(5.0, 0.0)), BiasRamp.plan(0.0, 5.0, Double.POSITIVE_INFINITY, 0.1));
        assertEquals(0.0, BiasRamp.durationS(0, 5, Double.POSITIVE_INFINITY));
    }

    @Test
    void aShortRampStillTakesItsFullTimeInOneStep() {
        // arithmetic: 0.05 V at 1 V/s is 0.05 s, one step
        assertEquals(List.of(new BiasRamp.Step(0.05, 0.05)), BiasRamp.plan(0.0, 0.05, 1.0, 0.1));
    }
}
