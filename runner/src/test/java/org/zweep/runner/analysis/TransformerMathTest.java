package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/** check-values.md §7 worked examples X1–X7, each with its source. */
class TransformerMathTest {
    @Test
    void x1SeriesAidingOfTwoCoupledCoils() {
        // X1: Gibilisco, Teach Yourself Electricity and Electronics, Problem 10-5 (via check-values.md §7)
        double m = TransformerMath.mutual(0.5, 30e-6, 50e-6);
        assertEquals(19.365e-6, m, 0.001e-6);
        assertEquals(118.73e-6, TransformerMath.seriesAiding(30e-6, 50e-6, m), 0.01e-6);
    }

    @Test
    void x2SeriesOpposingOfTwoCoupledCoils() {
        // X2: Gibilisco, Problem 10-6 (the book prints +2M, a typo; its numbers use −2M)
        double m = TransformerMath.mutual(0.922, 835e-6, 2.44e-3);
        assertEquals(1316.0e-6, m, 0.1e-6);
        assertEquals(642.9e-6, TransformerMath.seriesOpposing(835e-6, 2.44e-3, m), 0.1e-6);
    }

    @Test
    void x3AndX4CouplingAndSeriesTotalsFromMutualInductance() {
        // X3, X4: Introduction to Electric Circuits, §2.3, Example 2.18 (via check-values.md §7)
        assertEquals(0.800, TransformerMath.coupling(8e-3, 2.5e-3, 40e-3), 1e-12);
        assertEquals(58.5e-3, TransformerMath.seriesAiding(2.5e-3, 40e-3, 8e-3), 1e-12);
        assertEquals(26.5e-3, TransformerMath.seriesOpposing(2.5e-3, 40e-3, 8e-3), 1e-12);
        assertEquals(8e-3, TransformerMath.mutualFromSeries(58.5e-3, 26.5e-3), 1e-12);
        assertEquals(1.000, TransformerMath.coupling(10e-3, 2.5e-3, 40e-3), 1e-12);
        assertEquals(62.5e-3, TransformerMath.seriesAiding(2.5e-3, 40e-3, 10e-3), 1e-12);
        assertEquals(22.5e-3, TransformerMath.seriesOpposing(2.5e-3, 40e-3, 10e-3), 1e-12);
    }

    @Test
    void x5MutualInductanceFromAidingAndOpposingTotals() {
        // X5: exam question page, weak (check-values.md §7): equal coils, 14 H aiding, 6 H opposing
        double m = TransformerMath.mutualFromSeries(14, 6);
        assertEquals(2.0, m, 1e-12);
        double each = (14 + 6) / 2.0 / 2;
        assertEquals(5.0, each, 1e-12);
        assertEquals(0.4, TransformerMath.coupling(m, each, each), 1e-12);
    }

    @Test
    void x6CouplingFromOpenAndShortCircuitInductance() {
        // X6 [calc] with k = √(1 − Lsc/Loc): Wikipedia "Short-circuit inductance", citing JIS C 5602-1986
        double k = TransformerMath.couplingFromOpenShort(10e-3, 0.2e-3);
        assertEquals(0.989949, k, 1e-6);
        assertEquals(0.010051, 1 - k, 1e-6);
    }

    @Test
    void x7ConsistentTransformerExercisesEveryFormula() {
        // X7 [calc], check-values.md §7: L1 = 10 mH, n = 4, L2 = 0.625 mH, k = 0.99
        double l1 = 10e-3;
        double l2 = 0.625e-3;
        double m = TransformerMath.mutual(0.99, l1, l2);
        assertEquals(2.475e-3, m, 1e-12);
        assertEquals(199.0e-6, TransformerMath.shortCircuit(l1, 0.99), 1e-10);
        assertEquals(12.4375e-6, TransformerMath.shortCircuit(l2, 0.99), 1e-12);
        assertEquals(0.99, TransformerMath.couplingFromOpenShort(l1, 199.0e-6), 1e-12);
        assertEquals(0.99, TransformerMath.couplingFromOpenShort(l2, 12.4375e-6), 1e-12);
        double fwd = l1 / m; // V1/V2 driving the primary, secondary open
        double rev = m / l2; // V1/V2 driving the secondary
        assertEquals(4.0404, fwd, 1e-4);
        assertEquals(3.96, rev, 1e-12);
        assertEquals(4.000, TransformerMath.turnsFromRatios(fwd, rev), 1e-12);
        assertEquals(0.99, TransformerMath.couplingFromRatios(fwd, rev), 1e-12);
        assertEquals(4.000, TransformerMath.turnsFromForwardRatio(fwd, 0.99), 1e-12);
        assertEquals(15.575e-3, TransformerMath.seriesAiding(l1, l2, m), 1e-12);
        assertEquals(5.675e-3, TransformerMath.seriesOpposing(l1, l2, m), 1e-12);
        assertEquals(m, TransformerMath.mutualFromSeries(15.575e-3, 5.675e-3), 1e-12);
        // split-k leakage, Wikipedia "Leakage inductance": L(1 − k)
        assertEquals(0.1e-3, TransformerMath.leakageSplitK(l1, 0.99), 1e-12);
    }
}
