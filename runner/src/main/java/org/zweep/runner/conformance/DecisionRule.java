package org.zweep.runner.conformance;

import java.util.Locale;
import org.apache.commons.math3.special.Erf;
import org.zweep.driver.InvalidInputException;

/**
 * How a check turns a value with its uncertainty into a {@link Decision}, for the tolerance
 * interval [min, max] (either end may be infinite for a one-sided limit; both are included).
 *
 * <ul>
 *   <li>{@code simple}: pass when the value lies within the limits, else fail; the uncertainty is
 *       not used (ILAC-G8:09/2019, 4.2.1, "simple acceptance": the risk of a false pass reaches
 *       50 % at a limit).</li>
 *   <li>{@code guarded}: the guard band is w = U (k = 2). Pass when value ± U lies within the
 *       limits, fail when it lies wholly outside them, otherwise conditional pass (value inside)
 *       or conditional fail (value outside) (ILAC-G8:09/2019, 4.2.2; the zones of ISO 14253-1).
 *       An unknown uncertainty proves nothing: the decision is conditional.</li>
 *   <li>{@code probability p}: pass when the probability of conformance p_c ≥ p, fail when
 *       p_c ≤ 1 − p, otherwise conditional as above (JCGM 106:2012, 7.3 and 8.3). p_c is computed
 *       for a normal distribution of the measurand centred on the value with standard
 *       uncertainty u.</li>
 * </ul>
 *
 * <p>Immutable and thread-safe.
 */
public sealed interface DecisionRule {

    /** Simple acceptance. */
    DecisionRule SIMPLE = new Simple();

    /** Guarded acceptance with w = U. */
    DecisionRule GUARDED = new Guarded();

    /**
     * The decision for {@code value} with standard uncertainty {@code standardU} (NaN when
     * unknown; 0 for an exact value) against [min, max]. A NaN value always fails.
     */
    Conformance decide(double value, double standardU, double min, double max);

    /** The rule as written in a sequence file. */
    String text();

    /** A minimum probability of conformance {@code p}, from 0.5 (exclusive) to 1 (exclusive). */
    static DecisionRule minimumProbability(double p) {
        return new MinimumProbability(p);
    }

    /**
     * Reads {@code simple}, {@code guarded} or {@code probability P} ({@code P} a fraction such as
     * {@code 0.95} or a percentage such as {@code 95%}).
     *
     * @throws InvalidInputException with a message naming the accepted forms
     */
    static DecisionRule parse(String text) {
        String t = text.trim().toLowerCase(Locale.ROOT);
        if (t.equals("simple")) {
            return SIMPLE;
        }
        if (t.equals("guarded")) {
            return GUARDED;
        }
        if (t.startsWith("probability")) {
            String number = t.substring("probability".length()).trim();
            double p;
            try {
                p = number.endsWith("%") ? Double.parseDouble(number.substring(0, number.length() - 1).trim()) / 100
                        : Double.parseDouble(number);
            } catch (NumberFormatException e) {
                throw new InvalidInputException("a decision rule 'probability P' needs P as 0.95 or 95%, got \""
                        + text + "\"");
            }
            return minimumProbability(p);
        }
        throw new InvalidInputException("unknown decision rule \"" + text
                + "\": use simple, guarded or probability P (e.g. probability 0.95)");
    }

    /**
     * The probability that the measurand lies in [min, max] for a normal distribution centred on
     * {@code value} with standard uncertainty {@code standardU}: Φ((max − y)/u) − Φ((min − y)/u)
     * (JCGM 106:2012, 7.3). For u = 0 it is 1 inside the limits and 0 outside; NaN when u is NaN.
     */
    static double probabilityOfConformance(double value, double standardU, double min, double max) {
        if (Double.isNaN(value) || Double.isNaN(standardU)) {
            return Double.NaN;
        }
        if (standardU == 0.0) {
            return value >= min && value <= max ? 1.0 : 0.0;
        }
        return Math.max(0.0, phi((max - value) / standardU) - phi((min - value) / standardU));
    }

    /** The standard normal distribution function Φ, exact in both tails. */
    private static double phi(double z) {
        if (z == Double.POSITIVE_INFINITY) {
            return 1.0;
        }
        if (z == Double.NEGATIVE_INFINITY) {
            return 0.0;
        }
        return 0.5 * Erf.erfc(-z / Math.sqrt(2.0));
    }

    private static Conformance outcome(Decision d, String rule, double value, double standardU, double min,
            double max) {
        return new Conformance(d, rule, value, 2.0 * standardU, probabilityOfConformance(value, standardU, min, max));
    }

    private static boolean inside(double value, double min, double max) {
        return value >= min && value <= max;
    }

    /** Simple acceptance. */
    record Simple() implements DecisionRule {
        @Override
        public Conformance decide(double value, double standardU, double min, double max) {
            return outcome(inside(value, min, max) ? Decision.PASS : Decision.FAIL, text(), value, standardU, min, max);
        }

        @Override
        public String text() {
            return "simple";
        }
    }

    /** Guarded acceptance, w = U. */
    record Guarded() implements DecisionRule {
        @Override
        public Conformance decide(double value, double standardU, double min, double max) {
            Decision d;
            if (Double.isNaN(value)) {
                d = Decision.FAIL;
            } else if (Double.isNaN(standardU)) {
                d = inside(value, min, max) ? Decision.CONDITIONAL_PASS : Decision.CONDITIONAL_FAIL;
            } else {
                double w = 2.0 * standardU;
                if (value - w >= min && value + w <= max) {
                    d = Decision.PASS;
                } else if (value + w < min || value - w > max) {
                    d = Decision.FAIL;
                } else {
                    d = inside(value, min, max) ? Decision.CONDITIONAL_PASS : Decision.CONDITIONAL_FAIL;
                }
            }
            return outcome(d, text(), value, standardU, min, max);
        }

        @Override
        public String text() {
            return "guarded";
        }
    }

    /** A minimum probability of conformance. */
    record MinimumProbability(double minimum) implements DecisionRule {
        public MinimumProbability {
            if (!(minimum > 0.5 && minimum < 1.0)) {
                throw new InvalidInputException("a minimum probability of conformance must be above 0.5 and below 1, got "
                        + minimum);
            }
        }

        @Override
        public Conformance decide(double value, double standardU, double min, double max) {
            double pc = probabilityOfConformance(value, standardU, min, max);
            Decision d;
            if (Double.isNaN(value)) {
                d = Decision.FAIL;
            } else if (Double.isNaN(pc)) {
                d = inside(value, min, max) ? Decision.CONDITIONAL_PASS : Decision.CONDITIONAL_FAIL;
            } else if (pc >= minimum) {
                d = Decision.PASS;
            } else if (pc <= 1.0 - minimum) {
                d = Decision.FAIL;
            } else {
                d = inside(value, min, max) ? Decision.CONDITIONAL_PASS : Decision.CONDITIONAL_FAIL;
            }
            return new Conformance(d, text(), value, 2.0 * standardU, pc);
        }

        @Override
        public String text() {
            return "probability " + BigDecimalText.of(minimum);
        }
    }
}
