package org.zweep.runner.store;

import java.util.List;
import org.apache.commons.math3.stat.descriptive.DescriptiveStatistics;

/**
 * A process's capability from a check's values across runs: n, the mean μ, the sample standard
 * deviation σ (n − 1 in the denominator) and Cpk = min(USL − μ, μ − LSL) / (3σ) against the
 * check's limits (ISO 22514-2; with one limit only that side counts: (USL − μ)/(3σ) or
 * (μ − LSL)/(3σ)). Doubles are in the check's SI unit; {@code NaN} when not defined (fewer than
 * two values, σ = 0, no limit).
 *
 * @param n the number of values
 * @param mean μ
 * @param sigma σ, the sample standard deviation
 * @param lsl the lower specification limit, or {@code NaN}
 * @param usl the upper specification limit, or {@code NaN}
 * @param cpk the capability index
 */
public record Capability(int n, double mean, double sigma, double lsl, double usl, double cpk) {

    /** The capability of {@code values} against {@code lsl} and {@code usl} (either {@code NaN} when absent). */
    public static Capability of(List<Double> values, double lsl, double usl) {
        DescriptiveStatistics s = new DescriptiveStatistics();
        values.forEach(s::addValue);
        int n = values.size();
        double mean = n == 0 ? Double.NaN : s.getMean();
        double sigma = n < 2 ? Double.NaN : s.getStandardDeviation(); // bias-corrected: n - 1
        double upper = (usl - mean) / (3 * sigma);
        double lower = (mean - lsl) / (3 * sigma);
        double cpk;
        if (!(sigma > 0)) {
            cpk = Double.NaN;
        } else if (Double.isNaN(lsl)) {
            cpk = upper;
        } else if (Double.isNaN(usl)) {
            cpk = lower;
        } else {
            cpk = Math.min(upper, lower);
        }
        return new Capability(n, mean, sigma, lsl, usl, cpk);
    }

    /** The lower control limit of an individuals chart, μ − 3σ. */
    public double lcl() {
        return mean - 3 * sigma;
    }

    /** The upper control limit of an individuals chart, μ + 3σ. */
    public double ucl() {
        return mean + 3 * sigma;
    }
}
