package org.zweep.runner.verdict;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.uncertainty.UncertainImpedance;
import org.zweep.runner.conformance.DecisionRule;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.results.PointRow;

/** Checks decide with their rule from each row's value and its uncertainty. */
class CheckDecisionRuleTest {
    private static final Instant T = Instant.parse("2024-05-01T10:00:00Z");

    /** A row of R = {@code r} with u(R) = {@code uR}. */
    private static PointRow row(int point, double r, double uR) {
        Impedance z = new Impedance(1000, r, -100);
        return PointRow.of(new PointRow.Key(point, "s", 0, 0), new PointRow.Conditions("impedance", "none", 1000,
                new PointRow.Source("V", 1), new PointRow.Source("V", 0)), true, r, -100,
                Double.isNaN(uR) ? null : new UncertainImpedance(z, uR, 0.1, 0), "", T);
    }

    @Test
    void aGuardedCheckNearItsLimitIsAConditionalPassAndTheRunDoesNotPass() {
        // the case made up in DecisionRuleTest (common practice, no source): 109.5 within 90..110 with U = 0.6
        CheckLimit c = new CheckLimit("r", "r_ohm", "s", 1000, 90, 110).withRule(DecisionRule.GUARDED);
        CheckEvaluator e = new CheckEvaluator(List.of(c));
        assertEquals("pass", e.judge(row(0, 100, 0.3)));
        assertEquals("conditional pass", e.judge(row(1, 109.5, 0.3)));
        CheckOutcome o = e.outcomes(SweepFigures.NONE).get(0);
        assertEquals(CheckOutcome.Verdict.CONDITIONAL_PASS, o.verdict());
        assertEquals(0.6, o.expandedU(), 1e-12);
        assertEquals(0.95221, o.probability(), 5e-6); // JCGM 106:2012, 7.3: Φ(1.6667) − Φ(−65)
        assertEquals("conditional pass", CheckOutcome.verdictOf(List.of(o)));
        assertTrue(CheckOutcome.failed("conditional pass"));
    }

    @Test
    void aCheckShowsTheConformanceProbabilityOfThePublishedBurstStrengthExample() {
        // The single-lower-limit example of PublishedExamplesTest (b = 509.7 kPa and 495.2 kPa,
        // u = 8.6 kPa, B ≥ 490 kPa; printed p_c 99 % and 73 %), here as R in ohms through a check
        // under "rule: probability 0.95", as a run judges and prints it.
        CheckLimit c = new CheckLimit("burst", "r_ohm", "s", 1000, 490, Double.POSITIVE_INFINITY)
                .withRule(DecisionRule.minimumProbability(0.95));
        CheckEvaluator accepted = new CheckEvaluator(List.of(c));
        assertEquals("pass", accepted.judge(row(0, 509.7, 8.6)));
        CheckOutcome o = accepted.outcomes(SweepFigures.NONE).get(0);
        assertEquals(0.99, o.probability(), 0.005); // printed: 99 %
        assertEquals("check burst                  R at 1 kHz in s = 509.7 Ω: pass [probability 0.95, U = 17 Ω, p = 0.989]",
                CheckText.line(o, CheckText.StepUnits.UNKNOWN));

        CheckEvaluator rejected = new CheckEvaluator(List.of(c));
        assertEquals("conditional pass", rejected.judge(row(0, 495.2, 8.6)));
        CheckOutcome r = rejected.outcomes(SweepFigures.NONE).get(0);
        assertEquals(0.73, r.probability(), 0.005); // printed: 73 %, "reject"
        assertTrue(CheckOutcome.failed(CheckOutcome.verdictOf(List.of(r))));
    }

    @Test
    void theSimpleRuleIgnoresTheUncertaintyButReportsIt() {
        CheckLimit c = new CheckLimit("r", "r_ohm", "s", 1000, 90, 110);
        CheckEvaluator e = new CheckEvaluator(List.of(c));
        assertEquals("pass", e.judge(row(0, 109.5, 0.3)));
        CheckOutcome o = e.outcomes(SweepFigures.NONE).get(0);
        assertEquals(CheckOutcome.Verdict.PASS, o.verdict());
        assertEquals(0.6, o.expandedU(), 1e-12);
    }

    @Test
    void aMinimumProbabilityRuleWithoutAStatedAccuracyProvesNothing() {
        CheckLimit c = new CheckLimit("r", "r_ohm", "s", 1000, 90, 110).withRule(DecisionRule.minimumProbability(0.95));
        CheckEvaluator e = new CheckEvaluator(List.of(c));
        assertEquals("conditional pass", e.judge(row(0, 100, Double.NaN)));
        assertEquals("conditional fail", e.judge(row(1, 120, Double.NaN)));
        assertEquals(CheckOutcome.Verdict.CONDITIONAL_FAIL, e.outcomes(SweepFigures.NONE).get(0).verdict());
    }
}
