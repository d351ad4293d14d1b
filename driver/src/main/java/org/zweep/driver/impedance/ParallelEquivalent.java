package org.zweep.driver.impedance;

/**
 * The parallel equivalent of an impedance at one frequency: admittance Y = 1/Z = G + jB, read as
 * a resistance Rp = 1/G across a reactance Xp = −1/B (a capacitance Cp = B/ω or an inductance
 * Lp = −1/(ωB)). Exact at this frequency only.
 *
 * <p>Immutable and thread-safe. A zero G or B gives an infinite Rp, Xp or Lp (never NaN); an
 * infinite G (a short) gives Rp = 0.
 *
 * @param frequencyHz the frequency, in Hz
 * @param conductanceS G in siemens (+∞ for a perfect short)
 * @param susceptanceS B in siemens (positive for a capacitive part)
 */
public record ParallelEquivalent(double frequencyHz, double conductanceS, double susceptanceS) {

    /** Parallel resistance Rp = 1/G in ohms; +∞ when G = 0. */
    public double resistanceOhm() {
        return Impedance.reciprocal(conductanceS);
    }

    /** Parallel reactance Xp = −1/B in ohms; +∞ when B = 0. */
    public double reactanceOhm() {
        return susceptanceS == 0.0 ? Double.POSITIVE_INFINITY : -1.0 / susceptanceS;
    }

    /** Parallel capacitance Cp = B/ω in farads; negative for an inductive part. */
    public double capacitanceF() {
        return susceptanceS / (2.0 * Math.PI * frequencyHz);
    }

    /** Parallel inductance Lp = −1/(ωB) in henries; negative for a capacitive part, +∞ when B = 0. */
    public double inductanceH() {
        return susceptanceS == 0.0 ? Double.POSITIVE_INFINITY : -1.0 / (2.0 * Math.PI * frequencyHz * susceptanceS);
    }

    /**
     * The exact series equivalent Z = 1/Y.
     *
     * @throws ArithmeticException for Y = 0 (an open circuit has no finite series equivalent)
     */
    public Impedance toSeries() {
        if (Double.isInfinite(conductanceS) || Double.isInfinite(susceptanceS)) {
            return new Impedance(frequencyHz, 0.0, 0.0);
        }
        double m = Math.hypot(conductanceS, susceptanceS);
        if (m == 0.0) {
            throw new ArithmeticException("an open circuit (Y = 0) has no finite series equivalent");
        }
        return new Impedance(frequencyHz, Impedance.plusZero(conductanceS / m / m),
                Impedance.plusZero(-susceptanceS / m / m));
    }
}
