package org.zweep.runner.analysis;

import org.zweep.driver.impedance.Unit;
import org.zweep.runner.text.Figures;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.uncertainty.UncertainImpedance;

/**
 * Fits a {@link CircuitModel} to an impedance sweep by complex nonlinear least squares
 * (CNLS, J. R. Macdonald and L. D. Potter, Solid State Ionics 23 (1987) 61–79): parameters in log space (positive, comparable scales), residuals
 * (Z_model − Z)/|Z| with real and imaginary parts stacked (modulus weighting), Levenberg–Marquardt
 * from starting values computed from the data, uncertainties from the covariance at the solution.
 *
 * <p>An element the data cannot resolve (its relative uncertainty above 1/3, or it ran into its
 * bound, typically ESL or a parallel C when the sweep stays far below resonance) is reported as
 * {@code null} and the fit is repeated without it, so the other values are not disturbed.
 *
 * <p>{@link #fitWeighted} instead divides each point's residual by its standard uncertainties
 * (whitened with the Cholesky factor of its (R, X) covariance), so the parameter uncertainties
 * are those of the weighted covariance and the fit has a χ²; when the reduced χ² is beyond its
 * 99.9th percentile for the degrees of freedom, a note says the model does not fit. An error
 * common to every point ({@link CommonError}, such as the load standard's) is taken out of the
 * weights and added to the fitted values' covariance afterwards: Σ_p += S·Σ_δ·Sᵀ with
 * S = (JᵀJ)⁻¹Jᵀ·∂r/∂δ the parameters' sensitivity to δ at the solution (JCGM 100:2008, 5.2.2), so it
 * does not average down with the number of points.
 *
 * <p>Stateless and thread-safe; {@link #fit} blocks for the fit (well under a millisecond per
 * point).
 */
public final class EquivalentCircuitFit {
    /** Above this relative uncertainty a parameter counts as not resolved (value under 3σ). */
    static final double MAX_RELATIVE_SIGMA = 1.0 / 3.0;
    /** The relative resolution assumed for any data, so noiseless data still give honest uncertainties. */
    static final double RESOLUTION = 1e-7;
    /** How far (a factor) a minor element may move from its starting value. */
    private static final double MINOR_RANGE = 1e7;
    /** How far (a factor) the main element may move from its starting value. */
    private static final double MAIN_RANGE = 1e3;

    /** A reduced χ² whose upper-tail probability is below this says the model does not fit. */
    static final double MISFIT_PROBABILITY = 1e-3;

    private EquivalentCircuitFit() {
    }

    /** One point and the lower-triangular factor L of the covariance its residual is divided by. */
    private record Point(Impedance z, double l11, double l21, double l22) {
        static Point unweighted(Impedance z) {
            return new Point(z, z.magnitudeOhm(), 0, z.magnitudeOhm());
        }

        static Point weighted(UncertainImpedance u) {
            double l11 = u.uROhm();
            double l21 = u.covarianceRX() / l11;
            double l22 = Math.sqrt(Math.max(u.varianceX() - l21 * l21, 0));
            return new Point(u.value(), l11, l21, l22);
        }
    }

    /**
     * Fits {@code model} to {@code sweep} weighted by each point's standard uncertainties.
     *
     * @throws InvalidInputException as {@link #fit}, or when a point has no positive, finite
     *     u(R) and u(X) or its R and X are fully correlated
     */
    public static CircuitFit fitWeighted(CircuitModel model, List<UncertainImpedance> sweep) {
        return fitWeighted(model, sweep, CommonError.NONE);
    }

    /**
     * As {@link #fitWeighted(CircuitModel, List)}, with {@code common} (included in each point's
     * uncertainty) treated as one error shared by all points: the fit is weighted by what remains
     * of each point's covariance without it, and its contribution to the fitted values is added
     * to their covariance afterwards.
     */
    public static CircuitFit fitWeighted(CircuitModel model, List<UncertainImpedance> sweep, CommonError common) {
        List<Point> points = new ArrayList<>();
        for (UncertainImpedance total : sweep) {
            UncertainImpedance u = common.none() ? total : withoutCommon(total, common);
            Point p = Point.weighted(u);
            if (!(p.l11 > 0) || !(p.l22 > 0) || !Double.isFinite(p.l11) || !Double.isFinite(p.l22)) {
                throw new InvalidInputException("cannot weight a fit by u(R) = " + Figures.format(u.uROhm(), Unit.OHM)
                        + ", u(X) = " + Figures.format(u.uXOhm(), Unit.OHM) + ", r = " + Figures.number(u.correlation(), 4)
                        + " at " + Figures.format(u.value().frequencyHz(), Unit.HERTZ, 6));
            }
            points.add(p);
        }
        return fit(model, points, true, common);
    }

