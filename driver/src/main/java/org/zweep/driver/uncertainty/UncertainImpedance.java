package org.zweep.driver.uncertainty;

import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/**
 * An impedance estimate with the standard uncertainties of its real and imaginary parts and their
 * correlation: the 2×2 covariance of (R, X). Every derived parameter's standard uncertainty, and
 * the covariance of any two of them, follow by the law of propagation of uncertainty with
 * correlated inputs, u²(p) = g Σ gᵀ with g = (∂p/∂R, ∂p/∂X) (JCGM 100:2008, 5.2.2 and H.2).
 *
 * <p>The linear law is a first-order approximation: where a parameter is strongly non-linear
 * within ±u (D or Q near 0 or ∞, Cs near resonance) check it with {@link MonteCarlo}.
 *
 * <p>Immutable and thread-safe. Uncertainties in ohms; the correlation is in [−1, 1].
 *
 * @param value the estimate
 * @param uROhm standard uncertainty of R, in ohms (not negative)
 * @param uXOhm standard uncertainty of X, in ohms (not negative)
 * @param correlation correlation coefficient r(R, X)
 */
public record UncertainImpedance(Impedance value, double uROhm, double uXOhm, double correlation) {

    /** The coverage factor zweep reports expanded uncertainties with (about 95 % for a normal distribution). */
    public static final double COVERAGE_FACTOR = 2.0;

    /** @throws InvalidInputException if an uncertainty is negative or not finite, or |r| &gt; 1 */
    public UncertainImpedance {
        if (!(uROhm >= 0) || !(uXOhm >= 0) || Double.isInfinite(uROhm) || Double.isInfinite(uXOhm)) {
            throw new InvalidInputException("standard uncertainties must be finite and not negative, got u(R) = "
                    + uROhm + " Ω, u(X) = " + uXOhm + " Ω");
        }
        if (!(Math.abs(correlation) <= 1.0)) {
            throw new InvalidInputException("a correlation coefficient must be from -1 to 1, got " + correlation);
        }
    }

    /** An estimate without uncertainty. */
    public static UncertainImpedance exact(Impedance value) {
        return new UncertainImpedance(value, 0, 0, 0);
    }

    /** From the covariance of (R, X) in Ω²; a zero variance gives a zero correlation. */
    public static UncertainImpedance fromCovariance(Impedance value, double varR, double varX, double covRX) {
        double uR = Math.sqrt(Math.max(varR, 0));
        double uX = Math.sqrt(Math.max(varX, 0));
        double r = uR == 0 || uX == 0 ? 0 : Math.max(-1, Math.min(1, covRX / (uR * uX)));
        return new UncertainImpedance(value, uR, uX, r);
    }

    /**
     * From the standard uncertainties of the magnitude (ohms) and phase (degrees) and their
     * correlation, propagated to (R, X) with R = |Z|cos θ, X = |Z|sin θ.
     */
    public static UncertainImpedance fromPolar(Impedance value, double uMagnitudeOhm, double uPhaseDeg,
            double correlation) {
        double m = value.magnitudeOhm();
        double t = Math.atan2(value.reactanceOhm(), value.resistanceOhm());
        double uT = Math.toRadians(uPhaseDeg);
        double c = Math.cos(t);
        double s = Math.sin(t);
        // J = [[cos θ, −|Z| sin θ], [sin θ, |Z| cos θ]] applied to the (|Z|, θ) covariance
        double vM = uMagnitudeOhm * uMagnitudeOhm;
        double vT = uT * uT;
        double cMT = correlation * uMagnitudeOhm * uT;
        double varR = c * c * vM + m * m * s * s * vT - 2 * c * m * s * cMT;
        double varX = s * s * vM + m * m * c * c * vT + 2 * s * m * c * cMT;
        double covRX = c * s * vM - m * m * s * c * vT + (c * m * c - s * m * s) * cMT;
        return fromCovariance(value, varR, varX, covRX);
    }

    /**
     * The contribution of this estimate's uncertainty to an output Z_out = g(Z) of a holomorphic
     * map g with derivative {@code derivative} = g'(Z) = a + jb at this estimate: the covariance
     * J Σ Jᵀ with J = [[a, −b], [b, a]] (the Cauchy–Riemann form of the real Jacobian), as an
     * uncertain {@code output}.
     */
    public UncertainImpedance through(Impedance output, org.apache.commons.math3.complex.Complex derivative) {
        double a = derivative.getReal();
        double b = derivative.getImaginary();
        double vr = varianceR();
        double vx = varianceX();
        double c = covarianceRX();
        double varR = a * a * vr - 2 * a * b * c + b * b * vx;
        double varX = b * b * vr + 2 * a * b * c + a * a * vx;
        double cov = a * b * vr + (a * a - b * b) * c - a * b * vx;
        return fromCovariance(output, varR, varX, cov);
    }

    /** Variance of R in Ω². */
    public double varianceR() {
        return uROhm * uROhm;
    }

    /** Variance of X in Ω². */
    public double varianceX() {
        return uXOhm * uXOhm;
    }

    /** Covariance of R and X in Ω². */
    public double covarianceRX() {
        return correlation * uROhm * uXOhm;
    }

    /**
     * The sum of two independent contributions to the same estimate (covariances add); the value
     * is this one's.
     */
    public UncertainImpedance plus(UncertainImpedance other) {
        return fromCovariance(value, varianceR() + other.varianceR(), varianceX() + other.varianceX(),
                covarianceRX() + other.covarianceRX());
    }

    /**
     * Standard uncertainty of {@code p} by the linear law, in the parameter's SI unit; +∞ where
     * its sensitivity is infinite (the parameter is infinite or the law has no meaning there).
     */
    public double standardUncertainty(DerivedParameter p) {
        double v = covariance(p, p);
        return Double.isNaN(v) ? Double.POSITIVE_INFINITY : Math.sqrt(Math.max(v, 0));
    }

    /** Expanded uncertainty U = k·u with k = {@value #COVERAGE_FACTOR}. */
    public double expandedUncertainty(DerivedParameter p) {
        return COVERAGE_FACTOR * standardUncertainty(p);
    }

    /** Covariance of two derived parameters, g_p Σ g_qᵀ, in the product of their units. */
    public double covariance(DerivedParameter p, DerivedParameter q) {
        double[] gp = Sensitivity.of(p, value);
        double[] gq = Sensitivity.of(q, value);
        double cov = covarianceRX();
        return gp[0] * gq[0] * varianceR() + gp[1] * gq[1] * varianceX() + (gp[0] * gq[1] + gp[1] * gq[0]) * cov;
    }

    /** Correlation coefficient of two derived parameters; NaN when either has no finite, non-zero uncertainty. */
    public double correlation(DerivedParameter p, DerivedParameter q) {
        double up = standardUncertainty(p);
        double uq = standardUncertainty(q);
        if (!(up > 0) || !(uq > 0) || Double.isInfinite(up) || Double.isInfinite(uq)) {
            return Double.NaN;
        }
        return Math.max(-1, Math.min(1, covariance(p, q) / (up * uq)));
    }
}
