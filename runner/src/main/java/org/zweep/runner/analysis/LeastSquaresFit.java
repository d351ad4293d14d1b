package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.exception.ConvergenceException;
import org.apache.commons.math3.exception.TooManyEvaluationsException;
import org.apache.commons.math3.exception.TooManyIterationsException;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresBuilder;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresOptimizer;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresProblem;
import org.apache.commons.math3.fitting.leastsquares.LevenbergMarquardtOptimizer;
import org.apache.commons.math3.fitting.leastsquares.MultivariateJacobianFunction;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;
import org.apache.commons.math3.linear.SingularValueDecomposition;
import org.apache.commons.math3.util.Pair;

/**
 * Solves a {@link FitProblem} by Levenberg–Marquardt (Commons Math 3, a port of MINPACK's
 * {@code lmder}). Bounds are enforced by clamping each trial point. The library stays inside
 * this class: callers see only {@link FitProblem} and {@link FitResult}.
 *
 * <p>Immutable and thread-safe; {@link #solve} blocks for the duration of the fit.
 */
public final class LeastSquaresFit {
    /** Cosine between the residual vector and any Jacobian column above which a point is not stationary. */
    static final double STATIONARY_COSINE = 1e-6;
    /**
     * A residual sum of squares this small relative to the start's is a zero-residual problem
     * solved to rounding, where the cosine test only sees rounding noise.
     */
    static final double ZERO_RESIDUAL = 1e-20;

    private final int maxIterations;
    private final int maxEvaluations;
    private final double tolerance;
    private final double residualFloor;
    private final double valueScale;
    private final boolean knownWeights;

    private LeastSquaresFit(int maxIterations, int maxEvaluations, double tolerance, double residualFloor,
            double valueScale, boolean knownWeights) {
        this.maxIterations = maxIterations;
        this.maxEvaluations = maxEvaluations;
        this.tolerance = tolerance;
        this.residualFloor = residualFloor;
        this.valueScale = valueScale;
        this.knownWeights = knownWeights;
    }

    /** The default solver: 2,000 iterations, 10,000 evaluations, relative tolerances 1e-12. */
    public static LeastSquaresFit defaults() {
        return new LeastSquaresFit(2_000, 10_000, 1e-12, 0.0, 0.0, false);
    }

    /**
     * A copy whose uncertainties assume a residual standard deviation of at least {@code floor}
     * (the resolution of the data), so that noiseless data do not make every parameter look
     * perfectly determined.
     */
    public LeastSquaresFit withResidualFloor(double floor) {
        return new LeastSquaresFit(maxIterations, maxEvaluations, tolerance, floor, valueScale, knownWeights);
    }

    /**
     * A copy that knows the typical magnitude of the quantities whose difference makes each
     * residual (1 for relative residuals), so that the stationarity test allows for rounding in
     * them: residuals near 1e-12 of that scale are rounding noise, and no point is "more
     * stationary" than that.
     */
    public LeastSquaresFit withValueScale(double scale) {
        return new LeastSquaresFit(maxIterations, maxEvaluations, tolerance, residualFloor, scale, knownWeights);
    }

    /** A copy with another iteration limit. */
    public LeastSquaresFit withMaxIterations(int iterations) {
        return new LeastSquaresFit(iterations, Math.max(maxEvaluations, iterations), tolerance, residualFloor, valueScale,
                knownWeights);
    }

    /**
     * A copy for residuals already divided by their standard uncertainties (whitened): the
     * parameter uncertainties are then those of the weighted covariance (JᵀJ)⁻¹, not scaled by
     * the residual variance, and RSS is the χ² of the fit.
     */
    public LeastSquaresFit withKnownWeights() {
        return new LeastSquaresFit(maxIterations, maxEvaluations, tolerance, 0.0, valueScale, true);
    }

    /** Solves {@code problem}; never throws for a numerical failure (see {@link FitResult#converged()}). */
    public FitResult solve(FitProblem problem) {
        Tracked tracked = new Tracked(problem);
        LeastSquaresProblem lsp = new LeastSquaresBuilder()
                .model(tracked)
                .target(new double[problem.residualCount()])
                .start(problem.start())
                .parameterValidator(tracked::clamp)
                .maxIterations(maxIterations)
                .maxEvaluations(maxEvaluations)
                .lazyEvaluation(false)
                .build();
        LevenbergMarquardtOptimizer lm = new LevenbergMarquardtOptimizer()
                .withCostRelativeTolerance(tolerance)
                .withParameterRelativeTolerance(tolerance)
                .withOrthoTolerance(tolerance);
        boolean libraryConverged;
        int iterations;
        String message;
        try {
            LeastSquaresOptimizer.Optimum optimum = lm.optimize(lsp);
            libraryConverged = true;
            iterations = optimum.getIterations();
            message = "converged";
            tracked.offer(optimum.getPoint().toArray());
        } catch (TooManyEvaluationsException | TooManyIterationsException e) {
            libraryConverged = false;
            iterations = maxIterations;
            message = "stopped: iteration or evaluation limit reached before convergence";
        } catch (ConvergenceException e) {
            // MINPACK's "no further reduction is possible at machine precision": judge the best point ourselves.
            libraryConverged = true;
            iterations = tracked.evaluations;
            message = "stopped at machine precision";
        }
        return finish(problem, tracked.best, libraryConverged, iterations, message);
    }