    /** The smallest share of a point's variance kept when the common part is taken out of it. */
    static final double INDEPENDENT_FLOOR = 1e-6;

    /** {@code total} less the covariance {@code common} makes at its value (floored, kept positive definite). */
    static UncertainImpedance withoutCommon(UncertainImpedance total, CommonError common) {
        double[] c = common.pointCovariance(total.value().resistanceOhm(), total.value().reactanceOhm());
        double vr = Math.max(total.varianceR() - c[0], INDEPENDENT_FLOOR * total.varianceR());
        double vx = Math.max(total.varianceX() - c[1], INDEPENDENT_FLOOR * total.varianceX());
        double cov = total.covarianceRX() - c[2];
        double limit = 0.999 * Math.sqrt(vr * vx);
        return UncertainImpedance.fromCovariance(total.value(), vr, vx, Math.max(-limit, Math.min(limit, cov)));
    }

    /**
     * Fits {@code model} to {@code sweep} (one impedance per frequency, any order).
     *
     * @throws InvalidInputException when the sweep has fewer distinct frequencies than the model
     *     has parameters plus one, or a zero impedance
     */
    public static CircuitFit fit(CircuitModel model, List<Impedance> sweep) {
        return fit(model, sweep.stream().map(Point::unweighted).toList(), false, CommonError.NONE);
    }

    private static CircuitFit fit(CircuitModel model, List<Point> sweepPoints, boolean weighted, CommonError common) {
        List<Point> points = new ArrayList<>(sweepPoints);
        points.sort(Comparator.comparingDouble(p -> p.z.frequencyHz()));
        List<Impedance> data = points.stream().map(Point::z).toList();
        long distinct = data.stream().mapToDouble(Impedance::frequencyHz).distinct().count();
        if (distinct < model.keys().size() + 1) {
            throw new InvalidInputException("a " + model.id() + " fit needs at least " + (model.keys().size() + 1)
                    + " frequencies, the sweep has " + distinct);
        }
        for (Impedance z : data) {
            if (!(z.magnitudeOhm() > 0) || !Double.isFinite(z.magnitudeOhm())) {
                throw new InvalidInputException("cannot fit an impedance of " + Figures.format(z.magnitudeOhm(), Unit.OHM)
                        + " at " + Figures.format(z.frequencyHz(), Unit.HERTZ, 6));
            }
        }
        double srfData = Resonance.fromData(data);
        double[] start = StartValues.of(model, data, srfData);
        int n = start.length;
        boolean[] present = new boolean[n];
        java.util.Arrays.fill(present, true);
        double[] current = start.clone();
        List<String> notes = new ArrayList<>();
        Pass pass;
        boolean first = true;
        while (true) {
            pass = solve(model, points, current, start, present, weighted);
            if (first && (worstUnresolved(model, pass, present) >= 0 || !pass.result.converged())) {
                pass = bestOfRestarts(model, points, start, present, pass, weighted);
            }
            first = false;
            current = pass.physical;
            int drop = worstUnresolved(model, pass, present);
            if (drop < 0) {
                break;
            }
            notes.add(model.keys().get(drop) + " not resolved by the data (" + pass.reason(drop)
                    + "); left out of the model");
            present[drop] = false;
            current[drop] = model.absentValue(drop);
        }
        if (!common.none()) {
            pass = pass.withCommon(commonCovariance(model, points, pass, present, common));
            notes.add(String.format(Locale.ROOT, "an error common to every point (the load standard's stated"
                    + " uncertainty, %.2g %% of |Z|) is added to the fitted values after the fit, not averaged over"
                    + " the points", 100 * Math.max(common.uRe(), common.uIm())));
        }
        Map<String, Double> values = new LinkedHashMap<>();
        Map<String, Double> sigmas = new LinkedHashMap<>();
        for (int k = 0; k < n; k++) {
            values.put(model.keys().get(k), present[k] ? pass.physical[k] : null);
            sigmas.put(model.keys().get(k), present[k] ? pass.physical[k] * pass.logSigma[k] : null);
        }
        double[] finalP = pass.physical;
        Double srfFit = srfOfFit(model, finalP, present);
        double srfFitU = srfFit == null ? Double.NaN : srfUncertainty(model, pass, present, srfFit);
        double srfDataU = weighted && Double.isFinite(srfData) ? Resonance.fromDataUncertainty(data,
                points.stream().mapToDouble(p -> Math.hypot(p.l21, p.l22)).toArray()) : Double.NaN;
        if (!pass.result.converged()) {
            notes.add("the fit did not converge: " + pass.result.message());
        }
        if (srfFit == null && Double.isFinite(srfData)) {
            notes.add("the measured reactance crosses zero at " + Figures.format(srfData, Unit.HERTZ, 6)
                    + " but the fitted circuit does not resonate there");
        }
        double reducedChiSquared = Double.NaN;
        if (weighted) {
            int dof = 2 * data.size() - (int) java.util.stream.IntStream.range(0, n).filter(k -> present[k]).count();
            double chi2 = pass.result.residualSumOfSquares();
            reducedChiSquared = chi2 / dof;
            double tail = 1 - new ChiSquaredDistribution(null, dof).cumulativeProbability(chi2);
            if (tail < MISFIT_PROBABILITY) {
                notes.add(String.format(Locale.ROOT, "the %s model does not fit the data within their uncertainties"
                        + " (reduced chi-squared %.3g over %d degrees of freedom, probability %.1g)", model.id(),
                        reducedChiSquared, dof, tail));
            }
        }
        return new CircuitFit(model, values, sigmas, srfFit, Double.isFinite(srfData) ? srfData : null,
                relativeRms(model, data, finalP), pass.result.iterations(), pass.result.converged(), data.size(),
                notes, reducedChiSquared, srfFitU, srfDataU);
    }

