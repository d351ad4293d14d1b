package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Impedance;

/**
 * Fits a {@link CircuitModel} to an impedance sweep by complex nonlinear least squares
 * (check-values.md §10): parameters in log space (positive, comparable scales), residuals
 * (Z_model − Z)/|Z| with real and imaginary parts stacked (modulus weighting), Levenberg–Marquardt
 * from starting values computed from the data, uncertainties from the covariance at the solution.
 *
 * <p>An element the data cannot resolve (its relative uncertainty above 1/3, or it ran into its
 * bound, typically ESL or a parallel C when the sweep stays far below resonance) is reported as
 * {@code null} and the fit is repeated without it, so the other values are not disturbed.
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

    private EquivalentCircuitFit() {
    }

    /**
     * Fits {@code model} to {@code sweep} (one impedance per frequency, any order).
     *
     * @throws InvalidInputException when the sweep has fewer distinct frequencies than the model
     *     has parameters plus one, or a zero impedance
     */
    public static CircuitFit fit(CircuitModel model, List<Impedance> sweep) {
        List<Impedance> data = new ArrayList<>(sweep);
        data.sort(Comparator.comparingDouble(Impedance::frequencyHz));
        long distinct = data.stream().mapToDouble(Impedance::frequencyHz).distinct().count();
        if (distinct < model.keys().size() + 1) {
            throw new InvalidInputException("a " + model.id() + " fit needs at least " + (model.keys().size() + 1)
                    + " frequencies, the sweep has " + distinct);
        }
        for (Impedance z : data) {
            if (!(z.magnitudeOhm() > 0) || !Double.isFinite(z.magnitudeOhm())) {
                throw new InvalidInputException("cannot fit an impedance of " + z.magnitudeOhm() + " ohm at "
                        + z.frequencyHz() + " Hz");
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
            pass = solve(model, data, current, start, present);
            if (first && (worstUnresolved(model, pass, present) >= 0 || !pass.result.converged())) {
                pass = bestOfRestarts(model, data, start, present, pass);
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
        Map<String, Double> values = new LinkedHashMap<>();
        Map<String, Double> sigmas = new LinkedHashMap<>();
        for (int k = 0; k < n; k++) {
            values.put(model.keys().get(k), present[k] ? pass.physical[k] : null);
            sigmas.put(model.keys().get(k), present[k] ? pass.physical[k] * pass.logSigma[k] : null);
        }
        double[] finalP = pass.physical;
        Double srfFit = srfOfFit(model, finalP, present);
        if (!pass.result.converged()) {
            notes.add("the fit did not converge: " + pass.result.message());
        }
        if (srfFit == null && Double.isFinite(srfData)) {
            notes.add(String.format(Locale.ROOT, "the measured reactance crosses zero at %.6g Hz but the fitted"
                    + " circuit does not resonate there", srfData));
        }
        return new CircuitFit(model, values, sigmas, srfFit, Double.isFinite(srfData) ? srfData : null,
                pass.result.residualRms(), pass.result.iterations(), pass.result.converged(), data.size(), notes);
    }

    /**
     * The data's closed-form start can put a minor element where the cost surface is flat (a
     * resistor's Ls hidden behind its Cp, say); try each minor element 100× larger and smaller and
     * keep the lowest-cost fit.
     */
    private static Pass bestOfRestarts(CircuitModel model, List<Impedance> data, double[] start, boolean[] present,
            Pass best) {
        for (int k = 1; k < start.length; k++) {
            for (double factor : new double[] {100, 0.01}) {
                double[] s = start.clone();
                s[k] *= factor;
                Pass p = solve(model, data, s, s, present);
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

    private static Pass solve(CircuitModel model, List<Impedance> data, double[] physical, double[] start,
            boolean[] present) {
        int n = physical.length;
        int[] active = java.util.stream.IntStream.range(0, n).filter(k -> present[k]).toArray();
        int m = 2 * data.size();
        double[] omega = new double[data.size()];
        double[] re = new double[data.size()];
        double[] im = new double[data.size()];
        double[] mod = new double[data.size()];
        for (int i = 0; i < omega.length; i++) {
            Impedance z = data.get(i);
            omega[i] = z.omega();
            re[i] = z.resistanceOhm();
            im[i] = z.reactanceOhm();
            mod[i] = z.magnitudeOhm();
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
                r[2 * i] = (zm.getReal() - re[i]) / mod[i];
                r[2 * i + 1] = (zm.getImaginary() - im[i]) / mod[i];
            }
            return r;
        }, lp -> {
            double[] p = expand(physical, active, lp);
            double[][] j = new double[m][active.length];
            for (int i = 0; i < omega.length; i++) {
                Complex[] d = model.logDerivatives(omega[i], p, active);
                for (int a = 0; a < active.length; a++) {
                    j[2 * i][a] = d[a].getReal() / mod[i];
                    j[2 * i + 1][a] = d[a].getImaginary() / mod[i];
                }
            }
            return j;
        }, p0, lo, hi);
        FitResult result = LeastSquaresFit.defaults().withResidualFloor(RESOLUTION).withValueScale(1).solve(problem);
        double[] lp = result.parameters().stream().mapToDouble(Double::doubleValue).toArray();
        double[] p = expand(physical, active, lp);
        double[] logSigma = new double[n];
        boolean[] atBound = new boolean[n];
        for (int a = 0; a < active.length; a++) {
            int k = active[a];
            logSigma[k] = result.sigma(a);
            atBound[k] = lp[a] - lo[a] < 1e-6 || hi[a] - lp[a] < 1e-6;
        }
        return new Pass(result, p, logSigma, atBound);
    }

    private static double[] expand(double[] base, int[] active, double[] logValues) {
        double[] p = base.clone();
        for (int a = 0; a < active.length; a++) {
            p[active[a]] = Math.exp(logValues[a]);
        }
        return p;
    }

    /** One least-squares pass over the present parameters. */
    private record Pass(FitResult result, double[] physical, double[] logSigma, boolean[] atBound) {
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