    private FitResult finish(FitProblem problem, double[] p, boolean libraryConverged, int iterations,
            String message) {
        int m = problem.residualCount();
        int n = problem.parameterCount();
        double[] r = problem.residuals().at(p);
        double rss = 0;
        for (double v : r) {
            rss += v * v;
        }
        double[][] j = jacobian(problem, p);
        boolean finite = Double.isFinite(rss);
        double rms = Math.sqrt(rss / m);
        double cosineLimit = Math.max(STATIONARY_COSINE, 1e3 * Math.ulp(1.0) * valueScale / rms);
        boolean stationary = finite && (stationary(j, r, rss, cosineLimit) || rss <= ZERO_RESIDUAL * startCost(problem));
        double[][] covariance = covariance(j, rss, m, n, residualFloor, knownWeights);
        List<Double> sigma = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            double var = covariance[i][i];
            sigma.add(var >= 0 && Double.isFinite(var) ? Math.sqrt(var) : Double.NaN);
        }
        List<Double> params = new ArrayList<>(n);
        for (double v : p) {
            params.add(v);
        }
        boolean converged = libraryConverged && stationary;
        if (libraryConverged && !stationary) {
            message = "stopped at a point that is not a minimum";
        }
        return new FitResult(params, sigma, rss, rms, iterations, converged, message, covariance);
    }

    private static double startCost(FitProblem problem) {
        double c = 0;
        for (double v : problem.residuals().at(problem.start())) {
            c += v * v;
        }
        return c;
    }

    private static boolean stationary(double[][] j, double[] r, double rss, double cosineLimit) {
        if (rss == 0) {
            return true;
        }
        double rNorm = Math.sqrt(rss);
        int n = j[0].length;
        for (int c = 0; c < n; c++) {
            double dot = 0;
            double colSq = 0;
            for (int i = 0; i < r.length; i++) {
                dot += j[i][c] * r[i];
                colSq += j[i][c] * j[i][c];
            }
            if (colSq == 0) {
                continue;
            }
            if (!(Math.abs(dot) / (Math.sqrt(colSq) * rNorm) <= cosineLimit)) {
                return false;
            }
        }
        return true;
    }

    /**
     * The parameters' covariance (JᵀJ)⁻¹·s², s² = 1 for known weights, else the residual variance
     * (floored); NaN entries where it is singular or m ≤ n.
     */
    private static double[][] covariance(double[][] j, double rss, int m, int n, double floor, boolean knownWeights) {
        double[][] cov = new double[n][n];
        if (m <= n) {
            for (double[] row : cov) {
                java.util.Arrays.fill(row, Double.NaN);
            }
            return cov;
        }
        // covariance (JᵀJ)⁻¹ = V·Σ⁻²·Vᵀ from the SVD of J itself: forming JᵀJ would square its condition number
        SingularValueDecomposition svd = new SingularValueDecomposition(new Array2DRowRealMatrix(j, false));
        double[] sv = svd.getSingularValues();
        RealMatrix v = svd.getV();
        double s2 = knownWeights ? 1.0 : Math.max(rss / (m - n), floor * floor);
        for (int a = 0; a < n; a++) {
            for (int b = 0; b < n; b++) {
                double c = 0;
                for (int k = 0; k < sv.length; k++) {
                    c += v.getEntry(a, k) * v.getEntry(b, k) / (sv[k] * sv[k]);
                }
                cov[a][b] = Double.isFinite(c) ? c * s2 : Double.NaN;
            }
        }
        return cov;
    }

    static double[][] jacobian(FitProblem problem, double[] p) {
        if (problem.jacobian() != null) {
            return problem.jacobian().at(p);
        }
        int m = problem.residualCount();
        int n = p.length;
        double[][] j = new double[m][n];
        for (int c = 0; c < n; c++) {
            double h = 1e-6 * Math.max(Math.abs(p[c]), 1e-3);
            double[] plus = p.clone();
            double[] minus = p.clone();
            plus[c] += h;
            minus[c] -= h;
            double[] rp = problem.residuals().at(plus);
            double[] rm = problem.residuals().at(minus);
            for (int i = 0; i < m; i++) {
                j[i][c] = (rp[i] - rm[i]) / (2 * h);
            }
        }
        return j;
    }

    /** The model the library sees; remembers the lowest-cost point evaluated. */
    private static final class Tracked implements MultivariateJacobianFunction {
        private final FitProblem problem;
        private final double[] lower;
        private final double[] upper;
        double[] best;
        double bestCost = Double.POSITIVE_INFINITY;
        int evaluations;

        Tracked(FitProblem problem) {
            this.problem = problem;
            this.lower = problem.lower();
            this.upper = problem.upper();
            this.best = problem.start();
        }

        RealVector clamp(RealVector v) {
            double[] p = v.toArray();
            for (int i = 0; i < p.length; i++) {
                p[i] = Math.min(upper[i], Math.max(lower[i], p[i]));
            }
            return new ArrayRealVector(p, false);
        }

        void offer(double[] p) {
            double[] r = problem.residuals().at(p);
            double cost = 0;
            for (double v : r) {
                cost += v * v;
            }
            if (cost <= bestCost) {
                bestCost = cost;
                best = p.clone();
            }
        }

        @Override
        public Pair<RealVector, RealMatrix> value(RealVector point) {
            evaluations++;
            double[] p = point.toArray();
            double[] r = problem.residuals().at(p);
            double cost = 0;
            for (double v : r) {
                cost += v * v;
            }
            if (cost < bestCost) {
                bestCost = cost;
                best = p.clone();
            }
            return new Pair<>(new ArrayRealVector(r, false), new Array2DRowRealMatrix(jacobian(problem, p), false));
        }
    }
}
