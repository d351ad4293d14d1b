package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.DoubleFunction;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.Sweeps;
import org.zweep.runner.analysis.TestRunFolders;

/**
 * {@code zweep analyze --json} against the field contract of issue 6 (an object per step with
 * {@code model}, {@code parameters}, {@code sigma}, {@code srf_hz}, {@code residual_rms},
 * {@code bias}; {@code transformer}), {@code --model} selection, and the one-line exit-2 errors.
 */
class AnalyzeContractTest {
    @TempDir
    Path tmp;

    private final StringWriter out = new StringWriter();
    private final StringWriter err = new StringWriter();

    private int run(String... args) {
        return Cli.run(args, new PrintWriter(out), new PrintWriter(err));
    }

    private JsonNode analyzeJson(Path dir, String... extra) throws Exception {
        List<String> args = new ArrayList<>(List.of("analyze", dir.toString(), "--json"));
        args.addAll(List.of(extra));
        int code = run(args.toArray(String[]::new));
        assertEquals(0, code, err.toString());
        return new ObjectMapper().readTree(out.toString());
    }

    private static List<Impedance> sweep(double fromHz, double toHz, int n, DoubleFunction<Complex> z) {
        return Sweeps.sweep(Sweeps.logSpaced(fromHz, toHz, n), z);
    }

    private static List<String> keys(JsonNode object) {
        List<String> k = new ArrayList<>();
        object.fieldNames().forEachRemaining(k::add);
        return k;
    }

    private static void assertStepContract(JsonNode step, String model, List<String> keys) {
        assertEquals(model, step.get("model").asText());
        assertEquals(keys, keys(step.get("parameters")));
        assertEquals(keys, keys(step.get("sigma")));
        assertTrue(step.has("srf_hz"), "srf_hz present (null when not resolved)");
        assertTrue(step.get("residual_rms").isNumber());
        assertTrue(step.has("bias"));
    }

    private Path capacitorRun(String name) throws Exception {
        // the KP-C0805-104 bench file's values: 100 nF, tan δ 0.012, ESR 25 mΩ, ESL 0.8 nH; SRF 17.8 MHz in the sweep
        return new TestRunFolders(tmp.resolve(name))
                .impedance("sweep", sweep(100, 20e6, 53, Sweeps.lossyCapacitor(0.025, 0.8e-9, 100e-9, 0.012)), "V",
                        0.5, "V", 0, "none", 0)
                .write();
    }

    @Test
    void partFieldsUseTheSameSnakeCaseNamesAsRunJson() throws Exception {
        Path dir = new TestRunFolders(tmp.resolve("p"))
                .part("capacitor", "KP-C0805-104", 100e-9, "F", 10.0, null)
                .impedance("sweep", sweep(100, 20e6, 53, Sweeps.lossyCapacitor(0.025, 0.8e-9, 100e-9, 0.012)), "V",
                        0.5, "V", 0, "none", 0)
                .write();
        JsonNode part = analyzeJson(dir).get("part");
        // README "run.json": part has kind, name, nominal, unit, tolerance_percent, turns_ratio
        assertEquals(List.of("kind", "name", "nominal", "unit", "tolerance_percent", "turns_ratio"), keys(part));
        assertEquals(10.0, part.get("tolerance_percent").asDouble(), 0.0); // the value given above
        assertTrue(part.get("turns_ratio").isNull());
    }

    @Test
    void capacitorStepHasTheContractKeysAndDefaultModel() throws Exception {
        JsonNode step = analyzeJson(capacitorRun("c")).at("/steps/0");
        assertStepContract(step, "capacitor", List.of("c_f", "esr_ohm", "esl_h"));
        assertTrue(step.get("srf_hz").isNumber());
        // the default model has no tan δ term: its C at this sweep is within 1 % of the true 100 nF [calc: D = 0.012]
        assertEquals(100e-9, step.at("/parameters/c_f").asDouble(), 1e-9);
        assertTrue(step.get("bias").isNull(), "no bias sweep");
    }

    @Test
    void modelOptionSelectsTheTanDeltaModelAndItRecoversTheLoss() throws Exception {
        JsonNode step = analyzeJson(capacitorRun("c"), "--model", "capacitor-tan-delta").at("/steps/0");
        assertStepContract(step, "capacitor-tan-delta", List.of("c_f", "esr_ohm", "esl_h", "tan_delta"));
        // noiseless synthetic data: the fit must recover the model's own parameters to 1e-6 relative
        assertEquals(0.012, step.at("/parameters/tan_delta").asDouble(), 0.012 * 1e-6);
        assertEquals(100e-9, step.at("/parameters/c_f").asDouble(), 100e-9 * 1e-6);
        assertEquals(0.025, step.at("/parameters/esr_ohm").asDouble(), 0.025 * 1e-6);
    }

