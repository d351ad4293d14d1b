package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.BiFunction;
import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.junit.jupiter.api.Test;
import org.snakeyaml.engine.v2.api.Load;
import org.snakeyaml.engine.v2.api.LoadSettings;
import org.zweep.driver.impedance.Impedance;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.FixtureSlot;
import org.zweep.simulator.bench.MeterCorrection;
import org.zweep.simulator.bench.PointRequest;
import org.zweep.simulator.bench.PointResult;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.SourceKind;

/**
 * Fits of sweeps measured on the simulated benches of the shipped bench files, noise on, recover
 * the parameters written in those files.
 *
 * <p><b>Fixture.</b> The benches have fixture residuals (2 nH and 4 mΩ in series, 0.3 pF and
 * 0.1 nS across). {@link BenchSpec#ideal()} would remove them but also switches the noise off, so
 * these tests keep the real fixture and correct every reading with the simulator's
 * {@link MeterCorrection} from OPEN and SHORT readings taken at the sweep frequencies: for this
 * fixture (series residual on the meter side, stray admittance across the slot) open/short
 * correction is exact, so what is left is noise.
 *
 * <p><b>Tolerances from the noise.</b> The bench adds Gaussian noise to the real and the imaginary
 * part of each raw reading Zm, 1σ = n·s·(|Zm|(1 + |Zm|/U) + U/1000), where n is the file's
 * {@code noise}, s = √(10 ms/(aperture·averages))·(1 V/level) and U the range the reading used
 * (SimulatedBench Javadoc; the bench reports U with each reading). The fit minimises
 * (Zmodel − Z)/|Z| over the corrected Z; the correction Z(Zm) is holomorphic, so it scales the
 * noise by |dZ/dZm| (taken numerically at each reading) and residual i has
 * σᵢ = σ(Zm)·|dZ/dZm|/|Z|. Linearised least squares (e.g. Press et al., Numerical Recipes,
 * §15.6) gives the covariance of the log-parameters as A⁻¹JᵀΣJA⁻¹, A = JᵀJ, with J the Jacobian of
 * those residuals at the true parameters (numerical here, from the circuit formulas written out in
 * this class) and Σ = diag(σᵢ²). Each parameter must lie within 4 of those σ (normal theory:
 * exceeded by chance once in 16,000) plus the systematic bounds named at each check. The standards
 * are read at 1 V with 1000 averages, so their noise is at least 10× below the device's; σᵢ carries
 * a 10 % allowance for it.
 */
class SimulatedBenchFitTest {
    static final Path BENCHES = Path.of("..", "sequences", "benches");
    /** 10 Hz to 20 MHz, 10 points a decade: the benches' whole frequency range. */
    static final double[] F = Sweeps.logSpaced(10, 20e6, 64);
    static final double APERTURE_S = 0.1;
    static final int AVERAGES = 10;

