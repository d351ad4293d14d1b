package org.zweep.runner.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.CorrectionStyle;
import org.zweep.runner.compensation.CompensationWorkflow;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.TerminalConfiguration;
import org.zweep.runner.plan.FixturePlan;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.safety.Interruption;
import org.zweep.runner.safety.SafetyGuard;

/** Meter-side compensation acquires each standard where the meter's correction will apply it. */
class MeterSideCompensationTest {
    final FakeBench bench = new FakeBench();
    final FakeBench.Link link = bench.new Link();

    /** Three frequencies, open and short acquired by the meter. */
    static Plan plan() {
        Plan p = TestPlans.plan(List.of(TestPlans.step(0, 0, "sweep", "insert the part", BiasControl.NONE,
                new double[] {0}, 1000, 100_000, 1e6)), List.of());
        return p.toBuilder().fixture(new FixturePlan(TerminalConfiguration.FOUR_TERMINAL, CompensationMode.METER,
                List.of(CorrectionStandard.OPEN, CorrectionStandard.SHORT), null, Duration.ZERO, null)).build();
    }

    /** What the meter was told from the reset on: settings (frequency only), acquisitions, correction. */
    List<String> compensate() {
        Station st = new Station(link, new SafetyGuard(TestPlans.LIMITS), FixturePort.meter(link,
                (s, text) -> { }, line -> { }), bench.waiter(new Interruption()), new ReconnectPolicy(0.1, 1, 2, 10, 5),
                line -> { });
        st.start();
        bench.trace.clear();
        CompensationWorkflow.prepare(plan(), st, null, false, java.time.Clock.systemUTC(), line -> { });
        List<String> out = new ArrayList<>();
        for (String t : bench.trace) {
            out.add(t.startsWith("apply ") ? "at " + t.split(" ")[1] : t);
        }
        return out;
    }

    @Test
    void aMeterThatCorrectsWhereItAcquiredGetsEveryStandardAtEveryFrequencyOfThePlan() {
        bench.correctionStyle = CorrectionStyle.AT_ACQUIRED_FREQUENCY;
        assertEquals(List.of("correction false", "fixture OPEN", "at 1000.0", "acquire OPEN", "at 100000.0",
                "acquire OPEN", "at 1000000.0", "acquire OPEN", "fixture SHORT", "at 1000.0", "acquire SHORT",
                "at 100000.0", "acquire SHORT", "at 1000000.0", "acquire SHORT", "correction true"), compensate());
    }

    @Test
    void aMeterWhoseCorrectionCoversItsRangeAcquiresEachStandardOnceAtTheRunsFirstSetting() {
        assertEquals(List.of("correction false", "fixture OPEN", "at 1000.0", "acquire OPEN", "fixture SHORT",
                "at 1000.0", "acquire SHORT", "correction true"), compensate());
    }
}
