package org.zweep.runner.verdict;

import java.util.List;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.plan.CheckLimit;

/**
 * The result of one check.
 *
 * @param limit the check
 * @param values the values judged (one per selected point with a value, or the one whole-sweep figure)
 * @param noValue how many selected points had no value (each counts as a failure)
 * @param verdict pass, fail, or not evaluated (a whole-sweep figure the run leaves to the analysis)
 * @param unit the unit of the values and limits
 * @param note why it failed or was not evaluated, for people; empty when there is nothing to say
 */
public record CheckOutcome(CheckLimit limit, List<Double> values, int noValue, Verdict verdict, Unit unit,
        String note) {

    /** How a check ended. */
    public enum Verdict {
        PASS("pass"), FAIL("fail"), NOT_EVALUATED("not evaluated");

        private final String word;

        Verdict(String word) {
            this.word = word;
        }

        /** {@code pass}, {@code fail} or {@code not evaluated}. */
        public String word() {
            return word;
        }
    }

    public CheckOutcome {
        values = List.copyOf(values);
    }

    /**
     * The verdict of a run with these outcomes: {@code none} without checks, {@code fail} when one
     * failed, {@code pass} otherwise (checks not evaluated do not count).
     */
    public static String verdictOf(List<CheckOutcome> outcomes) {
        if (outcomes.isEmpty()) {
            return "none";
        }
        return outcomes.stream().anyMatch(o -> o.verdict() == Verdict.FAIL) ? "fail" : "pass";
    }

    /** The check's name. */
    public String name() {
        return limit.name();
    }

    /** The parameter checked. */
    public String parameter() {
        return limit.parameter();
    }

    /** The step. */
    public String step() {
        return limit.step();
    }

    /** The selected frequency; NaN for whole-sweep figures. */
    public double frequencyHz() {
        return limit.frequencyHz();
    }

    /** The lowest passing value; NaN for none. */
    public double min() {
        return Double.isFinite(limit.min()) ? limit.min() : Double.NaN;
    }

    /** The highest passing value; NaN for none. */
    public double max() {
        return Double.isFinite(limit.max()) ? limit.max() : Double.NaN;
    }

    /** Whether it passed. */
    public boolean passed() {
        return verdict == Verdict.PASS;
    }

    /** {@code pass}, {@code fail} or {@code not evaluated}. */
    public String result() {
        return verdict.word();
    }

    /** The last value judged, or NaN. */
    public double lastValue() {
        return values.isEmpty() ? Double.NaN : values.get(values.size() - 1);
    }
}
