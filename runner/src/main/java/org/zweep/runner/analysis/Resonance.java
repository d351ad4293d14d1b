package org.zweep.runner.analysis;

import java.util.List;
import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.zweep.driver.impedance.Impedance;

/** Self-resonance: the zero crossing of the reactance, from data or from a model. */
public final class Resonance {
    private Resonance() {
    }

    /**
     * The first frequency where the measured reactance changes sign, by linear interpolation of X
     * in log f between the two points around it; {@code NaN} when X keeps
     * its sign over the whole sweep.
     *
     * @param ascending the sweep sorted by increasing frequency
     */
    public static double fromData(List<Impedance> ascending) {
        for (int i = 1; i < ascending.size(); i++) {
            Impedance a = ascending.get(i - 1);
            Impedance b = ascending.get(i);
            double xa = a.reactanceOhm();
            double xb = b.reactanceOhm();
            if (xa == 0) {
                return a.frequencyHz();
            }
            if (Math.signum(xa) != Math.signum(xb) && xb != 0) {
                double t = xa / (xa - xb);
                return Math.exp(Math.log(a.frequencyHz()) + t * (Math.log(b.frequencyHz()) - Math.log(a.frequencyHz())));
            }
            if (xb == 0 && i == ascending.size() - 1) {
                return b.frequencyHz();
            }
        }
        return Double.NaN;
    }

    /**
     * The standard uncertainty of {@link #fromData}: the crossing f = exp(ln f_a + t·(ln f_b − ln f_a)),
     * t = X_a/(X_a − X_b), propagated from the two points' independent u(X) (JCGM 100:2008,
     * 5.1.2); the interpolation's own error (X not linear in log f) is not included. NaN when X
     * keeps its sign or a u is unknown.
     *
     * @param ascending the sweep sorted by increasing frequency
     * @param uXOhm the standard uncertainty of each point's X, same order
     */
    public static double fromDataUncertainty(List<Impedance> ascending, double[] uXOhm) {
        for (int i = 1; i < ascending.size(); i++) {
            Impedance a = ascending.get(i - 1);
            Impedance b = ascending.get(i);
            double xa = a.reactanceOhm();
            double xb = b.reactanceOhm();
            if (xa == 0 || Math.signum(xa) != Math.signum(xb)) {
                double f = fromData(ascending);
                double span = Math.log(b.frequencyHz()) - Math.log(a.frequencyHz());
                double d2 = (xa - xb) * (xa - xb);
                double dtA = -xb / d2;
                double dtB = xa / d2;
                double uT = Math.hypot(dtA * uXOhm[i - 1], dtB * uXOhm[i]);
                return f * span * uT;
            }
        }
        return Double.NaN;
    }

    /**
     * The zero of {@code reactance(f)} near {@code guessHz} (searched within a factor 4 either
     * side, in log f); {@code NaN} when there is none there.
     */
    static double fromModel(DoubleUnaryOperator reactance, double guessHz) {
        if (!(guessHz > 0) || !Double.isFinite(guessHz)) {
            return Double.NaN;
        }
        double lo = Math.log(guessHz / 4);
        double hi = Math.log(guessHz * 4);
        double xlo = reactance.applyAsDouble(Math.exp(lo));
        double xhi = reactance.applyAsDouble(Math.exp(hi));
        if (!(Math.signum(xlo) * Math.signum(xhi) < 0)) {
            return Double.NaN;
        }
        double root = new BrentSolver(1e-14, 1e-12).solve(200, lf -> reactance.applyAsDouble(Math.exp(lf)), lo, hi);
        return Math.exp(root);
    }
}
