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
}
