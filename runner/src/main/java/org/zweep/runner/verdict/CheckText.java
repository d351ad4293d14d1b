package org.zweep.runner.verdict;

import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.conformance.DecisionRule;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.text.Figures;
import org.zweep.runner.text.ParameterTable;

/**
 * A check's outcome in people's words, the same in {@code zweep run}, {@code zweep analyze}, the
 * report and the live view: the figure's label ({@code Cs}, {@code SRF}, {@code V2/V1}), which
 * points it judged ({@code 1 kHz, bias 0 A}) and the values with their units. Stateless.
 */
public final class CheckText {
    private CheckText() {
    }

    /**
     * The units of a step's DC bias and drive level, to show a check's {@code bias:} and
     * {@code level:} selection with them.
     *
     * @param bias volt or ampere ({@link Unit#NONE} when unknown)
     * @param level volt or ampere ({@link Unit#NONE} when unknown)
     */
    public record StepUnits(Unit bias, Unit level) {
        /** Units not known: the numbers are shown alone. */
        public static final StepUnits UNKNOWN = new StepUnits(Unit.NONE, Unit.NONE);
    }

    /**
     * The label of the figure a check judges: the parameter's ({@code Cs}, {@code D}, {@code SRF},
     * {@code V2/V1}), or {@code saturation current}/{@code saturation voltage}.
     */
    public static String label(CheckOutcome c) {
        if (CheckLimit.SATURATION.equals(c.parameter())) {
            return c.unit() == Unit.AMPERE ? "saturation current" : c.unit() == Unit.VOLT ? "saturation voltage"
                    : "saturation bias";
        }
        return ParameterTable.label(c.parameter());
    }

    /** Which points a check judges: {@code 100 kHz, bias 0 A}, {@code 100 kHz, 30 % drop}; empty for a whole sweep. */
    public static String selection(CheckOutcome c, StepUnits units) {
        CheckLimit.Selection s = c.limit().selection();
        List<String> parts = new ArrayList<>();
        if (!Double.isNaN(s.frequencyHz())) {
            parts.add(Figures.format(s.frequencyHz(), Unit.HERTZ));
        }
        if (!Double.isNaN(s.bias())) {
            parts.add("bias " + Figures.format(s.bias(), units.bias()));
        }
        if (!Double.isNaN(s.level())) {
            parts.add("level " + Figures.format(s.level(), units.level()));
        }
        if (!Double.isNaN(c.limit().dropPercent())) {
            parts.add(Figures.number(c.limit().dropPercent(), 4) + " % drop");
        }
        return String.join(", ", parts);
    }

    /** The value judged ({@code 102 nF}), the range of values judged ({@code 9.98 µH … 10.02 µH (3 points)}), or {@code no value}. */
    public static String value(CheckOutcome c) {
        if (c.values().isEmpty()) {
            return "no value";
        }
        if (c.values().size() == 1) {
            return Figures.format(c.values().get(0), c.unit());
        }
        double lo = c.values().stream().mapToDouble(Double::doubleValue).min().orElseThrow();
        double hi = c.values().stream().mapToDouble(Double::doubleValue).max().orElseThrow();
        return Figures.format(lo, c.unit()) + " … " + Figures.format(hi, c.unit()) + " (" + c.values().size()
                + " points)";
    }

    /**
     * One line for the terminal:
     * {@code check capacitance-1khz       Cs at 1 kHz in frequency-sweep = 102 nF: pass}, with the
     * decision rule, U and p in brackets when they were used and the note in parentheses.
     */
    public static String line(CheckOutcome c, StepUnits units) {
        CheckLimit l = c.limit();
        String where = selection(c, units);
        String rule = "";
        if (l.rule() != DecisionRule.SIMPLE || !Double.isNaN(c.expandedU())) {
            rule = " " + org.zweep.runner.conformance.Conformance.how(l.rule().text(), c.expandedU(), c.probability(),
                    c.unit());
        }
        return String.format(java.util.Locale.ROOT, "check %-22s %s%s in %s = %s: %s%s%s", l.name(), label(c),
                where.isEmpty() ? "" : " at " + where, l.step(), value(c), c.result(), rule,
                c.note().isEmpty() ? "" : " (" + c.note() + ")");
    }
}
