package org.zweep.runner.analysis;

import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.uncertainty.UncertainImpedance;

/**
 * A relative error shared by every point of a sweep: each measured impedance is Z·(1 + δ) with one
 * complex δ = δr + jδi for the whole sweep, such as the error of the load standard's stated value
 * in an open/short/load correction (the corrected value is proportional to it, so δ = ΔZ_std/Z_std
 * passes one to one to every point). A fit must not treat it as independent from point to point,
 * where it would average down with the number of points; {@link EquivalentCircuitFit#fitWeighted(
 * CircuitModel, java.util.List, CommonError)} takes it out of the points' weights and adds it to
 * the fitted values afterwards, through their sensitivity to δ.
 *
 * @param uRe the standard uncertainty of δr (a fraction)
 * @param uIm the standard uncertainty of δi (a fraction)
 * @param correlation r(δr, δi)
 */
public record CommonError(double uRe, double uIm, double correlation) {
    /** No common error. */
    public static final CommonError NONE = new CommonError(0, 0, 0);

    /** Whether there is any. */
    public boolean none() {
        return !(uRe > 0) && !(uIm > 0);
    }

    /**
     * The common error of every value corrected with a load standard stated as {@code load}:
     * δ = ΔZ_std/Z_std, so (δr, δi) = w·(ΔR, ΔX) with w = 1/Z_std as a 2 × 2 real matrix
     * (JCGM 100:2008, 5.2.2, the law of propagation for correlated inputs); {@link #NONE} for
     * null or an exact load.
     */
    public static CommonError ofLoadStandard(UncertainImpedance load) {
        if (load == null || (load.uROhm() == 0 && load.uXOhm() == 0)) {
            return NONE;
        }
        Complex w = load.value().toComplex().reciprocal();
        double a = w.getReal();
        double b = w.getImaginary();
        double vr = load.varianceR();
        double vx = load.varianceX();
        double c = load.covarianceRX();
        // δr = a·ΔR − b·ΔX, δi = b·ΔR + a·ΔX
        double varRe = a * a * vr + b * b * vx - 2 * a * b * c;
        double varIm = b * b * vr + a * a * vx + 2 * a * b * c;
        double cov = a * b * vr - a * b * vx + (a * a - b * b) * c;
        double uRe = Math.sqrt(Math.max(varRe, 0));
        double uIm = Math.sqrt(Math.max(varIm, 0));
        double r = uRe > 0 && uIm > 0 ? Math.max(-1, Math.min(1, cov / (uRe * uIm))) : 0;
        return new CommonError(uRe, uIm, r);
    }

    /** The covariance of δ as {var(δr), var(δi), cov(δr, δi)}. */
    double[] covariance() {
        return new double[] {uRe * uRe, uIm * uIm, correlation * uRe * uIm};
    }

    /**
     * The part of a point's covariance this error makes: with Z = R + jX, ΔR = R·δr − X·δi and
     * ΔX = X·δr + R·δi; {var(R), var(X), cov(R, X)}.
     */
    double[] pointCovariance(double rOhm, double xOhm) {
        double[] d = covariance();
        double vr = rOhm * rOhm * d[0] + xOhm * xOhm * d[1] - 2 * rOhm * xOhm * d[2];
        double vx = xOhm * xOhm * d[0] + rOhm * rOhm * d[1] + 2 * rOhm * xOhm * d[2];
        double c = rOhm * xOhm * (d[0] - d[1]) + (rOhm * rOhm - xOhm * xOhm) * d[2];
        return new double[] {vr, vx, c};
    }
}
