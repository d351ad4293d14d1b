package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Impedance;

class EquivalentCircuitFitTest {
    // synthetic capacitor: C = 100 nF, ESR = 20 mΩ, ESL = 1.0 nH, 31 points 100 kHz..100 MHz, noiseless
    static final double[] F10 = Sweeps.logSpaced(100e3, 100e6, 31);
    static final List<Impedance> SET10 = Sweeps.sweep(F10, Sweeps.seriesRlc(0.02, 1e-9, 100e-9));

    @Test
    void syntheticSweepMatchesThePublishedTable() {
        // the same series RLC in ngspice-39 (V1 in 0 AC 1; R 20m, L 1n, C 100n; z = v(in)/(-i(V1))), AC analysis:
        // Im Z = −15.91486599 Ω at 100 kHz and +0.6124030364 Ω at 100 MHz
        assertEquals(-15.91486599, SET10.get(0).reactanceOhm(), 1e-8);
        assertEquals(0.6124030364, SET10.get(30).reactanceOhm(), 1e-10);
    }

    @Test
    void capacitorFitRecoversTheSection10ParametersWithin1e6Relative() {
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR, SET10);
        assertTrue(fit.converged(), fit.notes().toString());
        // noiseless data: the fit must recover the part's own values to 1e-6 relative
        assertEquals(100e-9, fit.value("c_f"), 100e-9 * 1e-6);
        assertEquals(0.02, fit.value("esr_ohm"), 0.02 * 1e-6);
        assertEquals(1e-9, fit.value("esl_h"), 1e-9 * 1e-6);
        // f_SR = 1/(2π√(ESL·C)) = 15.9154943 MHz, computed
        assertEquals(15.9154943e6, fit.srfHz(), 0.1);
        assertTrue(fit.residualRms() < 1e-9, "noiseless data leave no misfit: " + fit.residualRms());
    }

    @Test
    void srfFromTheDataZeroCrossingIsWithinGridInterpolationTolerance() {
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR, SET10);
        // f_SR = 15.9154943 MHz, computed; linear interpolation of X in log f between 12.6 and
        // 15.8.. / 15.8..  and 20 MHz grid points (10 per decade) is good to a few percent
        assertNotNull(fit.srfDataHz());
        assertEquals(15.9154943e6, fit.srfDataHz(), 15.9154943e6 * 0.03);
    }

    @Test
    void startValuesAreTheClosedFormGuessesOfSection10() {
        double[] start = StartValues.of(CircuitModel.CAPACITOR, SET10, Resonance.fromData(SET10));
        // closed-form first guess C ≈ −1/(ω·Im Z) at the lowest frequency = 100.004 nF, computed
        assertEquals(100.004e-9, start[0], 0.001e-9);
        // ESR ≈ min |Z| over the grid; our guess is Re Z there, exactly 20 mΩ on this set
        assertEquals(0.02, start[1], 1e-12);
    }

    @Test
    void noisyCapacitorSweepRecoversParametersWithinTheReportedUncertainty() {
        double noise = 1e-3; // relative, per component
        Random random = new Random(20240611);
        List<Impedance> data = Sweeps.noisy(Sweeps.logSpaced(10e3, 100e6, 41), Sweeps.seriesRlc(0.05, 0.8e-9, 220e-9),
                noise, random);
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR, data);
        assertTrue(fit.converged());
        // the modulus-weighted residual RMS estimates the added relative noise (82 residuals: ±25 %)
        assertEquals(noise, fit.residualRms(), 0.25 * noise);
        assertWithin(220e-9, fit, "c_f");
        assertWithin(0.05, fit, "esr_ohm");
        assertWithin(0.8e-9, fit, "esl_h");
    }

    @Test
    void reportedUncertaintiesCoverTheTrueValueAboutTwoThirdsOfTheTime() {
        // the 1σ interval of a correct uncertainty holds the truth in 68.3 % of trials (normal theory);
        // with 120 trials the binomial spread is ±4.2 %, so [0.55, 0.81] is a 3σ band
        Random random = new Random(7);
        double[] f = Sweeps.logSpaced(10e3, 100e6, 31);
        int inside = 0;
        int trials = 120;
        for (int t = 0; t < trials; t++) {
            CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR,
                    Sweeps.noisy(f, Sweeps.seriesRlc(0.05, 0.8e-9, 220e-9), 3e-3, random));
            if (Math.abs(fit.value("esr_ohm") - 0.05) <= fit.sigma().get("esr_ohm")) {
                inside++;
            }
        }
        double coverage = inside / (double) trials;
        assertTrue(coverage > 0.55 && coverage < 0.81, "1σ coverage " + coverage);
    }

    @Test
    void capacitorSweepFarBelowResonanceReportsEslAsNotResolved() {
        // 100 nF with 1 nH resonates at 15.9 MHz; a 100 Hz..100 kHz sweep with 0.1 % noise cannot see ESL
        Random random = new Random(3);
        List<Impedance> data = Sweeps.noisy(Sweeps.logSpaced(100, 100e3, 31), Sweeps.seriesRlc(0.02, 1e-9, 100e-9),
                1e-3, random);
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR, data);
        assertNull(fit.parameters().get("esl_h"));
        assertNull(fit.sigma().get("esl_h"));
        assertNull(fit.srfHz());
        assertNull(fit.srfDataHz());
        assertWithin(100e-9, fit, "c_f");
        assertTrue(fit.notes().stream().anyMatch(n -> n.startsWith("esl_h not resolved")), fit.notes().toString());
    }

    @Test
    void inductorFitRecoversWindingResistanceAndCapacitanceAcrossResonance() {
        // 10 µH + 1 Ω with 5 pF across: zero phase at f0·√(1 − R²C/L) = 22.507902 MHz, computed
        List<Impedance> data = Sweeps.sweep(Sweeps.logSpaced(10e3, 100e6, 51), Sweeps.rlParallelC(1.0, 10e-6, 5e-12));
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.INDUCTOR, data);
        assertTrue(fit.converged(), fit.notes().toString());
        assertEquals(10e-6, fit.value("l_h"), 10e-6 * 1e-6);
        assertEquals(1.0, fit.value("r_ohm"), 1e-6);
        assertEquals(5e-12, fit.value("cp_f"), 5e-12 * 1e-6);
        // the exact zero-phase frequency, 22.507902 MHz
        assertEquals(22.507902e6, fit.srfHz(), 2);
    }

    @Test
    void inductorSweepBelowResonanceReportsParallelCapacitanceAsNotResolved() {
        Random random = new Random(11);
        List<Impedance> data = Sweeps.noisy(Sweeps.logSpaced(100, 100e3, 31), Sweeps.rlParallelC(1.0, 10e-6, 5e-12),
                1e-3, random);
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.INDUCTOR, data);
        assertNull(fit.parameters().get("cp_f"));
        assertNull(fit.srfHz());
        // the synthetic part's own L and R under 0.1 % noise
        assertWithin(10e-6, fit, "l_h");
        assertWithin(1.0, fit, "r_ohm");
    }

    @Test
    void resistorFitRecoversSeriesInductanceAndParallelCapacitance() {
        // 1 kΩ with 20 nH and 0.1 pF: both visible at 1 GHz (ωL = 126 Ω, 1/ωC = 1.6 kΩ)
        List<Impedance> data = Sweeps.sweep(Sweeps.logSpaced(1e3, 1e9, 61), Sweeps.rlParallelC(1000, 20e-9, 0.1e-12));
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.RESISTOR, data);
        assertTrue(fit.converged(), fit.notes().toString());
        assertEquals(1000, fit.value("r_ohm"), 1000 * 1e-6);
        assertEquals(20e-9, fit.value("ls_h"), 20e-9 * 1e-5);
        assertEquals(0.1e-12, fit.value("cp_f"), 0.1e-12 * 1e-5);
        // L < R²C: (R + jωL) ∥ C has no zero-reactance frequency, so no SRF (textbook parallel-resonance algebra)
        assertNull(fit.srfHz());
    }

    @Test
    void tooFewFrequenciesIsAClearInputError() {
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> EquivalentCircuitFit.fit(CircuitModel.CAPACITOR, SET10.subList(0, 3)));
        assertTrue(e.getMessage().contains("at least 4 frequencies"), e.getMessage());
    }

    private static void assertWithin(double truth, CircuitFit fit, String key) {
        double value = fit.value(key);
        double sigma = fit.sigma().get(key);
        // 4σ: a correct uncertainty is exceeded by chance once in 16,000 (normal theory)
        assertTrue(Math.abs(value - truth) <= 4 * sigma, key + " = " + value + " ± " + sigma + ", truth " + truth);
        assertTrue(sigma < 0.2 * Math.abs(truth), key + " uncertainty " + sigma + " too large for this data");
    }
}
