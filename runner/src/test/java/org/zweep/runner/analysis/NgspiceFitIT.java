package org.zweep.runner.analysis;

import org.zweep.runner.testsupport.Ngspice;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;

/**
 * Fits recover the element values of netlists of real-looking parts, with the sweep computed by
 * ngspice (AC analysis, 1 V source, Z = V/I; ngspice User's Manual, .ac), and written through a run folder.
 */
class NgspiceFitIT {
    @TempDir
    Path tmp;


    /** Runs {@code elements} (between nodes {@code in} and 0) through an AC sweep and returns Z per frequency. */
    private List<Impedance> sweep(String title, String elements, String ac) throws Exception {
        Path out = tmp.resolve("z-" + System.nanoTime() + ".txt");
        String deck = "* " + title + "\nV1 in 0 DC 0 AC 1\n" + elements + "\n.control\nset wr_singlescale\nset wr_vecnames\n"
                + "option numdgt=15\nac " + ac + "\nlet z = v(in)/(-i(V1))\nwrdata " + out + " real(z) imag(z)\nquit\n"
                + ".endc\n.end\n";
        Path cir = tmp.resolve("deck-" + System.nanoTime() + ".cir");
        Files.writeString(cir, deck);
        Process p = new ProcessBuilder(Ngspice.executable(), "-b", cir.toString()).redirectErrorStream(true)
                .redirectOutput(tmp.resolve("ngspice.log").toFile()).start();
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "ngspice finished");
        assertEquals(0, p.exitValue(), Files.readString(tmp.resolve("ngspice.log")));
        List<Impedance> z = new ArrayList<>();
        for (String line : Files.readAllLines(out)) {
            String[] c = line.strip().split("\\s+");
            if (c[0].matches("[-+0-9.eE]+")) {
                z.add(new Impedance(Double.parseDouble(c[0]), Double.parseDouble(c[1]), Double.parseDouble(c[2])));
            }
        }
        return z;
    }

    /** The fit of the sweep after a round trip through a run folder (points.csv + run.json). */
    private CircuitFit fitThroughRunFolder(String kind, String part, double nominal, String unit, List<Impedance> z)
            throws Exception {
        return fitThroughRunFolder(kind, part, nominal, unit, z, null);
    }

    /** As above with {@code model} chosen as {@code --model} does (null: from the part kind). */
    private CircuitFit fitThroughRunFolder(String kind, String part, double nominal, String unit, List<Impedance> z,
            CircuitModel model) throws Exception {
        Path dir = new TestRunFolders(tmp.resolve(part)).part(kind, part, nominal, unit, 10.0, null)
                .impedance("sweep", z, "V", 1.0, "V", 0.0, "none", 0).write();
        AnalysisResult a = Analysis.analyze(RunData.read(dir), model);
        return a.step("sweep").primaryFit().fit();
    }

    @Test
    void mlccParametersAreRecoveredFromAnNgspiceSweepThroughResonance() throws Exception {
        List<Impedance> z = sweep("KP-C0805-104: 100 nF, ESR 15 mohm, ESL 0.7 nH",
                "R1 in a 15m\nL1 a b 0.7n\nC1 b 0 100n", "dec 10 1k 100meg");
        CircuitFit f = fitThroughRunFolder("capacitor", "KP-C0805-104", 100e-9, "F", z);
        assertTrue(f.converged());
        // ngspice prints 16 digits but solves to ~1e-11·|Z|; ESR is 1e-5 of |Z| at 1 kHz, so 1e-5 relative is fair
        assertEquals(100e-9, f.value("c_f"), 100e-9 * 1e-7);
        assertEquals(0.015, f.value("esr_ohm"), 0.015 * 1e-5);
        assertEquals(0.7e-9, f.value("esl_h"), 0.7e-9 * 1e-6);
        // series resonance 1/(2π√(LC)) = 19.0228 MHz, computed
        assertEquals(1 / (2 * Math.PI * Math.sqrt(0.7e-9 * 100e-9)), f.srfHz(), 1.0);
    }

    @Test
    void powerInductorParametersAreRecoveredIncludingTheWindingCapacitance() throws Exception {
        List<Impedance> z = sweep("KP-L1210-101: 100 uH, 0.5 ohm, 3 pF across",
                "R1 in a 0.5\nL1 a 0 100u\nC1 in 0 3p", "dec 20 1k 50meg");
        CircuitFit f = fitThroughRunFolder("inductor", "KP-L1210-101", 100e-6, "H", z);
        assertTrue(f.converged());
        assertEquals(100e-6, f.value("l_h"), 100e-6 * 1e-6);
        assertEquals(0.5, f.value("r_ohm"), 0.5 * 1e-5);
        assertEquals(3e-12, f.value("cp_f"), 3e-12 * 1e-6);
        // zero-phase frequency of R + L with C across, f0·√(1 − R²C/L) = 9.18881 MHz (parallel-resonance algebra), computed
        double f0 = 1 / (2 * Math.PI * Math.sqrt(100e-6 * 3e-12));
        assertEquals(f0 * Math.sqrt(1 - 0.25 * 3e-12 / 100e-6), f.srfHz(), 1.0);
        // the data's zero crossing, interpolated linearly in log f, lies within the grid step around the true one
        // (20 points per decade: a factor 10^(1/20) = 1.122); X of a parallel resonance is far from linear there
        assertTrue(Math.abs(Math.log(f.srfDataHz() / f.srfHz())) < Math.log(10) / 20, f.srfDataHz() + " Hz");
    }

    @Test
    void thickFilmResistorParasiticsAreRecovered() throws Exception {
        List<Impedance> z = sweep("KP-R0603-102: 1 kohm, 1.5 nH, 0.08 pF",
                "R1 in a 1k\nL1 a 0 1.5n\nC1 in 0 0.08p", "dec 10 10k 3g");
        CircuitFit f = fitThroughRunFolder("resistor", "KP-R0603-102", 1e3, "Ω", z);
        assertTrue(f.converged());
        assertEquals(1000, f.value("r_ohm"), 1000 * 1e-7);
        assertEquals(0.08e-12, f.value("cp_f"), 0.08e-12 * 1e-5);
        // ωL at 3 GHz is 28 Ω against 1 kΩ: resolved, to a looser tolerance
        assertEquals(1.5e-9, f.value("ls_h"), 1.5e-9 * 1e-3);
    }

    @Test
    void capacitorSweptFarBelowResonanceReportsEslNotResolved() throws Exception {
        // 4.7 µF with 1 nH resonates at 2.3 MHz; 100 Hz..100 kHz never sees the ESL within ngspice's precision
        List<Impedance> z = sweep("KP-C1206-475: 4.7 uF, ESR 5 mohm, ESL 1 nH",
                "R1 in a 5m\nL1 a b 1n\nC1 b 0 4.7u", "dec 10 100 100k");
        CircuitFit f = fitThroughRunFolder("capacitor", "KP-C1206-475", 4.7e-6, "F", z);
        assertEquals(4.7e-6, f.value("c_f"), 4.7e-6 * 1e-6);
        if (f.parameters().get("esl_h") != null) {
            // if the data do resolve it, the value must be right, not wild
            assertEquals(1e-9, f.value("esl_h"), 3 * f.sigma().get("esl_h"));
        } else {
            assertNull(f.srfHz());
        }
    }

    @Test
    void leakageResistanceOfALeakyCapacitorIsRecoveredFromAnNgspiceSweep() throws Exception {
        List<Impedance> z = sweep("KP-C1210-105: 1 uF, ESR 0.2 ohm, ESL 2 nH, 200 kohm leakage",
                "R1 in a 0.2\nL1 a b 2n\nC1 b 0 1u\nR2 b 0 200k", "dec 10 1 100meg");
        CircuitFit f = fitThroughRunFolder("capacitor", "KP-C1210-105", 1e-6, "F", z, CircuitModel.CAPACITOR_LEAKAGE);
        assertTrue(f.converged(), f.notes().toString());
        // ngspice solves to ~1e-11·|Z| (see above); 1e-5 relative throughout
        assertEquals(1e-6, f.value("c_f"), 1e-6 * 1e-5);
        assertEquals(0.2, f.value("esr_ohm"), 0.2 * 1e-5);
        assertEquals(2e-9, f.value("esl_h"), 2e-9 * 1e-5);
        assertEquals(200e3, f.value("rp_ohm"), 200e3 * 1e-5);
    }

    @Test
    void coreLossResistanceOfAPowerInductorIsRecoveredFromAnNgspiceSweep() throws Exception {
        List<Impedance> z = sweep("KP-L1210-100: 10 uH, 80 mohm, 2.8 pF and 3 kohm core loss across",
                "R1 in a 0.08\nL1 a 0 10u\nC1 in 0 2.8p\nR2 in 0 3k", "dec 20 1k 50meg");
        CircuitFit f = fitThroughRunFolder("inductor", "KP-L1210-100", 10e-6, "H", z, CircuitModel.INDUCTOR_CORE_LOSS);
        assertTrue(f.converged(), f.notes().toString());
        // the netlist's element values through ngspice's AC sweep; 1e-5 relative as above
        assertEquals(10e-6, f.value("l_h"), 10e-6 * 1e-6);
        assertEquals(0.08, f.value("r_ohm"), 0.08 * 1e-5);
        assertEquals(2.8e-12, f.value("cp_f"), 2.8e-12 * 1e-6);
        assertEquals(3000, f.value("rcore_ohm"), 3000 * 1e-5);
    }
}