    @Test
    void modelOptionSelectsTheLeakageModel() throws Exception {
        // 1 µF, 0.2 Ω, 2 nH, 200 kΩ leakage: Z = ESR + jωL + 1/(1/Rp + jωC)
        DoubleFunction<Complex> leaky = Sweeps.leakyCapacitor(0.2, 2e-9, 1e-6, 200e3);
        Path dir = new TestRunFolders(tmp.resolve("leaky")).part("capacitor", "KP-C1210-105", 1e-6, "F", 20.0, null)
                .impedance("sweep", sweep(1, 100e6, 81, leaky), "V", 0.5, "V", 0, "none", 0).write();
        JsonNode step = analyzeJson(dir, "--model", "capacitor-leakage").at("/steps/0");
        assertStepContract(step, "capacitor-leakage", List.of("c_f", "esr_ohm", "esl_h", "rp_ohm"));
        assertEquals(200e3, step.at("/parameters/rp_ohm").asDouble(), 200e3 * 1e-6);
    }

    @Test
    void inductorBelowResonanceHasNullSrfAndNullParallelCapacitance() throws Exception {
        // 10 µH, 80 mΩ, 2.8 pF resonates at 30 MHz: at 100 kHz Cp changes Z by ω²LCp = 1e-5, hidden in 1e-3 noise,
        // so cp_f and srf_hz are null
        java.util.Random random = new java.util.Random(17);
        List<Impedance> noisy = sweep(100, 100e3, 31, Sweeps.rlParallelC(0.08, 10e-6, 2.8e-12)).stream()
                .map(z -> new Impedance(z.frequencyHz(), z.resistanceOhm() + 1e-3 * z.magnitudeOhm() * random.nextGaussian(),
                        z.reactanceOhm() + 1e-3 * z.magnitudeOhm() * random.nextGaussian()))
                .toList();
        Path dir = new TestRunFolders(tmp.resolve("l")).part("inductor", "KP-L1210-100", 10e-6, "H", 20.0, null)
                .impedance("sweep", noisy, "V", 0.5, "V", 0, "none", 0).write();
        JsonNode step = analyzeJson(dir).at("/steps/0");
        assertStepContract(step, "inductor", List.of("l_h", "r_ohm", "cp_f"));
        assertTrue(step.at("/parameters/cp_f").isNull(), step.toString());
        assertTrue(step.at("/sigma/cp_f").isNull());
        assertTrue(step.get("srf_hz").isNull());
        // 1e-3 noise on 31 points: L to a few 1e-4 (σ ≈ 1e-3/√31 ≈ 2e-4 per point set); 2e-3 is 10σ
        assertEquals(10e-6, step.at("/parameters/l_h").asDouble(), 10e-6 * 2e-3);
    }

    @Test
    void modelOptionSelectsTheCoreLossModelForAnInductor() throws Exception {
        // the KP-L1210-100 bench file's values: 10 µH, 80 mΩ, 2.8 pF, 3 kΩ core loss
        Path dir = new TestRunFolders(tmp.resolve("core")).part("inductor", "KP-L1210-100", 10e-6, "H", 20.0, null)
                .impedance("sweep", sweep(1e3, 50e6, 71, Sweeps.inductorWithCoreLoss(0.08, 10e-6, 2.8e-12, 3000)), "V", 0.5, "V", 0,
                        "none", 0)
                .write();
        JsonNode step = analyzeJson(dir, "--model", "inductor-core-loss").at("/steps/0");
        assertStepContract(step, "inductor-core-loss", List.of("l_h", "r_ohm", "cp_f", "rcore_ohm"));
        assertEquals(3000, step.at("/parameters/rcore_ohm").asDouble(), 3000 * 1e-6);
    }

    @Test
    void resistorStepHasTheContractKeys() throws Exception {
        // 1 kΩ, 1.5 nH, 0.08 pF (the NgspiceFitIT thick-film part): (R + jωLs) ∥ Cp
        Path dir = new TestRunFolders(tmp.resolve("r")).part("resistor", "KP-R0603-102", 1e3, "Ω", 1.0, null)
                .impedance("sweep", sweep(10e3, 3e9, 51, Sweeps.rlParallelC(1000, 1.5e-9, 0.08e-12)), "V", 0.5, "V", 0,
                        "none", 0)
                .write();
        JsonNode step = analyzeJson(dir).at("/steps/0");
        assertStepContract(step, "resistor", List.of("r_ohm", "ls_h", "cp_f"));
        assertEquals(1000, step.at("/parameters/r_ohm").asDouble(), 1000 * 1e-6);
    }

