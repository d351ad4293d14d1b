package org.zweep.driver.meter;

/**
 * The meter's impedance range: automatic, or held at a fixed upper limit.
 *
 * @param auto whether the meter chooses the range itself
 * @param upperOhm the held range's upper limit in ohms; ignored (and {@code NaN}) when {@code auto}
 */
public record ImpedanceRange(boolean auto, double upperOhm) {
    /** Automatic ranging. */
    public static final ImpedanceRange AUTO = new ImpedanceRange(true, Double.NaN);

    /** A range held at {@code upperOhm} ohms. */
    public static ImpedanceRange hold(double upperOhm) {
        return new ImpedanceRange(false, upperOhm);
    }
}
