package org.zweep.driver.uncertainty;

import java.util.Arrays;
import java.util.EnumMap;
import java.util.Map;
import org.apache.commons.math3.random.RandomGenerator;
import org.apache.commons.math3.random.Well19937c;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/**
 * Propagation of distributions by the Monte Carlo method (JCGM 101:2008): (R, X) is drawn from
 * the bivariate normal distribution with the estimate's covariance, every derived parameter is
 * evaluated for each draw, and its standard deviation and probabilistically symmetric 95 %
 * coverage interval are read from the sorted draws (JCGM 101:2008, 7.6 and 7.7).
 *
 * <p>Reproducible: the same seed gives the same result. Stateless; each call has its own generator.
 */
public final class MonteCarlo {
    /** The coverage factor of a normal distribution for 95 % coverage. */
    static final double NORMAL_95 = 1.959964;

    private MonteCarlo() {
    }

    /**
     * What the Monte Carlo method says about one parameter.
     *
     * @param mean average of the draws
     * @param standardUncertainty standard deviation of the draws
     * @param low95 2.5th percentile
     * @param high95 97.5th percentile
     */
    public record Result(double mean, double standardUncertainty, double low95, double high95) {
    }

    /**
     * Propagates {@code z} to every parameter in {@code parameters} with {@code trials} draws.
     *
     * @throws InvalidInputException if {@code trials} is below 1000
     */
    public static Map<DerivedParameter, Result> propagate(UncertainImpedance z, Iterable<DerivedParameter> parameters,
            int trials, long seed) {
        if (trials < 1000) {
            throw new InvalidInputException("a Monte Carlo propagation needs at least 1000 trials, got " + trials);
        }
        RandomGenerator random = new Well19937c(seed);
        Impedance v = z.value();
        double s = Math.sqrt(1 - z.correlation() * z.correlation());
        Impedance[] draws = new Impedance[trials];
        for (int i = 0; i < trials; i++) {
            double e1 = random.nextGaussian();
            double e2 = random.nextGaussian();
            double r = v.resistanceOhm() + z.uROhm() * e1;
            double x = v.reactanceOhm() + z.uXOhm() * (z.correlation() * e1 + s * e2);
            draws[i] = new Impedance(v.frequencyHz(), r, x);
        }
        Map<DerivedParameter, Result> results = new EnumMap<>(DerivedParameter.class);
        double[] values = new double[trials];
        for (DerivedParameter p : parameters) {
            for (int i = 0; i < trials; i++) {
                values[i] = p.of(draws[i]);
            }
            results.put(p, summarise(values));
        }
        return results;
    }

    private static Result summarise(double[] values) {
        int n = values.length;
        double mean = 0;
        for (double x : values) {
            mean += x / n;
        }
        double ss = 0;
        for (double x : values) {
            ss += (x - mean) * (x - mean);
        }
        double[] sorted = values.clone();
        Arrays.sort(sorted);
        // JCGM 101:2008, 7.7.2: the probabilistically symmetric interval, draws 0.025·M and 0.975·M
        int low = (int) Math.round(0.025 * n);
        int high = (int) Math.round(0.975 * n) - 1;
        return new Result(mean, Math.sqrt(ss / (n - 1)), sorted[Math.max(low, 0)], sorted[Math.min(high, n - 1)]);
    }

    /**
     * Whether the linear propagation is validated by the Monte Carlo one (JCGM 101:2008, 8.2):
     * both ends of the linear 95 % interval y ± 1.96·u (the normal distribution's coverage
     * factor for 95 %) lie within the numerical tolerance {@code toleranceSi} of the Monte Carlo
     * 95 % interval's ends.
     */
    public static boolean validatesLinear(double y, double standardU, Result mc, double toleranceSi) {
        double half = NORMAL_95 * standardU;
        double dLow = Math.abs(y - half - mc.low95());
        double dHigh = Math.abs(y + half - mc.high95());
        return dLow <= toleranceSi && dHigh <= toleranceSi;
    }

    /**
     * The parameters in {@code parameters} whose linear 95 % interval the Monte Carlo method does
     * not validate ({@link #validatesLinear}, tolerance {@link #numericalTolerance} of u to one
     * significant digit, generous enough for the sampling noise of {@code trials} ≥ 100 000
     * draws), with what the Monte Carlo method says instead; empty when the linear law holds for
     * all. A parameter whose linear u is infinite or NaN, or whose value is, is left out.
     */
    public static Map<DerivedParameter, Result> linearFailures(UncertainImpedance z,
            Iterable<DerivedParameter> parameters, int trials, long seed) {
        Map<DerivedParameter, Result> mc = propagate(z, parameters, trials, seed);
        Map<DerivedParameter, Result> out = new EnumMap<>(DerivedParameter.class);
        for (Map.Entry<DerivedParameter, Result> e : mc.entrySet()) {
            double y = e.getKey().of(z.value());
            double u = z.standardUncertainty(e.getKey());
            if (!Double.isFinite(y) || !Double.isFinite(u) || u == 0) {
                continue;
            }
            if (!validatesLinear(y, u, e.getValue(), numericalTolerance(u, 1))) {
                out.put(e.getKey(), e.getValue());
            }
        }
        return out;
    }

    /**
     * The numerical tolerance of a standard uncertainty {@code u} expressed to {@code digits}
     * significant digits: half a unit of its last digit (JCGM 101:2008, 7.9.2).
     */
    public static double numericalTolerance(double u, int digits) {
        double exponent = Math.floor(Math.log10(Math.abs(u))) - (digits - 1);
        return 0.5 * Math.pow(10, exponent);
    }
}
