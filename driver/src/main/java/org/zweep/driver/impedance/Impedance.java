package org.zweep.driver.impedance;

/**
 * A complex impedance Z = R + jX measured at one frequency. Capacitive reactance is negative.
 *
 * <p>Immutable and thread-safe. All values are SI: ohms and hertz.
 *
 * @param frequencyHz the frequency the impedance was measured at, in Hz (positive)
 * @param resistanceOhm the real part R, in ohms
 * @param reactanceOhm the imaginary part X, in ohms (negative for a capacitive impedance)
 */
public record Impedance(double frequencyHz, double resistanceOhm, double reactanceOhm) {

    /** Angular frequency ω = 2πf in rad/s. */
    public double omega() {
        return 2.0 * Math.PI * frequencyHz;
    }

    /** Magnitude |Z| in ohms. */
    public double magnitudeOhm() {
        return Math.hypot(resistanceOhm, reactanceOhm);
    }

    /** Phase θ in degrees, in (−180°, 180°]. */
    public double phaseDeg() {
        double deg = Math.toDegrees(Math.atan2(reactanceOhm, resistanceOhm));
        return deg == -180.0 ? 180.0 : deg;
    }
}