    /**
     * The standard uncertainty of the fitted circuit's self-resonance, by the law of propagation
     * from the fitted parameters' covariance (JCGM 100:2008, 5.2.2): u² = g Σ gᵀ with g the
     * sensitivities of the resonance to the log-parameters (central differences of the
     * resonance itself); NaN when a sensitivity or the covariance cannot be computed.
     */
    private static double srfUncertainty(CircuitModel model, Pass pass, boolean[] present, double srfHz) {
        int n = present.length;
        double[] g = new double[n];
        double h = 1e-5;
        for (int k = 0; k < n; k++) {
            if (!present[k]) {
                continue;
            }
            double[] plus = pass.physical.clone();
            double[] minus = pass.physical.clone();
            plus[k] *= Math.exp(h);
            minus[k] *= Math.exp(-h);
            Double fp = srfOfFit(model, plus, present);
            Double fm = srfOfFit(model, minus, present);
            if (fp == null || fm == null) {
                return Double.NaN;
            }
            g[k] = (fp - fm) / (2 * h);
        }
        double var = 0;
        for (int a = 0; a < n; a++) {
            for (int b = 0; b < n; b++) {
                if (present[a] && present[b]) {
                    var += g[a] * g[b] * pass.logCovariance[a][b];
                }
            }
        }
        return var >= 0 && Double.isFinite(var) ? Math.sqrt(var) : Double.NaN;
    }

    /**
     * The covariance of the log-parameters that {@code common} makes: S·Σ_δ·Sᵀ, S = (JᵀJ)⁻¹·Jᵀ·E,
     * where J is the whitened Jacobian at the solution and E the whitened change of the data for a
     * unit δr and δi (ΔZ_i = Z_i and ΔZ_i = jZ_i); n × n over all parameters, zero where absent.
     */
    private static double[][] commonCovariance(CircuitModel model, List<Point> points, Pass pass, boolean[] present,
            CommonError common) {
        int n = present.length;
        int[] active = java.util.stream.IntStream.range(0, n).filter(k -> present[k]).toArray();
        int m = 2 * points.size();
        double[][] j = new double[m][active.length];
        double[][] e = new double[m][2];
        for (int i = 0; i < points.size(); i++) {
            Point pt = points.get(i);
            Complex[] d = model.logDerivatives(pt.z.omega(), pass.physical, active);
            for (int a = 0; a < active.length; a++) {
                j[2 * i][a] = d[a].getReal() / pt.l11;
                j[2 * i + 1][a] = (d[a].getImaginary() - pt.l21 * j[2 * i][a]) / pt.l22;
            }
            double r = pt.z.resistanceOhm();
            double x = pt.z.reactanceOhm();
            double[][] dz = {{r, x}, {-x, r}}; // δr = 1: ΔZ = Z; δi = 1: ΔZ = jZ
            for (int c = 0; c < 2; c++) {
                e[2 * i][c] = dz[c][0] / pt.l11;
                e[2 * i + 1][c] = (dz[c][1] - pt.l21 * e[2 * i][c]) / pt.l22;
            }
        }
        // (JᵀJ)⁻¹ by SVD of J (as the fit's own covariance), then S = (JᵀJ)⁻¹·Jᵀ·E
        org.apache.commons.math3.linear.RealMatrix jm = new org.apache.commons.math3.linear.Array2DRowRealMatrix(j,
                false);
        org.apache.commons.math3.linear.RealMatrix s = new org.apache.commons.math3.linear.SingularValueDecomposition(jm)
                .getSolver().getInverse().multiply(new org.apache.commons.math3.linear.Array2DRowRealMatrix(e, false));
        double[] dc = common.covariance();
        double[][] sigmaDelta = {{dc[0], dc[2]}, {dc[2], dc[1]}};
        double[][] out = new double[n][n];
        for (int a = 0; a < active.length; a++) {
            for (int b = 0; b < active.length; b++) {
                double v = 0;
                for (int p = 0; p < 2; p++) {
                    for (int q = 0; q < 2; q++) {
                        v += s.getEntry(a, p) * sigmaDelta[p][q] * s.getEntry(b, q);
                    }
                }
                out[active[a]][active[b]] = v;
            }
        }
        return out;
    }

