package org.zweep.runner.verdict;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.time.Instant;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.results.PointRow;

/** The one evaluator's rules: selection, rows without a value, each point judged once. */
class CheckEvaluatorTest {
    private static final Instant T = Instant.parse("2024-05-01T10:00:00Z");

    static PointRow row(int point, double frequencyHz, double bias, double level, boolean ok, double r, double x) {
        return PointRow.of(new PointRow.Key(point, "s", 0, 0), new PointRow.Conditions("impedance", "none",
                frequencyHz, new PointRow.Source("V", level), new PointRow.Source("A", bias)), ok, r, x, "", T);
    }

    @Test
    void aSelectedRowWithoutAValueFailsTheCheckAndIsCounted() {
        CheckLimit c = new CheckLimit("r", "r_ohm", "s", 1000, 0, 10);
        CheckEvaluator e = new CheckEvaluator(List.of(c));
        assertEquals("pass", e.judge(row(0, 1000, 0, 1, true, 5, 1)));
        assertEquals("fail", e.judge(row(1, 1000, 0, 1, false, Double.NaN, Double.NaN)));
        CheckOutcome o = e.outcomes(SweepFigures.NONE).get(0);
        assertEquals(CheckOutcome.Verdict.FAIL, o.verdict());
        assertEquals(1, o.noValue());
        assertEquals(List.of(5.0), o.values());
    }

    @Test
    void biasAndLevelSelectOnlyTheirPoints() {
        CheckLimit atZero = new CheckLimit("r0", "r_ohm", "s", new CheckLimit.Selection(1000, 0, Double.NaN),
                new CheckLimit.Bounds(0, 10), Double.NaN);
        CheckEvaluator e = new CheckEvaluator(List.of(atZero));
        assertEquals("pass", e.judge(row(0, 1000, 0, 1, true, 5, 1)));
        assertEquals("", e.judge(row(1, 1000, 2, 1, true, 50, 1))); // a saturated point is not selected
        assertEquals(CheckOutcome.Verdict.PASS, e.outcomes(SweepFigures.NONE).get(0).verdict());
    }

    @Test
    void frequencyMatchesWithinOnePartPerMillionOnly() {
        CheckEvaluator e = new CheckEvaluator(List.of(new CheckLimit("r", "r_ohm", "s", 1000, 0, 10)));
        assertEquals("pass", e.judge(row(0, 1000.0005, 0, 1, true, 5, 1)));
        assertEquals("", e.judge(row(1, 1000.01, 0, 1, true, 50, 1)));
    }

    @Test
    void aPointReadTwiceIsCountedOnce() {
        CheckEvaluator e = new CheckEvaluator(List.of(new CheckLimit("r", "r_ohm", "s", 1000, 0, 10)));
        e.judge(row(0, 1000, 0, 1, true, 5, 1));
        e.judge(row(0, 1000, 0, 1, true, 5, 1));
        assertEquals(1, e.outcomes(SweepFigures.NONE).get(0).values().size());
    }

    @Test
    void aPointCheckThatSelectsNothingFailsAndAWholeSweepCheckWithoutFiguresIsNotEvaluated() {
        CheckEvaluator e = new CheckEvaluator(List.of(new CheckLimit("r", "r_ohm", "s", 1000, 0, 10),
                new CheckLimit("srf", CheckLimit.SRF, "s", Double.NaN, 1e6, Double.POSITIVE_INFINITY)));
        List<CheckOutcome> o = e.outcomes(SweepFigures.NONE);
        assertEquals(CheckOutcome.Verdict.FAIL, o.get(0).verdict());
        assertEquals(CheckOutcome.Verdict.NOT_EVALUATED, o.get(1).verdict());
        assertEquals("fail", CheckOutcome.verdictOf(o));
    }
}
