package org.zweep.runner.verdict;

import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.conformance.Conformance;
import org.zweep.runner.conformance.Decision;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.results.Derived;
import org.zweep.runner.results.PointRow;

/**
 * The one check evaluator. Point checks judge every selected row as it comes ({@link #judge}),
 * whole-sweep checks take their figure from a {@link SweepFigures} at the end ({@link #outcomes}).
 *
 * <p>The rules: a check selects the rows of its step whose frequency, bias and level match its
 * selection within {@link #RELATIVE_TOLERANCE} (a selection left open matches any value); a
 * selected row is decided by the check's decision rule from its value and standard uncertainty
 * ({@code simple}: passes when its value lies within the bounds, limits included); a selected row
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
        /** The worst conformance judged so far (null before the first). */
        Conformance worst;

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
     * The decision {@code check}'s rule makes for {@code row}'s value with its standard uncertainty
     * (unknown when the row has none for the parameter); a row without a value fails.
     */
    public static Conformance decide(CheckLimit check, PointRow row) {
        double v = row.ok() ? row.value(check.parameter()) : Double.NaN;
        double u = row.ok() ? row.uncertainty().of(check.parameter()) : Double.NaN;
        return check.rule().decide(v, u, check.min(), check.max());
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
        Decision worst = Decision.PASS;
        for (Tally t : tallies) {
            if (t == null || !selects(t.limit, row)) {
                continue;
            }
            double v = row.ok() ? row.value(t.limit.parameter()) : Double.NaN;
            Conformance c = decide(t.limit, row);
            if (count) {
                t.rows++;
                if (Double.isNaN(v)) {
                    t.noValue++;
                } else {
                    t.values.add(v);
                }
                if (c.decision() != Decision.PASS) {
                    t.failures++;
                }
                if (t.worst == null || c.decision().ordinal() > t.worst.decision().ordinal()) {
                    t.worst = c;
                }
            }
            if (outcome.isEmpty() || c.decision().ordinal() > worst.ordinal()) {
                worst = c.decision();
                outcome = worst.word();
            }
        }
        return outcome;
    }

    /** Whether any check is judged on a whole-sweep figure (so the run's figures must be found first). */
    public boolean needsSweepFigures() {
        return tallies.contains(null);
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
        return new CheckOutcome(t.limit, t.values, t.noValue, CheckOutcome.of(t.worst.decision()),
                unitOf(t.limit.parameter()), note, t.worst.expandedU(), t.worst.probability());
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
        Conformance d = c.rule().decide(f.value(), f.standardU(), c.min(), c.max());
        return new CheckOutcome(c, List.of(f.value()), 0, CheckOutcome.of(d.decision()), f.unit(), f.note(),
                d.expandedU(), d.probability());
    }

    /** The unit of a point parameter (or of {@code srf_hz}); {@link Unit#NONE} for one without. */
    static Unit unitOf(String parameter) {
        return org.zweep.runner.text.ParameterTable.unit(parameter);
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