    /** RMS of (Z_model − Z)/|Z|, real and imaginary parts stacked. */
    private static double relativeRms(CircuitModel model, List<Impedance> data, double[] p) {
        double ss = 0;
        for (Impedance z : data) {
            Complex zm = model.impedance(z.omega(), p);
            double m = z.magnitudeOhm();
            double dr = (zm.getReal() - z.resistanceOhm()) / m;
            double dx = (zm.getImaginary() - z.reactanceOhm()) / m;
            ss += dr * dr + dx * dx;
        }
        return Math.sqrt(ss / (2 * data.size()));
    }

    /**
     * The data's closed-form start can put a minor element where the cost surface is flat (a
     * resistor's Ls hidden behind its Cp, say); try each minor element 100× larger and smaller and
     * keep the lowest-cost fit.
     */
    private static Pass bestOfRestarts(CircuitModel model, List<Point> data, double[] start, boolean[] present,
            Pass best, boolean weighted) {
        for (int k = 1; k < start.length; k++) {
            for (double factor : new double[] {100, 0.01}) {
                double[] s = start.clone();
                s[k] *= factor;
                Pass p = solve(model, data, s, s, present, weighted);
                if (p.result.converged() && p.result.residualSumOfSquares() < best.result.residualSumOfSquares()) {
                    best = p;
                }
            }
        }
        return best;
    }

    /** The self-resonance of the fitted circuit, or null when the element that sets it is absent. */
    private static Double srfOfFit(CircuitModel model, double[] p, boolean[] present) {
        double lc;
        if (model.capacitive()) {
            if (!present[2]) {
                return null;
            }
            lc = p[0] * p[2];
        } else if (model == CircuitModel.RESISTOR) {
            if (!present[1] || !present[2]) {
                return null;
            }
            lc = p[1] * p[2];
        } else {
            if (!present[2]) {
                return null;
            }
            lc = p[0] * p[2];
        }
        double guess = 1 / (2 * Math.PI * Math.sqrt(lc));
        double f = Resonance.fromModel(fHz -> model.impedance(2 * Math.PI * fHz, p).getImaginary(), guess);
        return Double.isFinite(f) ? f : null;
    }

    /** The index of the least-resolved minor parameter still present, or −1 when all are resolved. */
    private static int worstUnresolved(CircuitModel model, Pass pass, boolean[] present) {
        int worst = -1;
        double worstScore = 0;
        for (int k = 1; k < present.length; k++) {
            if (!present[k]) {
                continue;
            }
            double score = pass.atBound[k] || !Double.isFinite(pass.logSigma[k])
                    ? Double.POSITIVE_INFINITY
                    : pass.logSigma[k];
            if (score > MAX_RELATIVE_SIGMA && (worst < 0 || score > worstScore)) {
                worst = k;
                worstScore = score;
            }
        }
        return worst;
    }

