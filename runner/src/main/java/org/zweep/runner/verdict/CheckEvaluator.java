package org.zweep.runner.verdict;

import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.results.Derived;
import org.zweep.runner.results.PointRow;

/**
 * The one check evaluator. Point checks judge every selected row as it comes ({@link #judge}),
 * whole-sweep checks take their figure from a {@link SweepFigures} at the end ({@link #outcomes}).
 *
 * <p>The rules: a check selects the rows of its step whose frequency, bias and level match its
 * selection within {@link #RELATIVE_TOLERANCE} (a selection left open matches any value); a
 * selected row passes when its value lies within the bounds, limits included; a selected row
 * without a value (the meter gave none, or the parameter does not apply) fails; a point check that
 * selects no row fails. Each planned point is judged once (a second row of the same point, as left
 * by an interrupted list sweep, is judged but not counted again). Not thread-safe.
 */
public final class CheckEvaluator {
    /** Relative tolerance when matching a row's frequency, bias or level to a check's. */
    public static final double RELATIVE_TOLERANCE = 1e-6;

    private final List<CheckLimit> checks;
    private final List<Tally> tallies = new ArrayList<>();
    private final BitSet counted = new BitSet();

    private static final class Tally {
        final CheckLimit limit;
        final List<Double> values = new ArrayList<>();
        int rows;
        int failures;
        int noValue;

        Tally(CheckLimit limit) {
            this.limit = limit;
        }
    }

    /** An evaluator of {@code checks}, in their order. */
    public CheckEvaluator(List<CheckLimit> checks) {
        this.checks = List.copyOf(checks);
        for (CheckLimit c : this.checks) {
            tallies.add(c.wholeSweep() ? null : new Tally(c));
        }
    }

    /** Whether {@code check} (a point check) selects {@code row}. */
    public static boolean selects(CheckLimit check, PointRow row) {
        CheckLimit.Selection s = check.selection();
        return check.step().equals(row.step()) && sameValue(s.frequencyHz(), row.frequencyHz())
                && sameValue(s.bias(), row.bias()) && sameValue(s.level(), row.level());
    }

    /** Whether {@code row} has a value for {@code check} and it lies within the bounds. */
    public static boolean passes(CheckLimit check, PointRow row) {
        return row.ok() && check.passes(row.value(check.parameter()));
    }

    /**
     * Judges {@code row} by every point check that selects it and counts the result (once per
     * planned point).
     *
     * @return {@code ""} when no check selects it, else {@code pass} or {@code fail} ({@code fail} when any fails)
     */
    public String judge(PointRow row) {
        boolean count = !counted.get(row.point());
        counted.set(row.point());
        String outcome = "";
        for (Tally t : tallies) {
            if (t == null || !selects(t.limit, row)) {
                continue;
            }
            double v = row.ok() ? row.value(t.limit.parameter()) : Double.NaN;
            boolean ok = passes(t.limit, row);
            if (count) {
                t.rows++;
                if (Double.isNaN(v)) {
                    t.noValue++;
                } else {
                    t.values.add(v);
                }
                if (!ok) {
                    t.failures++;
                }
            }
            if (!ok) {
                outcome = "fail";
            } else if (outcome.isEmpty()) {
                outcome = "pass";
            }
        }
        return outcome;
    }

    /** The outcome of every check, in order; whole-sweep checks take their figure from {@code figures}. */
    public List<CheckOutcome> outcomes(SweepFigures figures) {
        List<CheckOutcome> out = new ArrayList<>();
        for (int i = 0; i < checks.size(); i++) {
            CheckLimit c = checks.get(i);
            Tally t = tallies.get(i);
            out.add(t == null ? sweepOutcome(c, figures.figure(c)) : pointOutcome(t));
        }
        return out;
    }

    private static CheckOutcome pointOutcome(Tally t) {
        if (t.rows == 0) {
            return new CheckOutcome(t.limit, List.of(), 0, CheckOutcome.Verdict.FAIL, unitOf(t.limit.parameter()),
                    "no measured point selected");
        }
        String note = t.noValue == 0 ? "" : t.noValue + " of " + t.rows + " selected point(s) without a value";
        return new CheckOutcome(t.limit, t.values, t.noValue,
                t.failures == 0 ? CheckOutcome.Verdict.PASS : CheckOutcome.Verdict.FAIL, unitOf(t.limit.parameter()),
                note);
    }

    private static CheckOutcome sweepOutcome(CheckLimit c, SweepFigures.Figure f) {
        if (f == null) {
            return new CheckOutcome(c, List.of(), 0, CheckOutcome.Verdict.NOT_EVALUATED, unitOf(c.parameter()),
                    "not evaluated by the run (zweep analyze evaluates it)");
        }
        if (Double.isNaN(f.value())) {
            return new CheckOutcome(c, List.of(), 1, CheckOutcome.Verdict.FAIL, f.unit(),
                    f.note().isEmpty() ? c.parameter() + " not resolved by the data" : f.note());
        }
        return new CheckOutcome(c, List.of(f.value()), 0,
                c.passes(f.value()) ? CheckOutcome.Verdict.PASS : CheckOutcome.Verdict.FAIL, f.unit(), f.note());
    }

    /** The unit of a point parameter (or of {@code srf_hz}); {@link Unit#NONE} for one without. */
    static Unit unitOf(String parameter) {
        if (CheckLimit.SRF.equals(parameter)) {
            return Unit.HERTZ;
        }
        DerivedParameter p = Derived.parameter(parameter);
        return p == null ? Unit.NONE : p.unit();
    }

    /**
     * Whether {@code actual} matches {@code wanted} within {@link #RELATIVE_TOLERANCE}; a
     * {@code NaN} wanted (a selection left open) matches anything.
     */
    public static boolean sameValue(double wanted, double actual) {
        return Double.isNaN(wanted)
                || Math.abs(wanted - actual) <= RELATIVE_TOLERANCE * Math.max(Math.abs(wanted), Math.abs(actual));
    }
}
