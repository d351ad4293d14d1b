package org.zweep.runner.conformance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;

/**
 * The decision rules, with the formulas and zones of JCGM 106:2012 and ILAC-G8:09/2019, on cases
 * made up here (the published worked examples are in {@link PublishedExamplesTest}). Values of the
 * standard normal distribution function Φ are from Abramowitz and Stegun, Handbook of
 * Mathematical Functions (1964), Table 26.1 (from memory, re-checked with an independent erfc):
 * Φ(1) = 0.8413447, Φ(1.6) = 0.9452007, Φ(1.645) = 0.9500151, Φ(1.7) = 0.9554345,
 * Φ(2) = 0.9772499, Φ(3) = 0.9986501.
 */
class DecisionRuleTest {
    private static final double INF = Double.POSITIVE_INFINITY;

    @Test
    void simpleAcceptanceAtTheLimitPassesWithAHalfChanceOfConformance() {
        // ILAC-G8:09/2019, 4.2.1 (simple acceptance, w = 0): a value at the limit is accepted,
        // with a risk of false acceptance up to 50 %; JCGM 106:2012, 7.3: p_c = Φ(0) = 0.5
        Conformance c = DecisionRule.SIMPLE.decide(10.0, 0.1, -INF, 10.0);
        assertEquals(Decision.PASS, c.decision());
        assertEquals(0.5, c.probability(), 1e-15);
        assertEquals(0.2, c.expandedU(), 1e-15);
        assertEquals(Decision.FAIL, DecisionRule.SIMPLE.decide(10.0001, 0.1, -INF, 10.0).decision());
    }

    @Test
    void guardedAcceptanceAtTheAcceptanceLimitLeavesAtMostTwoAndAHalfPercentRisk() {
        // ILAC-G8:09/2019, 4.2.2 (guarded acceptance, w = U, k = 2): a value at the acceptance limit
        // T_U − U is accepted with a false-accept risk below 2.5 %: 1 − Φ(2) = 0.0227501
        Conformance c = DecisionRule.GUARDED.decide(9.8, 0.1, -INF, 10.0);
        assertEquals(Decision.PASS, c.decision());
        assertEquals(0.9772499, c.probability(), 1e-7); // Abramowitz and Stegun, Table 26.1: Φ(2)
        assertTrue(1 - c.probability() < 0.025);
    }

    @Test
    void guardedZonesOfConformanceNonConformanceAndNeither() {
        // ISO 14253-1 zones with U = 0.2 on [9, 10], as ILAC-G8:09/2019, 4.2.2 and 4.2.3 describe them
        DecisionRule g = DecisionRule.GUARDED;
        assertEquals(Decision.PASS, g.decide(9.5, 0.1, 9.0, 10.0).decision());
        assertEquals(Decision.CONDITIONAL_PASS, g.decide(9.9, 0.1, 9.0, 10.0).decision());
        assertEquals(Decision.CONDITIONAL_PASS, g.decide(9.1, 0.1, 9.0, 10.0).decision());
        assertEquals(Decision.CONDITIONAL_FAIL, g.decide(10.1, 0.1, 9.0, 10.0).decision());
        assertEquals(Decision.CONDITIONAL_FAIL, g.decide(8.85, 0.1, 9.0, 10.0).decision());
        assertEquals(Decision.FAIL, g.decide(10.25, 0.1, 9.0, 10.0).decision());
        assertEquals(Decision.FAIL, g.decide(8.7, 0.1, 9.0, 10.0).decision());
        // an unknown uncertainty proves nothing either way
        assertEquals(Decision.CONDITIONAL_PASS, g.decide(9.5, Double.NaN, 9.0, 10.0).decision());
        assertEquals(Decision.CONDITIONAL_FAIL, g.decide(11, Double.NaN, 9.0, 10.0).decision());
        // an exact value is decided as the simple rule would
        assertEquals(Decision.PASS, g.decide(10.0, 0.0, 9.0, 10.0).decision());
    }

