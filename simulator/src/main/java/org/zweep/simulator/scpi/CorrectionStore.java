package org.zweep.simulator.scpi;

import java.util.EnumMap;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;

/**
 * The meter-side open/short/load correction data: each standard acquired over a fixed log grid of
 * frequencies across the meter's range and interpolated in between. Guarded by the instrument's lock.
 */
final class CorrectionStore {
    /** The standards {@code CORRection:COLLect} acquires. */
    enum Standard { OPEN, SHORT, LOAD }

    private static final int POINTS_PER_DECADE = 10;

    private record Curve(double[] frequencyHz, double[] re, double[] im) {
    }

    private final Map<Standard, Curve> curves = new EnumMap<>(Standard.class);

    /** The acquisition grid: {@value #POINTS_PER_DECADE} log-spaced points per decade, both ends included. */
    static double[] grid(double minHz, double maxHz) {
        double decades = Math.log10(maxHz / minHz);
        int n = Math.max(2, (int) Math.ceil(decades * POINTS_PER_DECADE) + 1);
        double[] f = new double[n];
        for (int i = 0; i < n; i++) {
            f[i] = minHz * Math.pow(maxHz / minHz, i / (double) (n - 1));
        }
        f[n - 1] = maxHz;
        return f;
    }

    void store(Standard s, double[] frequencyHz, double[] re, double[] im) {
        curves.put(s, new Curve(frequencyHz.clone(), re.clone(), im.clone()));
    }

    boolean isEmpty() {
        return curves.isEmpty();
    }

    void clear() {
        curves.clear();
    }

    /** Which standards have been acquired. */
    boolean has(Standard s) {
        return curves.containsKey(s);
    }

    /** A copy for one measurement, independent of later acquisitions. */
    CorrectionStore copy() {
        CorrectionStore c = new CorrectionStore();
        c.curves.putAll(curves);
        return c;
    }

    /**
     * The corrected impedance: short only {@code Zm − Zs}; open only {@code Zm / (1 − Zm·Yo)};
     * open and short {@code (Zm − Zs) / (1 − (Zm − Zs)·Yo)}; all three the bilinear
     * open/short/load map onto the load standard's known value {@code loadRef}.
     */
    Complex apply(double frequencyHz, Complex zm, Complex loadRef) {
        Complex zo = at(Standard.OPEN, frequencyHz);
        Complex zs = at(Standard.SHORT, frequencyHz);
        Complex zl = at(Standard.LOAD, frequencyHz);
        Complex s = zs == null ? Complex.ZERO : zs;
        Complex d = zm.subtract(s);
        if (zo == null) {
            return d;
        }
        if (zl == null) {
            return d.divide(Complex.ONE.subtract(d.divide(zo)));
        }
        // three-standard bilinear map: Zdut = Zref (Zo − Zl)(Zm − Zs) / ((Zl − Zs)(Zo − Zm))
        return loadRef.multiply(zo.subtract(zl)).multiply(d).divide(zl.subtract(s).multiply(zo.subtract(zm)));
    }

    private Complex at(Standard s, double f) {
        Curve c = curves.get(s);
        if (c == null) {
            return null;
        }
        double[] x = c.frequencyHz();
        if (f <= x[0]) {
            return new Complex(c.re()[0], c.im()[0]);
        }
        int n = x.length;
        if (f >= x[n - 1]) {
            return new Complex(c.re()[n - 1], c.im()[n - 1]);
        }
        int i = 0;
        while (x[i + 1] < f) {
            i++;
        }
        double t = Math.log(f / x[i]) / Math.log(x[i + 1] / x[i]);
        return new Complex(c.re()[i] + t * (c.re()[i + 1] - c.re()[i]), c.im()[i] + t * (c.im()[i + 1] - c.im()[i]));
    }
}
