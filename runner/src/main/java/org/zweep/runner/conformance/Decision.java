package org.zweep.runner.conformance;

/**
 * A statement of conformity. The two conditional statements say that the uncertainty does not
 * allow a proven decision: the value lies inside (conditional pass) or outside (conditional fail)
 * the limits, but within the guard band of one of them (ILAC-G8:09/2019, 4.2.3 allows such
 * non-binary statements).
 */
public enum Decision {
    PASS("pass"),
    CONDITIONAL_PASS("conditional pass"),
    CONDITIONAL_FAIL("conditional fail"),
    FAIL("fail");

    private final String word;

    Decision(String word) {
        this.word = word;
    }

    /** The word written in results and reports: {@code pass}, {@code conditional pass}, … */
    public String word() {
        return word;
    }

    /** Whether the check counts as passed for the run's outcome: only a proven pass does. */
    public boolean proven() {
        return this == PASS;
    }
}
