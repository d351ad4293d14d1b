package org.zweep.driver.impedance;

/**
 * Whether to describe an impedance by its series (Rs with Cs or Ls) or parallel (Rp with Cp or Lp)
 * equivalent, or to let the rule of thumb decide ({@link #AUTO}).
 *
 * <p>The rule of thumb ({@link #resolve}; common practice of the trade, no single source):
 * <ul>
 *   <li>|Z| below {@value #SERIES_BELOW_OHM} Ω: series. A low impedance is dominated by what is in
 *       series with the reactance (lead, contact, winding resistance, ESR); a shunt leakage is
 *       negligible there.</li>
 *   <li>|Z| above {@value #PARALLEL_ABOVE_OHM} Ω: parallel. A high impedance is dominated by what is
 *       across it (dielectric leakage, core loss); series resistance is negligible there.</li>
 *   <li>In between, by the part's kind: a capacitor parallel, an inductor or a transformer's winding
 *       series; for a resistor or a part of unknown kind by the sign of X: capacitive (X &lt; 0)
 *       parallel, otherwise series.</li>
 * </ul>
 * {@link #SERIES} and {@link #PARALLEL} are the caller's override and resolve to themselves.
 */
public enum EquivalentCircuit {
    /** Series model: Rs (ESR) with Cs or Ls. */
    SERIES,
    /** Parallel model: Rp with Cp or Lp. */
    PARALLEL,
    /** Chosen per impedance by the rule of thumb. */
    AUTO;

    /** Below this |Z|, in ohms, {@link #AUTO} chooses series. */
    public static final double SERIES_BELOW_OHM = 10.0;
    /** Above this |Z|, in ohms, {@link #AUTO} chooses parallel. */
    public static final double PARALLEL_ABOVE_OHM = 10_000.0;

    /**
     * The model to use for {@code z}: this one, or for {@link #AUTO} the rule of thumb above.
     *
     * @param kind the part's kind, or {@code null} when it is not known
     * @return {@link #SERIES} or {@link #PARALLEL}, never {@link #AUTO}
     */
    public EquivalentCircuit resolve(Impedance z, PartKind kind) {
        if (this != AUTO) {
            return this;
        }
        double m = z.magnitudeOhm();
        if (m < SERIES_BELOW_OHM) {
            return SERIES;
        }
        if (m > PARALLEL_ABOVE_OHM) {
            return PARALLEL;
        }
        if (kind == PartKind.CAPACITOR) {
            return PARALLEL;
        }
        if (kind == PartKind.INDUCTOR || kind == PartKind.TRANSFORMER) {
            return SERIES;
        }
        return z.reactanceOhm() < 0 ? PARALLEL : SERIES;
    }
}
