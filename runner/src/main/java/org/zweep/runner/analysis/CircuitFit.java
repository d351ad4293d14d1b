package org.zweep.runner.analysis;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;

/**
 * An equivalent circuit fitted to one impedance sweep.
 *
 * @param model the circuit
 * @param parameters each of the model's parameters in SI units, in {@link CircuitModel#keys()}
 *     order; {@code null} when not resolved by the data (then left out of the model)
 * @param sigma the standard uncertainty of each parameter (same keys, same units); {@code null}
 *     when the parameter is not resolved
 * @param srfHz the self-resonant frequency of the fitted circuit (where its reactance crosses
 *     zero), in Hz; {@code null} when the element that sets it is not resolved
 * @param srfDataHz the first zero crossing of the measured reactance (linear interpolation in
 *     log f), in Hz; {@code null} when the sweep does not span it
 * @param residualRms the RMS of the modulus-weighted residuals (Z_model − Z)/|Z|, real and
 *     imaginary parts stacked: a relative misfit, 1e-3 = 0.1 %
 * @param iterations optimizer iterations of the final fit
 * @param converged whether the final fit converged to a stationary point
 * @param points the number of frequencies fitted
 * @param notes explanations for people (what was not resolved and why, whether the model fits)
 * @param reducedChiSquared χ²/ν of a fit weighted by the points' standard uncertainties (about 1
 *     when the model and the uncertainties are right); NaN for an unweighted fit, whose sigmas
 *     come from the scatter about the fit instead
 * @param srfU the standard uncertainty of {@code srfHz}, in Hz, propagated from the fitted
 *     parameters' covariance; NaN when unknown
 * @param srfDataU the standard uncertainty of {@code srfDataHz}, in Hz, propagated from the two
 *     points' u(X) around the crossing (weighted fits only); NaN when unknown
 */
public record CircuitFit(CircuitModel model, Map<String, Double> parameters, Map<String, Double> sigma, Double srfHz,
        Double srfDataHz, double residualRms, int iterations, boolean converged, int points, List<String> notes,
        double reducedChiSquared, double srfU, double srfDataU) {
    public CircuitFit {
        parameters = Collections.unmodifiableMap(new LinkedHashMap<>(parameters));
        sigma = Collections.unmodifiableMap(new LinkedHashMap<>(sigma));
        notes = List.copyOf(notes);
    }

    /** The fitted circuit's impedance at {@code frequencyHz}, with unresolved elements left out. */
    public Complex impedanceAt(double frequencyHz) {
        return model.impedance(2 * Math.PI * frequencyHz, physical());
    }

    /** Whether the fit was weighted by the points' standard uncertainties. */
    public boolean weighted() {
        return !Double.isNaN(reducedChiSquared);
    }

    /**
     * The standard uncertainty of parameter {@code key} for a decision: its sigma from the
     * weighted covariance; NaN when not resolved or when the fit was not weighted (its sigma then
     * reflects only the scatter about the fit, not the meter's stated accuracy).
     */
    public double standardUncertainty(String key) {
        Double u = sigma.get(key);
        return u == null || !weighted() ? Double.NaN : u;
    }

    /** The value of parameter {@code key}, or {@code NaN} when not resolved. */
    public double value(String key) {
        Double v = parameters.get(key);
        return v == null ? Double.NaN : v;
    }

    /** The model's parameters as a physical vector, absent elements at their absent value. */
    double[] physical() {
        List<String> keys = model.keys();
        double[] p = new double[keys.size()];
        for (int i = 0; i < p.length; i++) {
            Double v = parameters.get(keys.get(i));
            p[i] = v == null ? model.absentValue(i) : v;
        }
        return p;
    }
}
