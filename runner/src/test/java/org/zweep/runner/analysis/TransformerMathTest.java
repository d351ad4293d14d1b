package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/**
 * Coupled-coil formulas against worked examples: M = k√(L1·L2), L1 + L2 ± 2M (C. K. Alexander, M. N. O. Sadiku,
 * Fundamentals of Electric Circuits, ch. 13 "Magnetically Coupled Circuits", from memory), each example with its source.
 */
class TransformerMathTest {
    @Test
    void x1SeriesAidingOfTwoCoupledCoils() {
        // S. Gibilisco, Teach Yourself Electricity and Electronics, Problem 10-5 (seen as a reproduction; edition and page
        // not checked): L1 = 30 µH, L2 = 50 µH, k = 0.5, aiding: M = 19.365 µH, L = 118.73 µH (the book rounds to 120 µH)
        double m = TransformerMath.mutual(0.5, 30e-6, 50e-6);
        assertEquals(19.365e-6, m, 0.001e-6);
        assertEquals(118.73e-6, TransformerMath.seriesAiding(30e-6, 50e-6, m), 0.01e-6);
    }

    @Test
    void x2SeriesOpposingOfTwoCoupledCoils() {
        // Gibilisco, Problem 10-6: 835 µH and 2.44 mH, k = 0.922, opposing: 642.9 µH (book: 643 µH; the reproduction
        // prints +2M, a typo, its numbers use −2M)
        double m = TransformerMath.mutual(0.922, 835e-6, 2.44e-3);
        assertEquals(1316.0e-6, m, 0.1e-6);
        assertEquals(642.9e-6, TransformerMath.seriesOpposing(835e-6, 2.44e-3, m), 0.1e-6);
    }

    @Test
    void x3AndX4CouplingAndSeriesTotalsFromMutualInductance() {
        // 2.5 mH and 40 mH with M = 8 mH and 10 mH: 58.5 mH and 62.5 mH aiding, as an "Introduction to Electric Circuits"
        // course text gives in §2.3, Example 2.18 (author not identified); the rest computed
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
        // equal coils, 14 H aiding, 6 H opposing: M = (14 − 6)/4 = 2 H, each coil (14 + 6)/4 = 5 H, k = 2/5; computed
        // (common practice, no source)
        double m = TransformerMath.mutualFromSeries(14, 6);
        assertEquals(2.0, m, 1e-12);
        assertEquals(0.4, TransformerMath.coupling(m, 5.0, 5.0), 1e-12);
    }

    @Test
    void x6CouplingFromOpenAndShortCircuitInductance() {
        // k = √(1 − Lsc/Loc): JIS C 5602-1986, as Wikipedia "Short-circuit inductance" cites it; √0.98 computed
        double k = TransformerMath.couplingFromOpenShort(10e-3, 0.2e-3);
        assertEquals(0.989949, k, 1e-6);
    }

    @Test
    void x7ConsistentTransformerExercisesEveryFormula() {
        // one consistent transformer, every figure computed: L1 = 10 mH, n = 4, L2 = L1/n² = 0.625 mH, k = 0.99
        double l1 = 10e-3;
        double l2 = 0.625e-3;
        double m = TransformerMath.mutual(0.99, l1, l2);
        assertEquals(2.475e-3, m, 1e-12);
        assertEquals(199.0e-6, TransformerMath.shortCircuit(l1, 0.99), 1e-10);
        assertEquals(12.4375e-6, TransformerMath.shortCircuit(l2, 0.99), 1e-12);
        assertEquals(0.99, TransformerMath.couplingFromOpenShort(l1, 199.0e-6), 1e-12);
        assertEquals(0.99, TransformerMath.couplingFromOpenShort(l2, 12.4375e-6), 1e-12);
        double fwd = 4 / 0.99; // V1/V2 driving the primary, secondary open: L1/M = n/k = 4.0404
        double rev = 0.99 * 4; // V1/V2 driving the secondary: M/L2 = k·n = 3.96
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
