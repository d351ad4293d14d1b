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
    void theSelfResonancesUncertaintyMatchesItsScatterOverRepeatedSweeps() {
        // the fitted SRF's u (propagated from the weighted covariance) and the data crossing's u
        // (propagated from u(X) of the two points around it) against the spread of 300 seeded
        // repeats: a Monte Carlo check of the law of propagation (JCGM 101:2008, 7.6)
        double[] f = Sweeps.logSpaced(10e3, 100e6, 41);
        double l = 0.8e-9;
        double c = 220e-9;
        double truthHz = 1 / (2 * Math.PI * Math.sqrt(l * c)); // where X of the series RLC crosses zero
        Random random = new Random(29);
        int runs = 300;
        double[] fit = new double[runs];
        double[] data = new double[runs];
        double uFit = 0;
        double uData = 0;
        int inside = 0;
        for (int run = 0; run < runs; run++) {
            CircuitFit cf = EquivalentCircuitFit.fitWeighted(CircuitModel.CAPACITOR,
                    sweep(Sweeps.seriesRlc(0.05, l, c), f, 1e-3, random));
            fit[run] = cf.srfHz();
            data[run] = cf.srfDataHz();
            uFit += cf.srfU() / runs;
            uData += cf.srfDataU() / runs;
            if (Math.abs(cf.srfHz() - truthHz) <= 2 * cf.srfU()) {
                inside++;
            }
        }
        // 300 draws estimate a standard deviation to about ±4 % (1σ); allow 15 %
        assertEquals(sd(fit), uFit, 0.15 * uFit, "fitted SRF");
        assertEquals(sd(data), uData, 0.15 * uData, "SRF from the data's zero crossing");
        // ±2σ of a normal estimate covers 95.45 % (Abramowitz and Stegun, Table 26.1); 300 runs: ±3.6 % at 3σ
        assertEquals(0.9545, inside / (double) runs, 0.036);
    }

    private static double sd(double[] v) {
        double m = java.util.Arrays.stream(v).average().orElseThrow();
        return Math.sqrt(java.util.Arrays.stream(v).map(x -> (x - m) * (x - m)).sum() / (v.length - 1));
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

    @Test
    void aLoadStandardsErrorCommonToEveryPointIsAddedAfterTheFitNotAveragedDown() {
        // each sweep: independent errors (0.1 % of |Z|) plus one error common to all its points, drawn from a
        // load standard stated as 100 Ω with u(R) = u(X) = 0.3 Ω (δ = ΔZ_std/Z_std, 0.3 % each part). The points'
        // u include the common part, as the open/short/load correction reports it per point.
        double[] f = Sweeps.logSpaced(10e3, 100e6, 41);
        DoubleFunction<Complex> truth = Sweeps.seriesRlc(0.05, 0.8e-9, 220e-9);
        UncertainImpedance load = new UncertainImpedance(new Impedance(Double.NaN, 100, 0), 0.3, 0.3, 0);
        CommonError common = CommonError.ofLoadStandard(load);
        assertEquals(0.003, common.uRe(), 1e-15);
        assertEquals(0.003, common.uIm(), 1e-15);
        Random random = new Random(21);
        int runs = 300;
        String[] keys = {"c_f", "esr_ohm", "esl_h"};
        double[] values = {220e-9, 0.05, 0.8e-9};
        int[] insideCommon = new int[3];
        int[] insideIndependent = new int[3];
        double uC = 0;
        double uCIndependent = 0;
        for (int run = 0; run < runs; run++) {
            Complex delta = new Complex(0.003 * random.nextGaussian(), 0.003 * random.nextGaussian());
            List<UncertainImpedance> data = new ArrayList<>();
            for (UncertainImpedance p : sweep(truth, f, 1e-3, random)) {
                Complex z = p.value().toComplex();
                Complex shared = truth.apply(p.value().frequencyHz()).multiply(delta);
                Impedance v = new Impedance(p.value().frequencyHz(), z.getReal() + shared.getReal(),
                        z.getImaginary() + shared.getImaginary());
                double[] c = common.pointCovariance(v.resistanceOhm(), v.reactanceOhm());
                data.add(UncertainImpedance.fromCovariance(v, p.varianceR() + c[0], p.varianceX() + c[1],
                        p.covarianceRX() + c[2]));
            }
            CircuitFit withCommon = EquivalentCircuitFit.fitWeighted(CircuitModel.CAPACITOR, data, common);
            CircuitFit asIndependent = EquivalentCircuitFit.fitWeighted(CircuitModel.CAPACITOR, data);
            assertTrue(withCommon.converged(), withCommon.notes().toString());
            uC += withCommon.sigma().get("c_f") / runs;
            uCIndependent += asIndependent.sigma().get("c_f") / runs;
            for (int k = 0; k < 3; k++) {
                insideCommon[k] += Math.abs(withCommon.value(keys[k]) - values[k]) <= 2 * withCommon.sigma().get(keys[k])
                        ? 1 : 0;
                insideIndependent[k] += Math.abs(asIndependent.value(keys[k]) - values[k])
                        <= 2 * asIndependent.sigma().get(keys[k]) ? 1 : 0;
            }
        }
        // a real common scale (1 + δr) scales C by 1/(1 + δr): u(C) is at least C·0.3 % = 0.66 nF
        assertTrue(uC >= 220e-9 * 0.003, "u(C) " + uC);
        assertTrue(uCIndependent < 0.5 * 220e-9 * 0.003, "u(C) as if independent " + uCIndependent);
        for (int k = 0; k < 3; k++) {
            // ±2σ of a normal estimate covers 95.45 % (Abramowitz and Stegun, Table 26.1); 300 runs: ±3.6 % at 3σ
            assertEquals(0.9545, insideCommon[k] / (double) runs, 0.036, keys[k]);
        }
        // taken as independent from point to point, the common error averages down and C's ±2σ misses most runs
        assertTrue(insideIndependent[0] < 0.7 * runs, "C covered " + insideIndependent[0] + " of " + runs);
    }
}