    private static Pass solve(CircuitModel model, List<Point> data, double[] physical, double[] start,
            boolean[] present, boolean weighted) {
        int n = physical.length;
        int[] active = java.util.stream.IntStream.range(0, n).filter(k -> present[k]).toArray();
        int m = 2 * data.size();
        double[] omega = new double[data.size()];
        double[] re = new double[data.size()];
        double[] im = new double[data.size()];
        double[] l11 = new double[data.size()];
        double[] l21 = new double[data.size()];
        double[] l22 = new double[data.size()];
        for (int i = 0; i < omega.length; i++) {
            Impedance z = data.get(i).z;
            omega[i] = z.omega();
            re[i] = z.resistanceOhm();
            im[i] = z.reactanceOhm();
            l11[i] = data.get(i).l11;
            l21[i] = data.get(i).l21;
            l22[i] = data.get(i).l22;
        }
        double[] lo = new double[active.length];
        double[] hi = new double[active.length];
        double[] p0 = new double[active.length];
        for (int a = 0; a < active.length; a++) {
            int k = active[a];
            double range = Math.log(k == 0 ? MAIN_RANGE : MINOR_RANGE);
            lo[a] = Math.log(start[k]) - range;
            hi[a] = Math.log(start[k]) + range;
            p0[a] = Math.min(hi[a], Math.max(lo[a], Math.log(physical[k])));
        }
        FitProblem problem = new FitProblem(m, lp -> {
            double[] p = expand(physical, active, lp);
            double[] r = new double[m];
            for (int i = 0; i < omega.length; i++) {
                Complex zm = model.impedance(omega[i], p);
                // L⁻¹·Δ: Δ divided by the Cholesky factor of the point's covariance (or by |Z| unweighted)
                r[2 * i] = (zm.getReal() - re[i]) / l11[i];
                r[2 * i + 1] = (zm.getImaginary() - im[i] - l21[i] * r[2 * i]) / l22[i];
            }
            return r;
        }, lp -> {
            double[] p = expand(physical, active, lp);
            double[][] j = new double[m][active.length];
            for (int i = 0; i < omega.length; i++) {
                Complex[] d = model.logDerivatives(omega[i], p, active);
                for (int a = 0; a < active.length; a++) {
                    j[2 * i][a] = d[a].getReal() / l11[i];
                    j[2 * i + 1][a] = (d[a].getImaginary() - l21[i] * j[2 * i][a]) / l22[i];
                }
            }
            return j;
        }, p0, lo, hi);
        double scale = 1;
        for (int i = 0; i < omega.length; i++) {
            scale = Math.max(scale, Math.hypot(re[i], im[i]) / Math.min(l11[i], l22[i]));
        }
        LeastSquaresFit solver = weighted ? LeastSquaresFit.defaults().withKnownWeights().withValueScale(scale)
                : LeastSquaresFit.defaults().withResidualFloor(RESOLUTION).withValueScale(1);
        FitResult result = solver.solve(problem);
        double[] lp = result.parameters().stream().mapToDouble(Double::doubleValue).toArray();
        double[] p = expand(physical, active, lp);
        double[] logSigma = new double[n];
        double[][] logCovariance = new double[n][n];
        boolean[] atBound = new boolean[n];
        for (int a = 0; a < active.length; a++) {
            int k = active[a];
            logSigma[k] = result.sigma(a);
            atBound[k] = lp[a] - lo[a] < 1e-6 || hi[a] - lp[a] < 1e-6;
            for (int b = 0; b < active.length; b++) {
                logCovariance[k][active[b]] = result.covariance(a, b);
            }
        }
        return new Pass(result, p, logSigma, atBound, logCovariance);
    }

    private static double[] expand(double[] base, int[] active, double[] logValues) {
        double[] p = base.clone();
        for (int a = 0; a < active.length; a++) {
            p[active[a]] = Math.exp(logValues[a]);
        }
        return p;
    }

    /** One least-squares pass over the present parameters. */
    private record Pass(FitResult result, double[] physical, double[] logSigma, boolean[] atBound,
            double[][] logCovariance) {
        /** This pass with {@code extra} added to its log-parameter covariance (and sigmas). */
        Pass withCommon(double[][] extra) {
            int n = logSigma.length;
            double[][] cov = new double[n][n];
            double[] sigma = logSigma.clone();
            for (int a = 0; a < n; a++) {
                for (int b = 0; b < n; b++) {
                    cov[a][b] = logCovariance[a][b] + extra[a][b];
                }
                sigma[a] = Math.sqrt(logSigma[a] * logSigma[a] + extra[a][a]);
            }
            return new Pass(result, physical, sigma, atBound, cov);
        }

        String reason(int k) {
            if (atBound[k]) {
                return "it ran to the limit of its range";
            }
            if (!Double.isFinite(logSigma[k])) {
                return "its uncertainty cannot be computed";
            }
            return String.format(Locale.ROOT, "relative uncertainty %.0f %%", 100 * logSigma[k]);
        }
    }
}
