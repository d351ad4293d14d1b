package org.zweep.driver.impedance;

import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.InvalidInputException;

/**
 * A complex impedance Z = R + jX measured at one frequency, and every parameter derived from it.
 * Capacitive reactance is negative.
 *
 * <p>Immutable and thread-safe. All values are SI: ohms, siemens, farads, henries, hertz; angles
 * in degrees. Series quantities (Rs = ESR, Cs, Ls) describe Z as R in series with X; parallel
 * quantities (Rp, Cp, Lp, G, B) describe Y = 1/Z = G + jB as a conductance across a susceptance.
 *
 * <p>Signs and limits, chosen so that no value of a finite, non-NaN impedance is NaN:
 * <ul>
 *   <li>A capacitance of an inductive impedance (X &gt; 0) is negative, and an inductance of a
 *       capacitive one is negative, as meters show them.</li>
 *   <li>R = 0 with X ≠ 0 (lossless): Q = +∞, D = 0, Rp = +∞, G = 0.</li>
 *   <li>X = 0 (pure resistance): Q = 0, D = ±∞ (sign of R), Cs = +∞, Lp = +∞, Xp = +∞, Cp = Ls = 0.</li>
 *   <li>Z = 0 (a perfect short): as X = 0, with D = +∞, G = |Y| = +∞ and Rp = 0.</li>
 *   <li>R &lt; 0 (possible after compensation): Q, D and δ are negative, consistently with
 *       Q = tan|θ|, D = tan δ.</li>
 * </ul>
 * Parts that are NaN give NaN values (a reading without a value).
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

    /**
     * Loss angle δ = 90° − |θ| in degrees; tan δ = D. Computed as atan2(R, |X|), which equals
     * 90° − |θ| without its cancellation for a nearly lossless part; 90° for Z = 0.
     */
    public double lossAngleDeg() {
        if (resistanceOhm == 0.0 && reactanceOhm == 0.0) {
            return 90.0;
        }
        return Math.toDegrees(Math.atan2(resistanceOhm, Math.abs(reactanceOhm)));
    }

    /** Quality factor Q = |X|/R = tan|θ| (dimensionless); +∞ when R = 0 and X ≠ 0, 0 when X = 0. */
    public double qualityFactor() {
        if (reactanceOhm == 0.0) {
            return 0.0;
        }
        if (resistanceOhm == 0.0) {
            return Double.POSITIVE_INFINITY;
        }
        return Math.abs(reactanceOhm) / resistanceOhm;
    }

    /** Dissipation factor D = R/|X| = 1/Q = tan δ (dimensionless); 0 when R = 0, ±∞ when X = 0. */
    public double dissipationFactor() {
        if (resistanceOhm == 0.0) {
            return reactanceOhm == 0.0 ? Double.POSITIVE_INFINITY : 0.0;
        }
        if (reactanceOhm == 0.0) {
            return resistanceOhm > 0 ? Double.POSITIVE_INFINITY : Double.NEGATIVE_INFINITY;
        }
        return resistanceOhm / Math.abs(reactanceOhm);
    }

    /** Admittance magnitude |Y| = 1/|Z| in siemens; +∞ for Z = 0. */
    public double admittanceMagnitudeS() {
        return reciprocal(magnitudeOhm());
    }

    /** Conductance G = Re(1/Z) in siemens. */
    public double conductanceS() {
        return toParallel().conductanceS();
    }

    /** Susceptance B = Im(1/Z) in siemens (positive for a capacitive impedance). */
    public double susceptanceS() {
        return toParallel().susceptanceS();
    }

    /** Series resistance Rs = R in ohms, the equivalent series resistance (ESR). */
    public double seriesResistanceOhm() {
        return resistanceOhm;
    }

    /** Series capacitance Cs = −1/(ωX) in farads; negative when inductive, +∞ when X = 0. */
    public double seriesCapacitanceF() {
        return reactanceOhm == 0.0 ? Double.POSITIVE_INFINITY : -1.0 / (omega() * reactanceOhm);
    }

    /** Series inductance Ls = X/ω in henries; negative when capacitive. */
    public double seriesInductanceH() {
        return reactanceOhm / omega();
    }

    /** Parallel resistance Rp = 1/G in ohms; +∞ when R = 0. */
    public double parallelResistanceOhm() {
        return toParallel().resistanceOhm();
    }

    /** Parallel reactance Xp = −1/B in ohms; +∞ when X = 0. */
    public double parallelReactanceOhm() {
        return toParallel().reactanceOhm();
    }

    /** Parallel capacitance Cp = B/ω in farads; negative when inductive. */
    public double parallelCapacitanceF() {
        return toParallel().capacitanceF();
    }

    /** Parallel inductance Lp = −1/(ωB) in henries; negative when capacitive, +∞ when X = 0. */
    public double parallelInductanceH() {
        return toParallel().inductanceH();
    }

    /** The exact parallel equivalent Y = 1/Z at this frequency. */
    public ParallelEquivalent toParallel() {
        double m = magnitudeOhm();
        if (m == 0.0) {
            return new ParallelEquivalent(frequencyHz, Double.POSITIVE_INFINITY, 0.0);
        }
        // Dividing twice by |Z| instead of once by |Z|² keeps tiny and huge impedances finite.
        return new ParallelEquivalent(frequencyHz, resistanceOhm / m / m, plusZero(-reactanceOhm / m / m));
    }

    /** Z as a Commons Math complex number R + jX. */
    public Complex toComplex() {
        return new Complex(resistanceOhm, reactanceOhm);
    }

    /**
     * The impedance {@code z} (in ohms) at {@code frequencyHz}.
     *
     * @throws InvalidInputException if the frequency is not positive or {@code z} is not finite
     */
    public static Impedance fromComplex(double frequencyHz, Complex z) {
        return checked("Z", frequencyHz, z.getReal(), z.getImaginary());
    }

    /**
     * From resistance and reactance in ohms (checked, unlike the canonical constructor).
     *
     * @throws InvalidInputException if the frequency is not positive or a part is not finite
     */
    public static Impedance fromRX(double frequencyHz, double rOhm, double xOhm) {
        return checked("R/X", frequencyHz, rOhm, xOhm);
    }

    /**
     * From magnitude |Z| in ohms and phase θ in degrees. Multiples of 90° are exact (θ = 90°
     * gives R = 0, not 6e-17·|Z|).
     *
     * @throws InvalidInputException if the frequency is not positive or a value is not finite
     */
    public static Impedance fromPolar(double frequencyHz, double zOhm, double thetaDeg) {
        return checked("|Z|/θ", frequencyHz, zOhm * cosDeg(thetaDeg), zOhm * sinDeg(thetaDeg));
    }

    /** From series capacitance Cs in farads and dissipation factor D: X = −1/(ωCs), R = D·|X|. */
    public static Impedance fromCsD(double frequencyHz, double csF, double d) {
        double x = -1.0 / (omegaOf(frequencyHz) * csF);
        return checked("Cs/D", frequencyHz, d * Math.abs(x), x);
    }

    /** From series capacitance Cs in farads and its ESR in ohms: X = −1/(ωCs), R = ESR. */
    public static Impedance fromCsEsr(double frequencyHz, double csF, double esrOhm) {
        return checked("Cs/ESR", frequencyHz, esrOhm, -1.0 / (omegaOf(frequencyHz) * csF));
    }

    /** From series inductance Ls in henries and quality factor Q: X = ωLs, R = |X|/Q. */
    public static Impedance fromLsQ(double frequencyHz, double lsH, double q) {
        double x = omegaOf(frequencyHz) * lsH;
        return checked("Ls/Q", frequencyHz, Math.abs(x) / q, x);
    }

    /** From series inductance Ls in henries and series resistance Rs in ohms. */
    public static Impedance fromLsRs(double frequencyHz, double lsH, double rsOhm) {
        return checked("Ls/Rs", frequencyHz, rsOhm, omegaOf(frequencyHz) * lsH);
    }

    /** From parallel capacitance Cp in farads and dissipation factor D: B = ωCp, G = D·|B|. */
    public static Impedance fromCpD(double frequencyHz, double cpF, double d) {
        double b = omegaOf(frequencyHz) * cpF;
        return fromParallel("Cp/D", frequencyHz, d * Math.abs(b), b);
    }

    /** From parallel capacitance Cp in farads and parallel resistance Rp in ohms: B = ωCp, G = 1/Rp. */
    public static Impedance fromCpRp(double frequencyHz, double cpF, double rpOhm) {
        return fromParallel("Cp/Rp", frequencyHz, 1.0 / rpOhm, omegaOf(frequencyHz) * cpF);
    }

    /** From parallel inductance Lp in henries and quality factor Q: B = −1/(ωLp), G = |B|/Q. */
    public static Impedance fromLpQ(double frequencyHz, double lpH, double q) {
        double b = -1.0 / (omegaOf(frequencyHz) * lpH);
        return fromParallel("Lp/Q", frequencyHz, Math.abs(b) / q, b);
    }

    /** From parallel inductance Lp in henries and parallel resistance Rp in ohms. */
    public static Impedance fromLpRp(double frequencyHz, double lpH, double rpOhm) {
        return fromParallel("Lp/Rp", frequencyHz, 1.0 / rpOhm, -1.0 / (omegaOf(frequencyHz) * lpH));
    }

    private static Impedance fromParallel(String pair, double frequencyHz, double gS, double bS) {
        if (Double.isNaN(gS) || Double.isNaN(bS) || (gS == 0.0 && bS == 0.0)) {
            throw new InvalidInputException(pair + " at " + frequencyHz + " Hz gives no finite impedance (G = "
                    + gS + " S, B = " + bS + " S)");
        }
        Impedance z = new ParallelEquivalent(frequencyHz, gS, bS).toSeries();
        return checked(pair, frequencyHz, z.resistanceOhm(), z.reactanceOhm());
    }

    private static Impedance checked(String pair, double frequencyHz, double rOhm, double xOhm) {
        omegaOf(frequencyHz);
        if (!Double.isFinite(rOhm) || !Double.isFinite(xOhm)) {
            throw new InvalidInputException(pair + " at " + frequencyHz + " Hz gives no finite impedance (R = "
                    + rOhm + " Ω, X = " + xOhm + " Ω)");
        }
        return new Impedance(frequencyHz, plusZero(rOhm), plusZero(xOhm));
    }

    private static double omegaOf(double frequencyHz) {
        if (!(frequencyHz > 0.0) || Double.isInfinite(frequencyHz)) {
            throw new InvalidInputException("the frequency must be positive and finite, got " + frequencyHz + " Hz");
        }
        return 2.0 * Math.PI * frequencyHz;
    }

    private static double cosDeg(double deg) {
        double r = Math.IEEEremainder(deg, 360.0);
        if (Math.abs(r) == 90.0) {
            return 0.0;
        }
        if (Math.abs(r) == 180.0) {
            return -1.0;
        }
        return Math.cos(Math.toRadians(r));
    }

    private static double sinDeg(double deg) {
        double r = Math.IEEEremainder(deg, 360.0);
        if (r == 0.0 || Math.abs(r) == 180.0) {
            return 0.0;
        }
        if (Math.abs(r) == 90.0) {
            return Math.signum(r);
        }
        return Math.sin(Math.toRadians(r));
    }

    /** 1/x, with 1/±0 = +∞ so that a zero of either sign gives the same limit. */
    static double reciprocal(double x) {
        return x == 0.0 ? Double.POSITIVE_INFINITY : 1.0 / x;
    }

    /** x with −0 replaced by +0. */
    static double plusZero(double x) {
        return x == 0.0 ? 0.0 : x;
    }
}
