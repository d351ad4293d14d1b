package org.zweep.runner.analysis;

/**
 * Two-winding transformer formulas (coupled coils; k from open/short inductance as in JIS C 5602-1986). Inductances in H, ratios dimensionless.
 * Pure functions.
 */
public final class TransformerMath {
    private TransformerMath() {
    }

    /** Coupling coefficient k = √(1 − Lsc/Loc) from open- and short-circuit inductances of one winding. */
    public static double couplingFromOpenShort(double openH, double shortH) {
        return Math.sqrt(1 - shortH / openH);
    }

    /** Mutual inductance M = k·√(L1·L2). */
    public static double mutual(double k, double l1H, double l2H) {
        return k * Math.sqrt(l1H * l2H);
    }

    /** Coupling k = M/√(L1·L2). */
    public static double coupling(double mutualH, double l1H, double l2H) {
        return mutualH / Math.sqrt(l1H * l2H);
    }

    /** Series-aiding total L1 + L2 + 2M. */
    public static double seriesAiding(double l1H, double l2H, double mutualH) {
        return l1H + l2H + 2 * mutualH;
    }

    /** Series-opposing total L1 + L2 − 2M. */
    public static double seriesOpposing(double l1H, double l2H, double mutualH) {
        return l1H + l2H - 2 * mutualH;
    }

    /** M = (L_aid − L_opp)/4. */
    public static double mutualFromSeries(double aidingH, double opposingH) {
        return (aidingH - opposingH) / 4;
    }

    /** Short-circuit inductance L·(1 − k²) seen at a winding of inductance L. */
    public static double shortCircuit(double lH, double k) {
        return lH * (1 - k * k);
    }

    /** Leakage inductance of a winding in the split-k convention: L·(1 − k). */
    public static double leakageSplitK(double lH, double k) {
        return lH * (1 - k);
    }

    /**
     * Turns ratio from the open-circuit voltage ratios driven each way: n = √(r_fwd·r_rev), where
     * r_fwd = V1/V2 driving the primary and r_rev = V1/V2 driving the secondary.
     */
    public static double turnsFromRatios(double forward, double reverse) {
        return Math.sqrt(forward * reverse);
    }

    /** Coupling from the two open-circuit voltage ratios: k = √(r_rev/r_fwd). */
    public static double couplingFromRatios(double forward, double reverse) {
        return Math.sqrt(reverse / forward);
    }

    /**
     * Turns ratio from the primary-driven open-circuit ratio V1/V2 = n/k and a known k (symmetric
     * leakage model): n = k·V1/V2.
     */
    public static double turnsFromForwardRatio(double forward, double k) {
        return k * forward;
    }
}
