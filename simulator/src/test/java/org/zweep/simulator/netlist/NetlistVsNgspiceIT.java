package org.zweep.simulator.netlist;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The netlist solver against ngspice's AC analysis (the reference tool; ngspice User's Manual,
 * .ac analysis, with a 1 V AC source and Z = v(in)/(-i(V1))). ngspice adds gmin (1e-12 S) to every node, so the
 * agreement is to about 1e-6 of |Z|.
 */
class NetlistVsNgspiceIT {

    @TempDir
    Path dir;

    @BeforeAll
    static void ngspiceIsInstalled() {
        boolean found;
        try {
            Process p = new ProcessBuilder("ngspice", "--version").redirectErrorStream(true)
                    .start();
            p.getInputStream().readAllBytes();
            found = p.waitFor(30, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException | InterruptedException e) {
            found = false;
        }
        if (!found && "true".equals(System.getenv("CI"))) {
            fail("ngspice is not installed; CI needs it (apt-get install -y ngspice)");
        }
        Assumptions.assumeTrue(found, "ngspice is not installed (apt-get install -y ngspice)");
    }

    static List<Arguments> networks() {
        return List.of(
                Arguments.of("series RLC: ESR 20 mΩ, ESL 1 nH, C 100 nF",
                        "R1 hi a 20m\nL1 a b 1n\nC1 b 0 100n\n", ""),
                Arguments.of("parallel resonant tank",
                        "R1 hi a 0.5\nL1 a 0 10u\nC1 hi 0 1n\nRp hi 0 10k\n", ""),
                Arguments.of("five-section LC ladder into 50 ohm, with meg and milli suffixes",
                        "L1 hi n1 1.2uH\nC1 n1 0 470pF\nL2 n1 n2 2.2u\nC2 n2 0 1n\n"
                                + "L3 n2 n3 2.2u\nC3 n3 0 470p\nL4 n3 n4 1.2u\nC4 n4 0 220p\n"
                                + "L5 n4 n5 0.5u\nR5 n5 0 50\nRleak hi 0 1meg\nRs n5 n6 2m\n"
                                + "C6 n6 0 10n\n", ""),
                Arguments.of("coupled inductors, loaded secondary tied to lo",
                        "R1 hi p 1.5\nL1 p 0 10m\nL2 s 0 0.625m\nR2 s 0 50\nK1 L1 L2 0.99\n",
                        ""),
                Arguments.of("coupled inductors, isolated secondary (tied for ngspice)",
                        "R1 hi p 1.5\nL1 p 0 10m\nL2 s1 s2 0.625m\nR2 s1 s2 20\nC2 s1 s2 1n\n"
                                + "K1 L1 L2 0.95\n",
                        "Rtie s2 0 1\n"),
                Arguments.of("three coupled inductors",
                        "L1 hi 0 100u\nL2 a 0 50u\nL3 b 0 25u\nR2 a 0 10\nC3 b 0 10n\n"
                                + "R3 b 0 100\nK12 L1 L2 0.9\nK13 L1 L3 0.5\nK23 L2 L3 0.7\n",
                        ""),
                Arguments.of("twenty elements", TwentyElements.NETLIST, ""));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("networks")
    void impedanceAgreesWithNgspiceAcAnalysis(String name, String netlist, String spiceOnly)
            throws Exception {
        List<double[]> rows = ngspice(netlist + spiceOnly);
        assertTrue(rows.size() >= 60, "ngspice printed " + rows.size() + " rows");
        Netlist ours = Netlist.parse(netlist, name);
        for (double[] row : rows) {
            Complex spice = new Complex(row[1], row[2]);
            Complex z = ours.impedance(row[0]);
            // ngspice AC analysis is the reference; gmin limits agreement to ~1e-6 relative
            assertEquals(0, z.subtract(spice).abs(), 2e-6 * spice.abs() + 1e-9,
                    name + " at " + row[0] + " Hz: ours " + z + ", ngspice " + spice);
        }
    }

    private List<double[]> ngspice(String netlist) throws Exception {
        Path out = dir.resolve("z.txt");
        String deck = "* zweep netlist check\nV1 hi 0 DC 0 AC 1\n" + netlist
                + ".control\nset wr_singlescale\noption numdgt=15\nac dec 10 100 100meg\n"
                + "let z = v(hi)/(-i(V1))\nwrdata " + out + " real(z) imag(z)\nquit\n.endc\n"
                + ".end\n";
        Path cir = dir.resolve("deck.cir");
        Files.writeString(cir, deck, StandardCharsets.UTF_8);
        Process p = new ProcessBuilder("ngspice", "-b", cir.toString()).redirectErrorStream(true)
                .start();
        String log = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "ngspice did not finish");
        assertEquals(0, p.exitValue(), "ngspice failed:\n" + log);
        List<double[]> rows = new ArrayList<>();
        for (String line : Files.readAllLines(out)) {
            String[] f = line.strip().split("\\s+");
            if (f.length == 3) {
                rows.add(new double[] {Double.parseDouble(f[0]), Double.parseDouble(f[1]),
                        Double.parseDouble(f[2])});
            }
        }
        return rows;
    }
}
