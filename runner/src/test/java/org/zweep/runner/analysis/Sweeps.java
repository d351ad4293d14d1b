package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.function.DoubleFunction;
import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.impedance.Impedance;

/** Synthetic sweeps for tests, computed from textbook circuit formulas written out here. */
final class Sweeps {
    private Sweeps() {
    }

    /** {@code n} frequencies log-spaced from {@code fromHz} to {@code toHz}, both included. */
    static double[] logSpaced(double fromHz, double toHz, int n) {
        double[] f = new double[n];
        for (int i = 0; i < n; i++) {
            f[i] = fromHz * Math.pow(toHz / fromHz, i / (double) (n - 1));
        }
        return f;
    }

    /** Series R-L-C: Z = R + jωL + 1/(jωC). */
    static DoubleFunction<Complex> seriesRlc(double r, double l, double c) {
        return f -> {
            double w = 2 * Math.PI * f;
            return new Complex(r, w * l - 1 / (w * c));
        };
    }

    /** (R + jωL) in parallel with C. */
    static DoubleFunction<Complex> rlParallelC(double r, double l, double c) {
        return f -> {
            double w = 2 * Math.PI * f;
            Complex zs = new Complex(r, w * l);
            Complex zc = new Complex(0, -1 / (w * c));
            return zs.multiply(zc).divide(zs.add(zc));
        };
    }

    static List<Impedance> sweep(double[] f, DoubleFunction<Complex> z) {
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
    static List<Impedance> noisy(double[] f, DoubleFunction<Complex> z, double relative, Random random) {
        List<Impedance> out = new ArrayList<>();
        for (double fi : f) {
            Complex v = z.apply(fi);
            double s = relative * v.abs();
            out.add(new Impedance(fi, v.getReal() + s * random.nextGaussian(), v.getImaginary() + s * random.nextGaussian()));
        }
        return out;
    }
}
