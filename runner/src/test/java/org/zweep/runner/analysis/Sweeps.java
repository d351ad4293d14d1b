package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.function.DoubleFunction;
import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.impedance.Impedance;

/** Synthetic sweeps for tests, computed from textbook circuit formulas written out here. */
public final class Sweeps {
    private Sweeps() {
    }

    /** {@code n} frequencies log-spaced from {@code fromHz} to {@code toHz}, both included. */
    public static double[] logSpaced(double fromHz, double toHz, int n) {
        double[] f = new double[n];
        for (int i = 0; i < n; i++) {
            f[i] = fromHz * Math.pow(toHz / fromHz, i / (double) (n - 1));
        }
        return f;
    }

    /** Series R-L-C: Z = R + jωL + 1/(jωC). */
    public static DoubleFunction<Complex> seriesRlc(double r, double l, double c) {
        return f -> {
            double w = 2 * Math.PI * f;
            return new Complex(r, w * l - 1 / (w * c));
        };
    }

    /** (R + jωL) in parallel with C. */
    public static DoubleFunction<Complex> rlParallelC(double r, double l, double c) {
        return f -> {
            double w = 2 * Math.PI * f;
            Complex zs = new Complex(r, w * l);
            Complex zc = new Complex(0, -1 / (w * c));
            return zs.multiply(zc).divide(zs.add(zc));
        };
    }

    /** R + jωL in series with C ∥ Rp: Z = R + jωL + 1/(1/Rp + jωC). */
    public static DoubleFunction<Complex> leakyCapacitor(double r, double l, double c, double rp) {
        return f -> {
            double w = 2 * Math.PI * f;
            return new Complex(r, w * l).add(new Complex(1 / rp, w * c).reciprocal());
        };
    }

    /** R + jωL in series with a lossy C: Y_C = ωC·(tan δ + j), i.e. Z_C = (tan δ − j)/(ωC(1 + tan²δ)). */
    public static DoubleFunction<Complex> lossyCapacitor(double r, double l, double c, double tanDelta) {
        return f -> {
            double w = 2 * Math.PI * f;
            double k = 1 / (w * c * (1 + tanDelta * tanDelta));
            return new Complex(r + tanDelta * k, w * l - k);
        };
    }

    /** (R + jωL) ∥ C ∥ Rcore, from the admittances: Y = 1/(R + jωL) + jωC + 1/Rcore. */
    public static DoubleFunction<Complex> inductorWithCoreLoss(double r, double l, double c, double rCore) {
        return f -> {
            double w = 2 * Math.PI * f;
            return new Complex(r, w * l).reciprocal().add(new Complex(1 / rCore, w * c)).reciprocal();
        };
    }

    public static List<Impedance> sweep(double[] f, DoubleFunction<Complex> z) {
        List<Impedance> out = new ArrayList<>();
        for (double fi : f) {
            Complex v = z.apply(fi);
            out.add(new Impedance(fi, v.getReal(), v.getImaginary()));
        }
        return out;
    }

    /**
     * As {@link #sweep}, with independent Gaussian noise of standard deviation {@code relative}·|Z|
     * added to R and to X.
     */
    public static List<Impedance> noisy(double[] f, DoubleFunction<Complex> z, double relative, Random random) {
        List<Impedance> out = new ArrayList<>();
        for (double fi : f) {
            Complex v = z.apply(fi);
            double s = relative * v.abs();
            out.add(new Impedance(fi, v.getReal() + s * random.nextGaussian(), v.getImaginary() + s * random.nextGaussian()));
        }
        return out;
    }
}
