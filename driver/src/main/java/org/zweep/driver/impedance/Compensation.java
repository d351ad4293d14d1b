package org.zweep.driver.impedance;

import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.InvalidInputException;

/**
 * Host-side fixture compensation at one frequency: a map from the impedance the meter reads to the
 * impedance of the part, built from readings of the compensation standards at that frequency.
 *
 * <p>Every correction here is a bilinear (Möbius) map Z = (a·Zm + b)/(c·Zm + d):
 * <ul>
 *   <li>open/short, fixture = series residual Zs then a stray admittance Yo across the part:
 *       Z = (Zm − Zs)/(1 − (Zm − Zs)·Yo), with Yo = 1/(Zo − Zs) from the readings;</li>
 *   <li>open/short/load, any linear fixture: the map through the three readings, by the
 *       cross-ratio, Z = Zstd·(Zo − Zl)(Zm − Zs)/[(Zl − Zs)(Zo − Zm)], where Zl is the load's
 *       reading and Zstd its known value.</li>
 * </ul>
 * This is the host's own correction; the simulator's meter-side correction is separate code.
 *
 * <p>Immutable and thread-safe. Impedances in ohms, admittances in siemens.
 */
public final class Compensation {
    private static final Compensation NONE = new Compensation(Complex.ONE, Complex.ZERO, Complex.ZERO, Complex.ONE);

    private final Complex a;
    private final Complex b;
    private final Complex c;
    private final Complex d;

    private Compensation(Complex a, Complex b, Complex c, Complex d) {
        this.a = a;
        this.b = b;
        this.c = c;
        this.d = d;
    }

    /** No correction: the reading is returned as it is. */
    public static Compensation none() {
        return NONE;
    }

    /**
     * From the fixture's residuals: a series impedance {@code zSeriesOhm} on the meter side and a
     * shunt admittance {@code yShuntS} across the part. {@code fromResiduals(zs, 0)} is short-only
     * correction, {@code fromResiduals(0, 1/zo)} open-only.
     */
    public static Compensation fromResiduals(Complex zSeriesOhm, Complex yShuntS) {
        return new Compensation(Complex.ONE, zSeriesOhm.negate(), yShuntS.negate(),
                Complex.ONE.add(zSeriesOhm.multiply(yShuntS)));
    }

    /**
     * Exact open/short correction from the readings with the terminals open ({@code zOpenOhm}) and
     * shorted ({@code zShortOhm}): Zs = short reading, Yo = 1/(Zo − Zs).
     *
     * @throws InvalidInputException if the two readings are equal or not finite
     */
    public static Compensation openShort(Complex zOpenOhm, Complex zShortOhm) {
        requireFinite(zOpenOhm, "open");
        requireFinite(zShortOhm, "short");
        Complex openMinusShort = zOpenOhm.subtract(zShortOhm);
        if (openMinusShort.abs() == 0.0) {
            throw new InvalidInputException("the open and short readings are equal (" + zOpenOhm
                    + " Ω): compensation data unusable");
        }
        return fromResiduals(zShortOhm, openMinusShort.reciprocal());
    }

    /**
     * As {@link #openShort}, from the open standard's reading as an admittance {@code yOpenS}
     * (1/Zo), which may be zero: an open whose admittance lies below what the meter can see.
     *
     * @throws InvalidInputException if a value is not finite or the short's reading is the open's
     */
    public static Compensation openShortFromAdmittance(Complex yOpenS, Complex zShortOhm) {
        requireFinite(yOpenS, "open admittance");
        requireFinite(zShortOhm, "short");
        Complex denominator = Complex.ONE.subtract(yOpenS.multiply(zShortOhm));
        if (denominator.abs() == 0.0) {
            throw new InvalidInputException("the open and short readings are equal: compensation data unusable");
        }
        return fromResiduals(zShortOhm, yOpenS.divide(denominator));
    }

