package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.function.DoubleFunction;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.uncertainty.UncertainImpedance;

/**
 * Fits weighted by the points' uncertainties: when the data scatter as their stated u says, the
 * reduced χ² is near 1 and the fitted values lie within ±2σ of the truth about 95 % of the time;
 * when the model is wrong, the χ² says so.
 */
class WeightedFitTest {

    /** A sweep of {@code truth} with correlated normal errors: u(R) = uRel·|Z|, u(X) = 2·uRel·|Z|, r = 0.5. */
    private static List<UncertainImpedance> sweep(DoubleFunction<Complex> truth, double[] f, double uRel,
            Random random) {
        List<UncertainImpedance> out = new ArrayList<>();
        double r = 0.5;
        for (double fHz : f) {
            Complex z = truth.apply(fHz);
            double uR = uRel * z.abs();
            double uX = 2 * uRel * z.abs();
            double e1 = random.nextGaussian();
            double e2 = r * e1 + Math.sqrt(1 - r * r) * random.nextGaussian();
            out.add(new UncertainImpedance(new Impedance(fHz, z.getReal() + uR * e1, z.getImaginary() + uX * e2),
                    uR, uX, r));
        }
        return out;
    }

    @Test
    void fittedCEsrAndEslCoverTheTruthAtTwoSigmaAboutNinetyFivePercentOfTheTime() {
        double[] f = Sweeps.logSpaced(10e3, 100e6, 41);
        DoubleFunction<Complex> truth = Sweeps.seriesRlc(0.05, 0.8e-9, 220e-9);
        Random random = new Random(12);
        int runs = 300;
        int[] inside = new int[3];
        double chi = 0;
        String[] keys = {"c_f", "esr_ohm", "esl_h"};
        double[] values = {220e-9, 0.05, 0.8e-9};
        for (int run = 0; run < runs; run++) {
            CircuitFit fit = EquivalentCircuitFit.fitWeighted(CircuitModel.CAPACITOR, sweep(truth, f, 1e-3, random));
            assertTrue(fit.converged(), fit.notes().toString());
            chi += fit.reducedChiSquared() / runs;
            for (int k = 0; k < 3; k++) {
                if (Math.abs(fit.value(keys[k]) - values[k]) <= 2 * fit.sigma().get(keys[k])) {
                    inside[k]++;
                }
            }
        }
        // χ²/ν has mean 1 for a right model with right uncertainties (the χ² distribution's mean is ν)
        assertEquals(1.0, chi, 0.03);
        for (int k = 0; k < 3; k++) {
            // ±2σ of a normal estimate covers 95.45 % (Abramowitz and Stegun, Table 26.1); 300 runs: ±3.6 % at 3σ
            assertEquals(0.9545, inside[k] / (double) runs, 0.036, keys[k]);
        }
    }

    @Test
    void theWrongModelIsReportedAsNotFitting() {
        double[] f = Sweeps.logSpaced(10e3, 10e6, 31);
        // a lossy capacitor (tan δ = 2 %) fitted with a constant-ESR capacitor model, to 0.1 %
        List<UncertainImpedance> data = sweep(Sweeps.lossyCapacitor(0.05, 0.8e-9, 220e-9, 0.02), f, 1e-3,
                new Random(3));
        CircuitFit fit = EquivalentCircuitFit.fitWeighted(CircuitModel.CAPACITOR, data);
        assertTrue(fit.reducedChiSquared() > 10, "reduced chi-squared " + fit.reducedChiSquared());
        assertTrue(fit.notes().stream().anyMatch(n -> n.startsWith("the capacitor model does not fit the data")),
                fit.notes().toString());
        CircuitFit right = EquivalentCircuitFit.fitWeighted(CircuitModel.CAPACITOR_TAN_DELTA, data);
        assertTrue(right.notes().stream().noneMatch(n -> n.contains("does not fit")), right.notes().toString());
    }

    @Test
    void anUnweightedFitHasNoChiSquared() {
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR, EquivalentCircuitFitTest.SET10);
        assertTrue(Double.isNaN(fit.reducedChiSquared()));
        assertTrue(!fit.weighted());
    }
}