    @Test
    void capacitorBenchFitRecoversTheBenchFileParametersWithinNoiseTolerances() throws Exception {
        Path file = BENCHES.resolve("kp-c0805-104.bench.yaml");
        Map<String, Object> device = section(file, "device", "capacitor");
        double c = number(device, "capacitance_f");
        double esr = number(device, "esr_ohm");
        double esl = number(device, "esl_h");
        double tanDelta = number(device, "tan_delta");
        double levelCoefficient = number(device, "level_coefficient_per_vrms");
        double noise = number(section(file, "meter"), "noise");
        double level = 0.01; // V rms: low, so that the AC-level dependence of C stays below 0.04 %
        Measured m = measure(BenchSpec.load(file), level);

        // the bench's C is C0·(1 + a·Vac) with Vac at most the 10 mV drive: tan δ and ESR are those of
        // the file, so the capacitor-tan-delta model is the bench's own circuit
        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.CAPACITOR_TAN_DELTA, m.corrected());
        assertTrue(fit.converged(), fit.notes().toString());
        double[] truth = {c, esr, esl, tanDelta};
        double[] sigma = predictedLogSigma(m, noise, level, truth, (omega, p) -> {
            // ESR + jωESL + 1/(ωC(tan δ + j)): bench file comment and the Capacitor device's Javadoc
            Complex y = new Complex(omega * p[0] * p[3], omega * p[0]);
            return new Complex(p[1], omega * p[2]).add(y.reciprocal());
        });
        assertResidualWithinNoise(fit, m, noise, level);
        // systematic: the level term raises C by at most a·Vac ≤ 0.04·0.01 = 4e-4 (bench file)
        assertRecovered("c_f", c, fit, 4 * sigma[0] + levelCoefficient * level);
        assertRecovered("esr_ohm", esr, fit, 4 * sigma[1]);
        assertRecovered("esl_h", esl, fit, 4 * sigma[2]);
        assertRecovered("tan_delta", tanDelta, fit, 4 * sigma[3] + levelCoefficient * level);
        // bench file comment: SRF = 1/(2π√(ESL·C)) = 17.8 MHz; it is inside the sweep
        assertEquals(1 / (2 * Math.PI * Math.sqrt(esl * c)), fit.srfHz(), 1e-2 * 17.8e6);
    }

    @Test
    void inductorBenchFitRecoversTheBenchFileParametersWithinNoiseTolerances() throws Exception {
        Path file = BENCHES.resolve("kp-l1210-100.bench.yaml");
        Map<String, Object> device = section(file, "device", "inductor");
        double l = number(device, "inductance_h");
        double r = number(device, "winding_resistance_ohm");
        double cp = number(device, "parallel_capacitance_f");
        double rCore = number(device, "core_loss_resistance_ohm");
        double saturation = number(device, "saturation_current_a");
        // no meter.noise in this file: the simulator's default of 1e-4 (README formats-simulator; MeterSpec)
        double noise = 1e-4;
        double level = 1.0; // V rms: at most 1 V/100 Ω = 10 mA rms through the winding
        Measured m = measure(BenchSpec.load(file), level);

        CircuitFit fit = EquivalentCircuitFit.fit(CircuitModel.INDUCTOR_CORE_LOSS, m.corrected());
        assertTrue(fit.converged(), fit.notes().toString());
        double[] truth = {l, r, cp, rCore};
        double[] sigma = predictedLogSigma(m, noise, level, truth, (omega, p) -> {
            // (R + jωL) ∥ Cp ∥ Rcore: bench file and the Inductor device's Javadoc
            Complex y = new Complex(p[1], omega * p[0]).reciprocal().add(new Complex(1 / p[3], omega * p[2]));
            return y.reciprocal();
        });
        assertResidualWithinNoise(fit, m, noise, level);
        // systematic: L(I) = L0/(1 + (I/I½)³) with a peak current of at most √2·10 mA
        double saturationDrop = Math.pow(Math.sqrt(2) * 0.01 / saturation, 3);
        assertRecovered("l_h", l, fit, 4 * sigma[0] + saturationDrop);
        assertRecovered("r_ohm", r, fit, 4 * sigma[1]);
        assertRecovered("cp_f", cp, fit, 4 * sigma[2]);
        assertRecovered("rcore_ohm", rCore, fit, 4 * sigma[3]);
    }

    /**
     * The corrected sweep and the noise σ each corrected value carries (per part, in ohms, for
     * noise 1 and s = 1): σ(Zm)·|dZ/dZm|.
     */
    record Measured(double[] rawSigmaOhm, List<Impedance> corrected) {
    }

    static Measured measure(BenchSpec spec, double levelV) {
        SimulatedBench bench = new SimulatedBench(spec);
        PointRequest standard = request(F[0], 1.0, 1000, 1_000_000);
        bench.setSlot(FixtureSlot.OPEN);
        MeterCorrection.Acquisition open = MeterCorrection.acquire(bench, F, standard);
        bench.setSlot(FixtureSlot.SHORT);
        MeterCorrection.Acquisition shorted = MeterCorrection.acquire(bench, F,
                request(F[0], 1.0, 1000, 2_000_000));
        MeterCorrection correction = MeterCorrection.none().with(MeterCorrection.Standard.OPEN, open.samples())
                .with(MeterCorrection.Standard.SHORT, shorted.samples());
        bench.setSlot(FixtureSlot.DEVICE);
        double[] raw = new double[F.length];
        List<Impedance> out = new ArrayList<>();
        for (int i = 0; i < F.length; i++) {
            PointResult p = bench.measure(request(F[i], levelV, AVERAGES, i));
            Complex zm = new Complex(p.real(), p.imaginary());
            Complex z = correction.apply(F[i], zm);
            Complex dz = new Complex(1e-6 * zm.abs(), 0);
            double gain = correction.apply(F[i], zm.add(dz)).subtract(z).abs() / dz.abs();
            raw[i] = (zm.abs() * (1 + zm.abs() / p.rangeUsedOhm()) + p.rangeUsedOhm() / 1000) * gain;
            out.add(new Impedance(F[i], z.getReal(), z.getImaginary()));
        }
        return new Measured(raw, out);
    }

    static PointRequest request(double frequencyHz, double levelV, int averages, long key) {
        return PointRequest.at(frequencyHz).drive(SourceKind.VOLTAGE, levelV).averages(averages).apertureS(APERTURE_S)
                .noiseKey(key).build();
    }

    /** Residual i's standard deviation (class comment), with the standards' 10 % allowance. */
    static double residualSigma(Measured m, int i, double noise, double levelV) {
        double s = Math.sqrt(0.01 / (APERTURE_S * AVERAGES)) / levelV;
        return 1.1 * noise * s * m.rawSigmaOhm()[i] / m.corrected().get(i).magnitudeOhm();
    }

    /**
     * The linearised standard deviations of ln p (relative standard deviations of p) at the true
     * parameters, for the unweighted fit of modulus-normalised residuals (class comment).
     */
    static double[] predictedLogSigma(Measured m, double noise, double levelV, double[] truth,
            BiFunction<Double, double[], Complex> model) {
        int n = truth.length;
        int rows = 2 * F.length;
        double[][] j = new double[rows][n];
        double[][] var = new double[rows][rows];
        double h = 1e-6;
        for (int i = 0; i < F.length; i++) {
            double omega = 2 * Math.PI * F[i];
            double mod = m.corrected().get(i).magnitudeOhm();
            for (int k = 0; k < n; k++) {
                double[] up = truth.clone();
                double[] down = truth.clone();
                up[k] *= Math.exp(h);
                down[k] *= Math.exp(-h);
                Complex d = model.apply(omega, up).subtract(model.apply(omega, down)).divide(2 * h * mod);
                j[2 * i][k] = d.getReal();
                j[2 * i + 1][k] = d.getImaginary();
            }
            double s = residualSigma(m, i, noise, levelV);
            var[2 * i][2 * i] = s * s;
            var[2 * i + 1][2 * i + 1] = s * s;
        }
        RealMatrix jm = new Array2DRowRealMatrix(j, false);
        RealMatrix aInv = new LUDecomposition(jm.transpose().multiply(jm)).getSolver().getInverse();
        RealMatrix cov = aInv.multiply(jm.transpose()).multiply(new Array2DRowRealMatrix(var, false)).multiply(jm)
                .multiply(aInv);
        double[] sigma = new double[n];
        for (int k = 0; k < n; k++) {
            sigma[k] = Math.sqrt(cov.getEntry(k, k));
        }
        return sigma;
    }

    /**
     * The fit leaves no misfit beyond the noise: its residual sum of squares is at most its
     * expectation Σσᵢ² plus 4 standard deviations √(2Σσᵢ⁴) (a sum of σᵢ²·χ²₁ terms; two residuals per
     * point).
     */
    static void assertResidualWithinNoise(CircuitFit fit, Measured m, double noise, double levelV) {
        double sum2 = 0;
        double sum4 = 0;
        for (int i = 0; i < F.length; i++) {
            double v = Math.pow(residualSigma(m, i, noise, levelV), 2);
            sum2 += 2 * v;
            sum4 += 2 * v * v;
        }
        double rss = Math.pow(fit.residualRms(), 2) * 2 * F.length;
        double bound = sum2 + 4 * Math.sqrt(2 * sum4);
        assertTrue(rss <= bound, "residual sum of squares " + rss + " above what the noise explains, " + bound);
    }

    static void assertRecovered(String key, double truth, CircuitFit fit, double relativeTolerance) {
        double v = fit.value(key);
        assertTrue(Double.isFinite(v), key + " not resolved: " + fit.notes());
        assertTrue(relativeTolerance < 0.2, key + ": tolerance " + relativeTolerance + " too loose to mean anything");
        assertEquals(truth, v, relativeTolerance * truth, key + " (relative tolerance " + relativeTolerance + ")");
    }

    @SuppressWarnings("unchecked")
    static Map<String, Object> section(Path file, String... path) throws Exception {
        Object node = new Load(LoadSettings.builder().build()).loadFromString(Files.readString(file));
        for (String key : path) {
            node = ((Map<String, Object>) node).get(key);
        }
        return (Map<String, Object>) node;
    }

    static double number(Map<String, Object> map, String key) {
        Object v = map.get(key);
        assertTrue(v instanceof Number, key + " missing from the bench file");
        return ((Number) v).doubleValue();
    }
}
