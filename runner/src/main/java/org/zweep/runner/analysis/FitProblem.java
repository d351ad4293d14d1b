package org.zweep.runner.analysis;

import java.util.Objects;

/**
 * A nonlinear least-squares problem: minimise the sum of squared residuals r(p) over p, with p
 * kept inside [lower, upper]. The solver ({@link LeastSquaresFit}) is separate from the problem.
 *
 * @param residualCount the number m of residuals (at least the number of parameters)
 * @param residuals computes the m residuals at p
 * @param jacobian computes the m × n matrix ∂r_i/∂p_j at p; {@code null} for central differences
 * @param start the starting point (n values, inside the bounds)
 * @param lower the lower bounds (n values, {@code -Infinity} for none)
 * @param upper the upper bounds (n values, {@code +Infinity} for none)
 */
public record FitProblem(int residualCount, Residuals residuals, Jacobian jacobian, double[] start, double[] lower,
        double[] upper) {

    /** The residual function r(p). Must be side-effect free; called from one thread at a time. */
    @FunctionalInterface
    public interface Residuals {
        /** @return the residuals at {@code p} (a new array of length {@code residualCount}) */
        double[] at(double[] p);
    }

    /** The Jacobian of the residuals. */
    @FunctionalInterface
    public interface Jacobian {
        /** @return the residualCount × n matrix of partial derivatives at {@code p} */
        double[][] at(double[] p);
    }

    public FitProblem {
        Objects.requireNonNull(residuals, "residuals");
        start = start.clone();
        lower = lower.clone();
        upper = upper.clone();
        if (lower.length != start.length || upper.length != start.length) {
            throw new IllegalArgumentException("start, lower and upper must have the same length");
        }
        if (residualCount < start.length) {
            throw new IllegalArgumentException("fewer residuals (" + residualCount + ") than parameters ("
                    + start.length + ")");
        }
    }

    /** An unbounded problem. */
    public static FitProblem unbounded(int residualCount, Residuals residuals, Jacobian jacobian, double[] start) {
        double[] lo = new double[start.length];
        double[] hi = new double[start.length];
        java.util.Arrays.fill(lo, Double.NEGATIVE_INFINITY);
        java.util.Arrays.fill(hi, Double.POSITIVE_INFINITY);
        return new FitProblem(residualCount, residuals, jacobian, start, lo, hi);
    }

    /** The number n of parameters. */
    public int parameterCount() {
        return start.length;
    }

    @Override
    public double[] start() {
        return start.clone();
    }

    @Override
    public double[] lower() {
        return lower.clone();
    }

    @Override
    public double[] upper() {
        return upper.clone();
    }
}