    @Test
    void conformanceProbabilityOfATwoSidedToleranceInterval() {
        // JCGM 106:2012, 7.3 (normal PDF, two-sided tolerance interval):
        // p_c = Φ((T_U − y)/u) − Φ((T_L − y)/u). A capacitor of 100 nF ± 10 % read as 109.5 nF with
        // u = 0.3 nF (U = 0.6 nF, k = 2): p_c = Φ(1.6667) − Φ(−65) = 0.95221
        double pc = DecisionRule.probabilityOfConformance(109.5e-9, 0.3e-9, 90e-9, 110e-9);
        assertEquals(0.95221, pc, 5e-6); // Abramowitz and Stegun, Table 26.1, Φ(1.6667) interpolated
        assertEquals(Decision.PASS, DecisionRule.SIMPLE.decide(109.5e-9, 0.3e-9, 90e-9, 110e-9).decision());
        assertEquals(Decision.CONDITIONAL_PASS, DecisionRule.GUARDED.decide(109.5e-9, 0.3e-9, 90e-9, 110e-9).decision());
        assertEquals(Decision.PASS, DecisionRule.minimumProbability(0.95).decide(109.5e-9, 0.3e-9, 90e-9, 110e-9)
                .decision());
        // Centred in an interval 4u wide each side (measurement capability index C_m = 2 in JCGM 106:2012's
        // terms, C_m = (T_U − T_L)/(4u), from memory): p_c = 2Φ(4) − 1 ≈ 0.99994; 2u each side: 2Φ(2) − 1
        assertEquals(2 * 0.9772499 - 1, DecisionRule.probabilityOfConformance(0, 1, -2, 2), 1e-7);
        assertEquals(2 * 0.8413447 - 1, DecisionRule.probabilityOfConformance(5, 1, 4, 6), 1e-7);
    }

    @Test
    void minimumProbabilitySetsTheAcceptanceLimitAtTheNormalQuantile() {
        // JCGM 106:2012, 8.3 (acceptance limit for a required conformance probability): for a single
        // upper limit T_U and p = 0.95 the acceptance limit is T_U − 1.645·u.
        DecisionRule p95 = DecisionRule.minimumProbability(0.95);
        assertEquals(Decision.PASS, p95.decide(9.83, 0.1, -INF, 10).decision()); // p_c = Φ(1.7) = 0.9554345
        assertEquals(0.9554345, p95.decide(9.83, 0.1, -INF, 10).probability(), 1e-7);
        assertEquals(Decision.CONDITIONAL_PASS, p95.decide(9.84, 0.1, -INF, 10).decision()); // Φ(1.6) = 0.9452
        assertEquals(Decision.CONDITIONAL_FAIL, p95.decide(10.1, 0.1, -INF, 10).decision()); // Φ(−1) = 0.1587
        assertEquals(Decision.FAIL, p95.decide(10.17, 0.1, -INF, 10).decision()); // Φ(−1.7) = 0.0446
        assertEquals(0.9986501, DecisionRule.probabilityOfConformance(7, 1, 4, INF), 1e-7); // Φ(3)
    }

    @Test
    void rulesAreReadAsWrittenAndBadOnesRefusedInOneLine() {
        assertEquals(DecisionRule.SIMPLE, DecisionRule.parse("simple"));
        assertEquals(DecisionRule.GUARDED, DecisionRule.parse(" Guarded "));
        assertEquals("probability 0.95", DecisionRule.parse("probability 95%").text());
        assertEquals("probability 0.99", DecisionRule.parse("probability 0.99").text());
        assertEquals("unknown decision rule \"strict\": use simple, guarded or probability P (e.g. probability 0.95)",
                assertThrows(InvalidInputException.class, () -> DecisionRule.parse("strict")).getMessage());
        assertThrows(InvalidInputException.class, () -> DecisionRule.parse("probability 0.3"));
        assertThrows(InvalidInputException.class, () -> DecisionRule.parse("probability x"));
    }

    @Test
    void aMissingValueFailsUnderEveryRule() {
        for (DecisionRule r : new DecisionRule[] {DecisionRule.SIMPLE, DecisionRule.GUARDED,
            DecisionRule.minimumProbability(0.9)}) {
            assertEquals(Decision.FAIL, r.decide(Double.NaN, 0.1, 0, 1).decision(), r.text());
        }
    }
}
