package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.DerivedParameter;

/**
 * {@code zweep run} and {@code zweep analyze} judge every parameter a check may name the same way
 * on the same run folder: the check lines both print are identical, and the checks built to pass
 * pass and those built to fail fail.
 */
class RunAnalyzeAgreementIT {
    @TempDir
    Path dir;

    /** Every point parameter a check may name on an impedance step: the contract parameters but the frequency. */
    static List<String> impedanceParameters() {
        return DerivedParameter.contract().stream().filter(p -> p != DerivedParameter.FREQUENCY)
                .map(DerivedParameter::key).toList();
    }

    /** A check that passes on any finite value, and one that no value can pass. */
    static String passAndFail(String name, String step, String parameter, String at, String selection) {
        return "  - {name: " + name + "-pass, step: " + step + ", parameter: " + parameter + ", at: " + at + selection
                + ", min: -1e30, max: 1e30}\n"
                + "  - {name: " + name + "-fail, step: " + step + ", parameter: " + parameter + ", at: " + at + selection
                + ", min: 1e30}\n";
    }

    @Test
    void everyImpedanceParameterGetsTheSameVerdictFromRunAndAnalyze() throws Exception {
        Path bench = Sims.sequences().resolve("benches/kp-c0805-104.bench.yaml");
        StringBuilder checks = new StringBuilder();
        for (String p : impedanceParameters()) {
            checks.append(passAndFail(p, "sweep", p, "100 kHz", ""));
        }
        checks.append("  - {name: srf_hz-pass, step: sweep, parameter: srf_hz, min: 1 Hz}\n");
        checks.append("  - {name: srf_hz-fail, step: sweep, parameter: srf_hz, max: 1 Hz}\n");
        String seq = """
                format: zweep-sequence/1
                name: agreement-capacitor
                meter: {bench: %s}
                safety: {max_bias_voltage: 0 V, max_bias_current: 0 A, max_level_voltage: 1 V, max_level_current: 0 A}
                part: {kind: capacitor, name: KP-C0805-104, nominal: 100 nF, tolerance: K}
                steps:
                  - name: sweep
                    frequency: {start: 1 kHz, stop: 20 MHz, per_decade: 5}
                    level: 0.5 V
                checks:
                """.formatted(bench) + checks;
        agree(seq, impedanceParameters().size() * 2 + 2);
    }

    @Test
    void theVoltageRatioGetsTheSameVerdictFromRunAndAnalyze() throws Exception {
        Path bench = Sims.sequences().resolve("benches/kp-t2010-4to1.bench.yaml");
        String seq = """
                format: zweep-sequence/1
                name: agreement-ratio
                meter: {bench: %s}
                safety: {max_bias_voltage: 0 V, max_bias_current: 0 A, max_level_voltage: 1 V, max_level_current: 0 A}
                part: {kind: transformer, name: KP-T2010, nominal: 10 mH, tolerance: K, turns_ratio: "4:1"}
                steps:
                  - name: ratio
                    quantity: voltage_ratio
                    wiring: secondary_open
                    frequency: [1 kHz, 10 kHz]
                    level: 0.5 V
                checks:
                """.formatted(bench) + passAndFail("ratio", "ratio", "ratio", "1 kHz", "");
        agree(seq, 2);
    }

    /** Runs {@code sequence}, analyses the folder, and compares the two commands' check lines and verdicts. */
    private void agree(String sequence, int checks) throws Exception {
        Path file = dir.resolve("seq.yaml");
        Files.writeString(file, sequence);
        Path out = dir.resolve("run");
        Sims.Result run = Sims.zweep("run", file.toString(), "--meter", "sim:" + benchFrom(sequence) + "?timing=none",
                "--out", out.toString(), "--quiet", "--yes");
        assertEquals(1, run.code(), run.out() + run.err()); // the -fail checks fail
        Sims.Result analyze = Sims.zweep("analyze", out.toString());
        assertEquals(1, analyze.code(), analyze.out() + analyze.err());
        List<String> runLines = checkLines(run.out());
        List<String> analyzeLines = checkLines(analyze.out());
        assertEquals(checks, runLines.size(), run.out());
        assertEquals(runLines, analyzeLines);
        for (String line : runLines) {
            String name = line.substring("check ".length()).strip().split(" ")[0];
            String expected = name.endsWith("-pass") ? ": pass" : ": fail";
            assertTrue(line.contains(expected), line);
            assertTrue(!line.contains("no value"), line);
        }
    }

    private static String benchFrom(String sequence) {
        String line = sequence.lines().filter(l -> l.startsWith("meter: {bench: ")).findFirst().orElseThrow();
        return line.substring("meter: {bench: ".length(), line.length() - 1);
    }

    private static List<String> checkLines(String out) {
        List<String> lines = new ArrayList<>();
        out.lines().filter(l -> l.startsWith("check ")).forEach(lines::add);
        return lines;
    }
}