    @Test
    void biasStepCarriesTheDeratingFiguresOfItsKind() throws Exception {
        // synthetic curves: C0/(1 + (V/10 V)²) falls by 20 % at 5 V, by 50 %
        // at 10 V; L0/(1 + (I/2 A)²) falls by 10 % at 2/3 A, 20 % at 1 A, 30 % at 2·√(3/7) = 1.309 A
        TestRunFolders c = new TestRunFolders(tmp.resolve("cb"));
        TestRunFolders l = new TestRunFolders(tmp.resolve("lb")).part("inductor", "KP-L", 10e-6, "H", 20.0, null);
        double w = 2 * Math.PI * 1000;
        for (int v = 0; v <= 20; v++) {
            double cap = 100e-9 / (1 + Math.pow(v / 10.0, 2));
            c.impedance("bias", List.of(new Impedance(1000, 0.05, -1 / (w * cap))), "V", 0.5, "V", v, "none", 0);
            double amps = v * 0.1;
            double ind = 10e-6 / (1 + Math.pow(amps / 2, 2));
            l.impedance("bias", List.of(new Impedance(1000, 0.08, w * ind)), "A", 0.01, "A", amps, "none", 0);
        }
        JsonNode cb = analyzeJson(c.write()).at("/steps/0/bias");
        assertEquals(List.of("20", "50"), keys(cb.get("drop")));
        // linear interpolation between grid points: 5 V and 10 V are grid points, so exact
        assertEquals(5.0, cb.at("/drop/20").asDouble(), 1e-9);
        assertEquals(10.0, cb.at("/drop/50").asDouble(), 1e-9);
        out.getBuffer().setLength(0);
        JsonNode lb = analyzeJson(l.write()).at("/steps/0/bias");
        assertEquals(List.of("10", "20", "30"), keys(lb.get("drop")));
        assertEquals(1.0, lb.at("/drop/20").asDouble(), 1e-9); // 1 A is a grid point
        // 2/3 A and 1.309 A fall between 0.1 A grid points: linear interpolation is within 5 mA there
        assertEquals(2.0 / 3, lb.at("/drop/10").asDouble(), 5e-3);
        assertEquals(2 * Math.sqrt(3.0 / 7), lb.at("/drop/30").asDouble(), 5e-3);
    }

    @Test
    void transformerObjectHasTheContractKeys() throws Exception {
        // L1 = 10 mH, n = 4, k = 0.99, so Lsc1 = L1(1 − k²) = 199.0 µH (TestRunFolders.x7Transformer)
        Path dir = TestRunFolders.x7Transformer(tmp.resolve("t")).write();
        JsonNode t = analyzeJson(dir).get("transformer");
        for (String k : List.of("turns_ratio", "k", "leakage_h", "mutual_h")) {
            assertTrue(t.get(k).isNumber(), k);
        }
        assertEquals(4.0, t.get("turns_ratio").asDouble(), 1e-12);
        assertEquals(0.99, t.get("k").asDouble(), 1e-12);
    }

    private void assertOneLineUsageError(String... args) {
        assertEquals(2, run(args), out + " / " + err);
        String e = err.toString().strip();
        assertEquals(1, e.lines().count(), e);
        assertTrue(e.startsWith("zweep: "), e);
        assertFalse(e.contains("Exception") || e.contains("\tat "), e);
    }

    @Test
    void missingFolderIsOneLineAndExitTwo() {
        assertOneLineUsageError("analyze", tmp.resolve("nowhere").toString());
        assertTrue(err.toString().contains("no such run folder"), err.toString());
    }

    @Test
    void folderWithoutPointsIsNotARunFolder() throws Exception {
        Path dir = capacitorRun("c");
        Files.delete(dir.resolve("points.csv"));
        assertOneLineUsageError("analyze", dir.toString(), "--json");
        assertTrue(err.toString().contains("not a run folder"), err.toString());
    }

    @Test
    void emptyPointsFileIsOneLineAndExitTwo() throws Exception {
        Path dir = capacitorRun("c");
        Files.writeString(dir.resolve("points.csv"), "");
        assertOneLineUsageError("analyze", dir.toString());
        assertTrue(err.toString().contains("points.csv"), err.toString());
    }

    @Test
    void pointsFileWithOnlyTheHeaderIsOneLineAndExitTwo() throws Exception {
        Path dir = capacitorRun("c");
        String header = Files.readAllLines(dir.resolve("points.csv")).get(0);
        Files.writeString(dir.resolve("points.csv"), header + "\n");
        assertOneLineUsageError("analyze", dir.toString(), "--json");
        assertTrue(err.toString().contains("no measured point"), err.toString());
    }

    @Test
    void corruptManifestIsOneLineAndExitTwo() throws Exception {
        Path dir = capacitorRun("c");
        Files.writeString(dir.resolve("run.json"), "{\"format\": \"zweep-run/1\", \"steps\": [\n");
        assertOneLineUsageError("analyze", dir.toString(), "--json");
        assertTrue(err.toString().contains("run.json"), err.toString());
    }
}
