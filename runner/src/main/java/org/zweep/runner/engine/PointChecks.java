package org.zweep.runner.engine;

import java.util.ArrayList;
import java.util.List;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.results.PointRow;

/**
 * The point checks of a run (a limit on a derived parameter at one step and frequency), evaluated
 * row by row and summed up per check. Whole-sweep checks such as {@code srf_hz} (no frequency)
 * are not evaluated here; see {@link #wholeSweep()}. Not thread-safe.
 */
public final class PointChecks {
    /** Relative tolerance when matching a row's frequency to a check's. */
    static final double FREQUENCY_TOLERANCE = 1e-6;

    private final List<Tally> point = new ArrayList<>();
    private final List<CheckLimit> whole = new ArrayList<>();

    /**
     * The outcome of one point check so far.
     *
     * @param limit the check
     * @param rows how many rows it applied to
     * @param failures how many of them failed
     * @param lastValue the value in the last row it applied to ({@code NaN} when none)
     */
    public record Outcome(CheckLimit limit, int rows, int failures, double lastValue) {
        /** {@code pass} when it applied and never failed, {@code fail} when it failed, {@code not measured} otherwise. */
        public String verdict() {
            return rows == 0 ? "not measured" : failures == 0 ? "pass" : "fail";
        }
    }

    private static final class Tally {
        final CheckLimit limit;
        int rows;
        int failures;
        double last = Double.NaN;

        Tally(CheckLimit limit) {
            this.limit = limit;
        }
    }

    /** The point checks among {@code checks}. */
    public PointChecks(List<CheckLimit> checks) {
        for (CheckLimit c : checks) {
            if (Double.isNaN(c.frequencyHz())) {
                whole.add(c);
            } else {
                point.add(new Tally(c));
            }
        }
    }

    /**
     * Evaluates every point check that applies to {@code row} and counts the result.
     *
     * @return {@code ""} when none applies, else {@code pass} or {@code fail} ({@code fail} when any fails)
     */
    public String evaluate(PointRow row) {
        String outcome = "";
        for (Tally t : point) {
            if (!t.limit.step().equals(row.step()) || !sameFrequency(t.limit.frequencyHz(), row.frequencyHz())) {
                continue;
            }
            double v = row.value(t.limit.parameter());
            boolean ok = "ok".equals(row.status()) && t.limit.passes(v);
            t.rows++;
            t.last = v;
            if (!ok) {
                t.failures++;
                outcome = "fail";
            } else if (outcome.isEmpty()) {
                outcome = "pass";
            }
        }
        return outcome;
    }

    /** The outcome of every point check so far, in sequence order. */
    public List<Outcome> outcomes() {
        return point.stream().map(t -> new Outcome(t.limit, t.rows, t.failures, t.last)).toList();
    }

    /** The whole-sweep checks (for example {@code srf_hz}), left to the analysis. */
    public List<CheckLimit> wholeSweep() {
        return List.copyOf(whole);
    }

    /** Whether every point check applied at least once and none failed. */
    public boolean allPassed() {
        return point.stream().allMatch(t -> t.rows > 0 && t.failures == 0);
    }

    private static boolean sameFrequency(double a, double b) {
        return Math.abs(a - b) <= FREQUENCY_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
    }
}
