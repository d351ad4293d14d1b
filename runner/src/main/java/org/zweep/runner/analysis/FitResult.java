package org.zweep.runner.analysis;

import java.util.List;

/**
 * The answer to a {@link FitProblem}.
 *
 * @param parameters the best point found (n values)
 * @param sigma the standard uncertainty of each parameter, from the covariance at the solution
 *     scaled by the residual variance RSS/(m − n); {@code NaN} where the covariance is singular
 *     or when m = n
 * @param residualSumOfSquares RSS = Σ r_i² at {@link #parameters}
 * @param residualRms √(RSS/m)
 * @param iterations the optimizer's iterations
 * @param converged true only when the optimizer met its convergence test and the point is
 *     stationary (the residual vector is orthogonal to every Jacobian column to 1e-6, or it
 *     shrank by 10 orders of magnitude from the start: a zero-residual problem solved to rounding);
 *     false means the parameters must not be trusted
 * @param message why it stopped, for people
 * @param covariance the parameters' covariance matrix (n × n, same scaling as {@code sigma}, whose
 *     squares are its diagonal); NaN entries where it cannot be computed
 */
public record FitResult(List<Double> parameters, List<Double> sigma, double residualSumOfSquares, double residualRms,
        int iterations, boolean converged, String message, double[][] covariance) {
    public FitResult {
        parameters = List.copyOf(parameters);
        sigma = List.copyOf(sigma);
        double[][] copy = new double[covariance.length][];
        for (int i = 0; i < copy.length; i++) {
            copy[i] = covariance[i].clone();
        }
        covariance = copy;
    }

    /** The covariance of parameters {@code a} and {@code b}. */
    public double covariance(int a, int b) {
        return covariance[a][b];
    }

    /** Parameter {@code i}. */
    public double parameter(int i) {
        return parameters.get(i);
    }

    /** The uncertainty of parameter {@code i}. */
    public double sigma(int i) {
        return sigma.get(i);
    }
}
