package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.stream.IntStream;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/** The analytic derivatives the fit uses agree with central differences of each model's impedance. */
class CircuitModelDerivativesTest {
    @ParameterizedTest
    @EnumSource(CircuitModel.class)
    void analyticLogDerivativesMatchCentralDifferences(CircuitModel model) {
        double[] p = switch (model) {
            case CAPACITOR -> new double[] {100e-9, 0.025, 0.8e-9};
            case CAPACITOR_LEAKAGE -> new double[] {1e-6, 0.2, 2e-9, 200e3};
            case CAPACITOR_TAN_DELTA -> new double[] {100e-9, 0.025, 0.8e-9, 0.012};
            case INDUCTOR -> new double[] {10e-6, 0.08, 2.8e-12};
            case INDUCTOR_CORE_LOSS -> new double[] {10e-6, 0.08, 2.8e-12, 3000};
            case RESISTOR -> new double[] {1000, 1.5e-9, 0.08e-12};
        };
        int[] all = IntStream.range(0, p.length).toArray();
        double h = 1e-6;
        for (double f : Sweeps.logSpaced(1, 1e9, 19)) {
            double omega = 2 * Math.PI * f;
            Complex[] analytic = model.logDerivatives(omega, p, all);
            double scale = model.impedance(omega, p).abs();
            for (int k = 0; k < p.length; k++) {
                double[] up = p.clone();
                double[] down = p.clone();
                up[k] *= Math.exp(h);
                down[k] *= Math.exp(-h);
                Complex numeric = model.impedance(omega, up).subtract(model.impedance(omega, down)).divide(2 * h);
                // central differences are good to O(h²) ≈ 1e-12 relative, rounding to ~1e-10·|Z|/h: 1e-6 of |Z| is ample
                double error = analytic[k].subtract(numeric).abs() / scale;
                assertTrue(error < 1e-6, model.id() + " " + model.keys().get(k) + " at " + f + " Hz: " + error);
            }
        }
    }
}