    /**
     * As {@link #openShortLoad}, from the open standard's reading as an admittance {@code yOpenS}
     * (1/Zo), which may be zero; the same map with numerator and denominator divided by Zo.
     *
     * @throws InvalidInputException if a value is not finite, the load reads as the short or the
     *         open, or the known load is zero
     */
    public static Compensation openShortLoadFromAdmittance(Complex yOpenS, Complex zShortOhm,
            Complex zLoadMeasuredOhm, Complex zLoadKnownOhm) {
        requireFinite(yOpenS, "open admittance");
        requireFinite(zShortOhm, "short");
        requireFinite(zLoadMeasuredOhm, "load");
        requireFinite(zLoadKnownOhm, "known load");
        Complex loadVsOpen = Complex.ONE.subtract(zLoadMeasuredOhm.multiply(yOpenS));
        if (zLoadMeasuredOhm.subtract(zShortOhm).abs() == 0.0 || loadVsOpen.abs() == 0.0
                || Complex.ONE.subtract(zShortOhm.multiply(yOpenS)).abs() == 0.0 || zLoadKnownOhm.abs() == 0.0) {
            throw new InvalidInputException("the open, short (" + zShortOhm + " Ω) and load (" + zLoadMeasuredOhm
                    + " Ω) readings must all differ and the known load must not be zero");
        }
        Complex k = zLoadKnownOhm.multiply(loadVsOpen).divide(zLoadMeasuredOhm.subtract(zShortOhm));
        return new Compensation(k, k.multiply(zShortOhm).negate(), yOpenS.negate(), Complex.ONE);
    }

    /**
     * Open/short/load correction from the three standards' readings and the load's known value
     * {@code zLoadKnownOhm}; exact for any linear fixture.
     *
     * @throws InvalidInputException if two readings coincide, a value is not finite, or the known
     *         load is zero
     */
    public static Compensation openShortLoad(Complex zOpenOhm, Complex zShortOhm, Complex zLoadMeasuredOhm,
            Complex zLoadKnownOhm) {
        requireFinite(zOpenOhm, "open");
        requireFinite(zShortOhm, "short");
        requireFinite(zLoadMeasuredOhm, "load");
        requireFinite(zLoadKnownOhm, "known load");
        if (zOpenOhm.subtract(zShortOhm).abs() == 0.0 || zLoadMeasuredOhm.subtract(zShortOhm).abs() == 0.0
                || zOpenOhm.subtract(zLoadMeasuredOhm).abs() == 0.0 || zLoadKnownOhm.abs() == 0.0) {
            throw new InvalidInputException("the open (" + zOpenOhm + " Ω), short (" + zShortOhm + " Ω) and load ("
                    + zLoadMeasuredOhm + " Ω) readings must all differ and the known load must not be zero");
        }
        Complex k = zLoadKnownOhm.multiply(zOpenOhm.subtract(zLoadMeasuredOhm))
                .divide(zLoadMeasuredOhm.subtract(zShortOhm));
        return new Compensation(k, k.multiply(zShortOhm).negate(), Complex.ONE.negate(), zOpenOhm);
    }

    /**
     * The part's impedance for a reading {@code zMeasuredOhm}. A reading equal to the open
     * reading maps to {@link Complex#INF}.
     */
    public Complex correct(Complex zMeasuredOhm) {
        Complex denominator = c.multiply(zMeasuredOhm).add(d);
        if (denominator.abs() == 0.0) {
            return Complex.INF;
        }
        return a.multiply(zMeasuredOhm).add(b).divide(denominator);
    }

    /** {@link #correct(Complex)} for an impedance, keeping its frequency. */
    public Impedance correct(Impedance measured) {
        Complex z = correct(measured.toComplex());
        return new Impedance(measured.frequencyHz(), z.getReal(), z.getImaginary());
    }

    private static void requireFinite(Complex z, String what) {
        if (!Double.isFinite(z.getReal()) || !Double.isFinite(z.getImaginary())) {
            throw new InvalidInputException("the " + what + " reading is not a finite impedance: " + z);
        }
    }
}
