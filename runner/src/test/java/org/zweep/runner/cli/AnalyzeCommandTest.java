package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.TestRunFolders;

class AnalyzeCommandTest {
    @TempDir
    Path tmp;

    static int run(StringWriter out, StringWriter err, String... args) {
        return Cli.run(args, new PrintWriter(out), new PrintWriter(err));
    }

    @Test
    void summarySaysWhichDropsTheBiasSweepNeverReaches() throws Exception {
        // synthetic class-2 curve C0/(1 + (V/10 V)²) up to 6 V only: it falls by 20 % at 5 V, never by 50 %
        TestRunFolders run = new TestRunFolders(tmp.resolve("short-bias"));
        double w = 2 * Math.PI * 1000;
        for (int v = 0; v <= 6; v++) {
            double c = 100e-9 / (1 + Math.pow(v / 10.0, 2));
            run.impedance("bias", List.of(new Impedance(1000, 0.05, -1 / (w * c))), "V", 1.0, "V", v, "none", 0);
        }
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        assertEquals(0, run(out, err, "analyze", run.write().toString()), err.toString());
        String line = out.toString().lines().filter(l -> l.contains("derating at")).findFirst().orElseThrow();
        assertTrue(line.matches("  derating at 1(\\.0+)? kHz: 20 % drop at 5(\\.0+)? V, never falls by 50 %"), line);
    }

    @Test
    void jsonHasTheContractFieldsAndAnalysisJsonIsWritten() throws Exception {
        Path dir = CliTestRuns.capacitorRun(tmp.resolve("run"), 10e6);
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = run(out, err, "analyze", dir.toString(), "--json");
        assertEquals(0, code, err.toString());
        JsonNode root = new ObjectMapper().readTree(out.toString());
        assertEquals(root, new ObjectMapper().readTree(Files.readString(dir.resolve("analysis.json"))));
        JsonNode sweep = root.at("/steps/0");
        assertEquals("sweep", sweep.get("name").asText());
        assertEquals("capacitor", sweep.get("model").asText());
        // the run's part: C = 100 nF, ESR = 20 mΩ, ESL = 1 nH; the two repeats average to R·1.0005, X·0.9995
        assertEquals(100e-9 / 0.9995, sweep.at("/parameters/c_f").asDouble(), 1e-15);
        assertEquals(0.02 * 1.0005, sweep.at("/parameters/esr_ohm").asDouble(), 1e-9);
        assertEquals(1e-9 * 0.9995, sweep.at("/parameters/esl_h").asDouble(), 1e-15);
        for (String k : List.of("c_f", "esr_ohm", "esl_h")) {
            assertTrue(sweep.at("/sigma/" + k).isNumber(), k);
        }
        assertTrue(sweep.get("srf_hz").isNumber());
        assertTrue(sweep.get("residual_rms").isNumber());
        assertEquals(2, sweep.at("/repeats/0/count").asInt());
        // relative spread of R over 1.0 and 1.001: std = 0.001·0.02/√2, mean = 0.02·1.0005 (sample statistics)
        assertEquals(0.001 / Math.sqrt(2) / 1.0005, sweep.at("/repeats/0/relative_spread/r_ohm").asDouble(), 1e-12);
        JsonNode bias = root.at("/steps/1/bias");
        // C0/(1 + (V/10)²) falls by 20 % at V = 5 V exactly (a grid point) and by 50 % at 10 V exactly
        assertEquals(5.0, bias.at("/drop/20").asDouble(), 1e-9);
        assertEquals(10.0, bias.at("/drop/50").asDouble(), 1e-9);
        assertEquals(80.0, bias.at("/points/1/percent").asDouble(), 1e-9);
        assertTrue(root.get("transformer").isNull());
        assertEquals("pass", root.at("/checks/0/result").asText());
        assertEquals("pass", root.at("/checks/1/result").asText());
        assertEquals("pass", root.get("verdict").asText());
        // IEC 60063:2015, E12 series (1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2): nearest to ~100 nF is 100 nF
        assertEquals(100e-9, root.at("/bins/nearest/E12").asDouble(), 1e-20);
        assertEquals("B", root.at("/bins/tolerance_letter").asText()); // IEC 60062:2016 letter code: +0.05 % is within B ±0.1 %, outside W ±0.05 %
    }

    @Test
    void failedSrfCheckGivesExitCodeOne() throws Exception {
        Path dir = CliTestRuns.capacitorRun(tmp.resolve("run"), 20e6); // SRF = 1/(2π√(ESL·C)) = 15.9 MHz
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        assertEquals(1, run(out, err, "analyze", dir.toString()));
        assertTrue(out.toString().contains("SRF in sweep = 15.92 MHz: fail"), out.toString());
    }

    @Test
    void unknownModelIsAUsageErrorOnOneLine() throws Exception {
        Path dir = CliTestRuns.capacitorRun(tmp.resolve("run"), 10e6);
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        assertEquals(2, run(out, err, "analyze", dir.toString(), "--model", "banana"));
        assertTrue(err.toString().startsWith("zweep: unknown model 'banana'"), err.toString());
        assertEquals(1, err.toString().strip().lines().count());
    }

    @Test
    void folderWithoutManifestIsAUsageError() {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        assertEquals(2, run(out, err, "analyze", tmp.toString()));
        assertTrue(err.toString().contains("no run manifest"), err.toString());
    }
}
