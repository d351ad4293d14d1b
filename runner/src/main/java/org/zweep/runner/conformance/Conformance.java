package org.zweep.runner.conformance;

/**
 * The outcome of applying a decision rule to one value.
 *
 * @param decision the statement
 * @param rule the rule applied, as written in a sequence ({@code simple}, {@code guarded}, {@code probability 0.95})
 * @param value the measured value, in SI units
 * @param expandedU its expanded uncertainty U (k = 2); NaN when unknown
 * @param probability the probability of conformance p_c (normal distribution); NaN when u is unknown
 */
public record Conformance(Decision decision, String rule, double value, double expandedU, double probability) {

    /** How the decision was made, for people: {@code [guarded, U = 210 pF, p = 0.799]}. */
    public String how(org.zweep.driver.impedance.Unit unit) {
        return how(rule, expandedU, probability, unit);
    }

    /**
     * {@code [RULE, U = …, p = …]}, with {@code U unknown} when U is NaN and without p when it is
     * NaN; the one wording of a decision's rule, U and probability in every output.
     */
    public static String how(String rule, double expandedU, double probability, org.zweep.driver.impedance.Unit unit) {
        return "[" + rule
                + (Double.isNaN(expandedU) ? ", U unknown"
                        : ", U = " + org.zweep.driver.impedance.Quantities.format(expandedU, unit, 2))
                + (Double.isNaN(probability) ? "" : String.format(java.util.Locale.ROOT, ", p = %.3f", probability))
                + "]";
    }
}
