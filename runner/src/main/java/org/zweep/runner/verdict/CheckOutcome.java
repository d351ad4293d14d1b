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
 * @param expandedU the expanded uncertainty U (k = 2) of the value that decided the outcome (the
 *     worst-judged one); NaN when unknown
 * @param probability that value's probability of conformance (JCGM 106:2012, normal model); NaN when unknown
 */
public record CheckOutcome(CheckLimit limit, List<Double> values, int noValue, Verdict verdict, Unit unit,
        String note, double expandedU, double probability) {

    /** Without uncertainty. */
    public CheckOutcome(CheckLimit limit, List<Double> values, int noValue, Verdict verdict, Unit unit, String note) {
        this(limit, values, noValue, verdict, unit, note, Double.NaN, Double.NaN);
    }

    /**
     * How a check ended, from best to worst: the two conditional outcomes say that the value lies
     * inside (or outside) the limits but its uncertainty does not prove it (ILAC-G8:09/2019).
     */
    public enum Verdict {
        PASS("pass"), CONDITIONAL_PASS("conditional pass"), CONDITIONAL_FAIL("conditional fail"), FAIL("fail"),
        NOT_EVALUATED("not evaluated");

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

    /** The verdict of a decision. */
    public static Verdict of(org.zweep.runner.conformance.Decision d) {
        return switch (d) {
            case PASS -> Verdict.PASS;
            case CONDITIONAL_PASS -> Verdict.CONDITIONAL_PASS;
            case CONDITIONAL_FAIL -> Verdict.CONDITIONAL_FAIL;
            case FAIL -> Verdict.FAIL;
        };
    }

    /**
     * The verdict of a run with these outcomes: {@code none} without checks, else the worst outcome
     * of those evaluated ({@code pass}, {@code conditional pass}, {@code conditional fail} or
     * {@code fail}); {@code pass} when none was evaluated.
     */
    public static String verdictOf(List<CheckOutcome> outcomes) {
        if (outcomes.isEmpty()) {
            return "none";
        }
        Verdict worst = Verdict.PASS;
        for (CheckOutcome o : outcomes) {
            if (o.verdict() != Verdict.NOT_EVALUATED && o.verdict().ordinal() > worst.ordinal()) {
                worst = o.verdict();
            }
        }
        return worst.word();
    }

    /**
     * Whether a run or analysis verdict counts as failed for the exit code: anything but
     * {@code pass} and {@code none} (a conditional pass is not a proven pass).
     */
    public static boolean failed(String verdict) {
        return !"pass".equals(verdict) && !"none".equals(verdict);
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
