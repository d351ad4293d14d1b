package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class ConvertUncertaintyTest {

    @Test
    void gumH2ResistanceAndReactanceGiveItsMagnitudeUncertaintyAndCorrelations() throws Exception {
        // JCGM 100:2008, H.2, Table H.3 (approach 1): R = 127.732 Ω, u(R) = 0.071 Ω, X = 219.847 Ω,
        // u(X) = 0.295 Ω, r(R, X) = −0.588 → |Z| = 254.260 Ω, u(|Z|) = 0.236 Ω, r(R, Z) = −0.485, r(X, Z) = 0.993
        JsonNode node = ConvertCommandTest.json("convert", "-f", "50", "--r", "127.732", "--x", "219.847",
                "--u-r", "0.071", "--u-x", "0.295", "--correlation", "-0.588");
        assertEquals(254.260, node.get("z_ohm").asDouble(), 0.0005); // JCGM 100:2008, H.2, Table H.3
        assertEquals(0.236, node.get("u_z_ohm").asDouble(), 0.0005); // same
        assertEquals(0.472, node.get("U_z_ohm").asDouble(), 0.001); // k = 2 times the same
        assertEquals(-0.485, node.get("correlations").get("r_ohm,z_ohm").asDouble(), 0.0005); // same
        assertEquals(0.993, node.get("correlations").get("x_ohm,z_ohm").asDouble(), 0.001); // same
        assertEquals(0.071, node.get("u_r_ohm").asDouble(), 1e-12); // the input
        assertEquals(2.0, node.get("coverage_factor").asDouble());
    }

    @Test
    void theMonteCarloCheckIsQuietWhereTheLinearLawHoldsAndSpeaksWhereItFails() throws Exception {
        // JCGM 100:2008, H.2 inputs (R = 127.732 Ω, u 0.071 Ω; X = 219.847 Ω, u 0.295 Ω; r = −0.588):
        // every parameter is smooth within ±u, so JCGM 101:2008, 8.2 validates the linear law
        JsonNode h2 = ConvertCommandTest.json("convert", "-f", "50", "--r", "127.732", "--x", "219.847",
                "--u-r", "0.071", "--u-x", "0.295", "--correlation", "-0.588");
        assertEquals(0, h2.get("monte_carlo").size(), h2.get("monte_carlo").toString());
        // a nearly lossless capacitor, R = 0.01 ± 0.01 Ω on X = −1591.5 Ω: Q = |X|/R has its pole within
        // ±u of R (JCGM 101:2008, 5.10: the linear law fails for a model markedly non-linear within u),
        // while D = R/|X| is linear in R and stays validated
        JsonNode lossless = ConvertCommandTest.json("convert", "-f", "1kHz", "--r", "0.01", "--x", "-1591.5",
                "--u-r", "0.01", "--u-x", "1");
        JsonNode mc = lossless.get("monte_carlo");
        assertTrue(mc.has("q"), mc.toString());
        assertTrue(!mc.has("d"), mc.toString());
        double q = lossless.get("q").asDouble();
        double uQ = lossless.get("u_q").asDouble();
        // R's draws cross zero, so the Monte Carlo interval of Q reaches far below the linear one's low end
        assertTrue(mc.get("q").get("low95").asDouble() < q - 1.96 * uQ, mc.toString());
        ConvertCommandTest.Run table = ConvertCommandTest.zweep("convert", "-f", "1kHz", "--r", "0.01", "--x",
                "-1591.5", "--u-r", "0.01", "--u-x", "1");
        assertTrue(table.out().contains("the linear law does not hold here for Q"), table.out());
    }

    @Test
    void everyContractParameterGetsUAndU() throws Exception {
        JsonNode node = ConvertCommandTest.json("convert", "-f", "1kHz", "--cs", "1uF", "--esr", "1",
                "--u-r", "10m", "--u-x", "50m");
        List<String> names = new ArrayList<>();
        node.fieldNames().forEachRemaining(names::add);
        for (String key : List.of("r_ohm", "x_ohm", "z_ohm", "theta_deg", "delta_deg", "q", "d", "g_s", "b_s", "cs_f",
                "cp_f", "ls_h", "lp_h", "rs_ohm", "rp_ohm")) {
            assertTrue(names.contains("u_" + key), key);
            assertEquals(2 * node.get("u_" + key).asDouble(), node.get("U_" + key).asDouble(), 0.0, key);
        }
        // Cs = −1/(ωX): u(Cs)/Cs = u(X)/|X| = 0.05/159.155 (first order), common practice, no source
        assertEquals(1e-6 * 0.05 / 159.15494, node.get("u_cs_f").asDouble(), 1e-15);
    }

    @Test
    void polarUncertaintiesAreAcceptedAndTheTableShowsUAndExpandedU() {
        ConvertCommandTest.Run run = ConvertCommandTest.zweep("convert", "-f", "1kHz", "--z", "100", "--theta", "-90",
                "--u-z", "0.5", "--u-theta", "0.5729578");
        assertEquals(ExitCode.OK, run.exitCode(), run.err());
        // |Z| = 100 Ω at −90°, u(θ) = 0.01 rad: u(R) = 100 Ω · 0.01 = 1 Ω, u(X) = u(|Z|) = 0.5 Ω
        assertTrue(run.out().matches("(?s).*\\nR +0 Ω +1\\.00 Ω +2\\.00 Ω\\n.*"), run.out());
        assertTrue(run.out().matches("(?s).*\\nX +-100\\.000 Ω +500 mΩ +1\\.00 Ω\\n.*"), run.out());
        assertTrue(run.out().contains("r(R, X) = 0.000"), run.out());
    }

    @Test
    void mixingRectangularAndPolarUncertaintiesIsRefused() {
        ConvertCommandTest.Run run = ConvertCommandTest.zweep("convert", "-f", "1kHz", "--r", "1", "--x", "1",
                "--u-r", "0.1", "--u-theta", "1");
        assertEquals(ExitCode.USAGE, run.exitCode());
        assertTrue(run.err().contains("give --u-r/--u-x or --u-z/--u-theta, not both"), run.err());
    }

    @Test
    void aCorrelationBeyondOneIsRefused() {
        ConvertCommandTest.Run run = ConvertCommandTest.zweep("convert", "-f", "1kHz", "--r", "1", "--x", "1",
                "--u-r", "0.1", "--correlation", "1.2");
        assertEquals(ExitCode.USAGE, run.exitCode());
        assertTrue(run.err().contains("--correlation \"1.2\" is out of range"), run.err());
    }
}
