package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.Impedance;

/**
 * The optional loss terms: a capacitor's parallel leakage resistance or dielectric tan δ, an
 * inductor's core-loss resistance. Sweeps are computed from the circuit formulas written out in
 * {@link Sweeps} (textbook series/parallel impedance algebra); the ngspice counterparts are in
 * {@link NgspiceFitIT}.
 */
class ExtendedModelsTest {
    static final double[] WIDE = Sweeps.logSpaced(1, 100e6, 81);

    @Test
    void leakageModelRecoversTheParallelResistanceOfALeakyCapacitor() {
        // 1 µF, ESR 0.2 Ω, ESL 2 nH, 200 kΩ leakage: at 1 Hz 1/(ωC) = 159 kΩ, comparable with Rp
        List<Impedance> data = Sweeps.sweep(WIDE, Sweeps.leakyCapacitor(0.2, 2e-9, 1e-6, 200e3));
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR_LEAKAGE, data);
        assertTrue(fit.converged(), fit.notes().toString());
        // noiseless data: recovered to 1e-6 relative
        assertEquals(1e-6, fit.value("c_f"), 1e-6 * 1e-6);
        assertEquals(0.2, fit.value("esr_ohm"), 0.2 * 1e-6);
        assertEquals(2e-9, fit.value("esl_h"), 2e-9 * 1e-6);
        assertEquals(200e3, fit.value("rp_ohm"), 200e3 * 1e-6);
    }

    @Test
    void tanDeltaModelRecoversTheDielectricLossOfAClassTwoCapacitor() {
        // 100 nF X7R-like, tan δ 0.012, ESR 25 mΩ, ESL 0.8 nH (the KP-C0805-104 bench file's values)
        List<Impedance> data = Sweeps.sweep(Sweeps.logSpaced(10, 20e6, 64),
                Sweeps.lossyCapacitor(0.025, 0.8e-9, 100e-9, 0.012));
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR_TAN_DELTA, data);
        assertTrue(fit.converged(), fit.notes().toString());
        // noiseless data: recovered to 1e-6 relative
        assertEquals(100e-9, fit.value("c_f"), 100e-9 * 1e-6);
        assertEquals(0.025, fit.value("esr_ohm"), 0.025 * 1e-6);
        assertEquals(0.8e-9, fit.value("esl_h"), 0.8e-9 * 1e-6);
        assertEquals(0.012, fit.value("tan_delta"), 0.012 * 1e-6);
        // D of a lossy C in series with ESR: D = tan δ + ESR·ωC(1 + tan²δ) at low frequency; 1e-3 at 10 Hz
        Impedance low = data.get(0);
        double w = low.omega();
        assertEquals(0.012 + 0.025 * w * 100e-9 * (1 + 0.012 * 0.012), low.dissipationFactor(), 1e-12);
    }

    @Test
    void coreLossModelRecoversTheCoreLossResistanceOfAPowerInductor() {
        // the KP-L1210-100 bench file's values: 10 µH, 80 mΩ, 2.8 pF, 3 kΩ core loss
        List<Impedance> data = Sweeps.sweep(Sweeps.logSpaced(1e3, 50e6, 71),
                Sweeps.inductorWithCoreLoss(0.08, 10e-6, 2.8e-12, 3000));
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.INDUCTOR_CORE_LOSS, data);
        assertTrue(fit.converged(), fit.notes().toString());
        // noiseless data: recovered to 1e-6 relative
        assertEquals(10e-6, fit.value("l_h"), 10e-6 * 1e-6);
        assertEquals(0.08, fit.value("r_ohm"), 0.08 * 1e-6);
        assertEquals(2.8e-12, fit.value("cp_f"), 2.8e-12 * 1e-6);
        assertEquals(3000, fit.value("rcore_ohm"), 3000 * 1e-6);
    }

    @Test
    void noisyLossTermsAreRecoveredWithinTheirReportedUncertainty() {
        Random random = new Random(42);
        double noise = 1e-3; // relative, per component
        CircuitFit leak = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR_LEAKAGE,
                Sweeps.noisy(WIDE, Sweeps.leakyCapacitor(0.2, 2e-9, 1e-6, 200e3), noise, random));
        assertWithin(200e3, leak, "rp_ohm");
        assertWithin(1e-6, leak, "c_f");
        CircuitFit tan = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR_TAN_DELTA,
                Sweeps.noisy(Sweeps.logSpaced(10, 20e6, 64), Sweeps.lossyCapacitor(0.025, 0.8e-9, 100e-9, 0.012),
                        noise, random));
        assertWithin(0.012, tan, "tan_delta");
        assertWithin(100e-9, tan, "c_f");
        CircuitFit core = EquivalentCircuitFit.fit(CircuitModel.INDUCTOR_CORE_LOSS,
                Sweeps.noisy(Sweeps.logSpaced(1e3, 50e6, 71), Sweeps.inductorWithCoreLoss(0.08, 10e-6, 2.8e-12, 3000),
                        noise, random));
        assertWithin(3000, core, "rcore_ohm");
        assertWithin(10e-6, core, "l_h");
    }

    @Test
    void leakageTooLargeToSeeIsReportedAsNotResolved() {
        // 1 GΩ across 1 µF: at 1 Hz the leakage current is 1/1000 of the capacitive one, far below 1e-5 noise
        List<Impedance> data = Sweeps.noisy(WIDE, Sweeps.leakyCapacitor(0.2, 2e-9, 1e-6, 1e12), 1e-5,
                new Random(5));
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR_LEAKAGE, data);
        assertNull(fit.parameters().get("rp_ohm"), fit.parameters().toString());
        assertTrue(fit.notes().stream().anyMatch(n -> n.startsWith("rp_ohm not resolved")), fit.notes().toString());
        assertWithin(1e-6, fit, "c_f");
    }

    private static void assertWithin(double truth, CircuitFit fit, String key) {
        double value = fit.value(key);
        Double sigma = fit.sigma().get(key);
        assertTrue(sigma != null, key + " not resolved: " + fit.notes());
        // 4σ: a correct uncertainty is exceeded by chance once in 16,000 (normal theory)
        assertTrue(Math.abs(value - truth) <= 4 * sigma, key + " = " + value + " ± " + sigma + ", truth " + truth);
        assertTrue(sigma < 0.2 * Math.abs(truth), key + " uncertainty " + sigma + " too large for this data");
    }
}
