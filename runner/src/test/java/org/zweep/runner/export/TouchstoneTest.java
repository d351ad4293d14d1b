package org.zweep.runner.export;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.TestRunFolders;

class TouchstoneTest {
    @TempDir
    Path tmp;

    // R1 10 Ω + L1 1 mH in series, C1 100 nF across: ngspice-39 AC analysis (1 A AC source, Z = V(in)) writes these
    // rows at 100 Hz, 1 kHz and 10 kHz; the 1 kHz row is also the analytic 10.079026 + j6.244509 Ω
    static final List<Impedance> EXAMPLE = List.of(new Impedance(100, 1.0000786E+01, 6.2205940E-01),
            new Impedance(1000, 1.0079026E+01, 6.2445091E+00), new Impedance(10000, 2.7009950E+01, 1.0101320E+02));

    /** A strict reader of the Touchstone rules we rely on (Touchstone File Format Specification, IBIS Open Forum: v1.1 option line and data
     * rules; v2.0 keywords [Version], [Number of Ports], [Number of Frequencies], [Network Data], [End]); returns [f, re, im] rows. */
    static List<double[]> read(String text, String version) {
        List<String> lines = new ArrayList<>();
        for (String raw : text.split("\r?\n")) {
            int bang = raw.indexOf('!');
            String l = (bang >= 0 ? raw.substring(0, bang) : raw).strip();
            if (!l.isEmpty()) {
                lines.add(l);
            }
        }
        int i = 0;
        if (version.equals("2.0")) {
            assertEquals("[version] 2.0", lines.get(i++).toLowerCase(Locale.ROOT)); // first non-comment line
        }
        String[] option = lines.get(i++).split("\\s+");
        assertEquals("#", option[0]);
        assertEquals("hz", option[1].toLowerCase(Locale.ROOT)); // frequency unit: data are in Hz
        assertEquals("z", option[2].toLowerCase(Locale.ROOT));
        assertEquals("ri", option[3].toLowerCase(Locale.ROOT));
        assertEquals("r", option[4].toLowerCase(Locale.ROOT));
        double r = Double.parseDouble(option[5]);
        int n = -1;
        if (version.equals("2.0")) {
            assertEquals("[number of ports] 1", lines.get(i++).toLowerCase(Locale.ROOT));
            String nf = lines.get(i++);
            assertTrue(nf.toLowerCase(Locale.ROOT).startsWith("[number of frequencies]"), nf);
            n = Integer.parseInt(nf.substring(nf.indexOf(']') + 1).strip());
            assertTrue(n > 0);
            assertEquals("[network data]", lines.get(i++).toLowerCase(Locale.ROOT));
            assertEquals("[end]", lines.get(lines.size() - 1).toLowerCase(Locale.ROOT)); // the last keyword
        }
        List<double[]> rows = new ArrayList<>();
        double last = Double.NEGATIVE_INFINITY;
        int end = version.equals("2.0") ? lines.size() - 1 : lines.size();
        for (; i < end; i++) {
            String[] c = lines.get(i).split("\\s+");
            assertEquals(3, c.length, "one-port data line: f re im");
            double f = Double.parseDouble(c[0]);
            assertTrue(f > last, "frequencies strictly increasing");
            last = f;
            double scale = version.equals("2.0") ? 1 : r; // v1.x: Z normalised to R; v2.0: ohms (Touchstone 2.0 specification)
            rows.add(new double[] {f, Double.parseDouble(c[1]) * scale, Double.parseDouble(c[2]) * scale});
        }
        if (n >= 0) {
            assertEquals(n, rows.size());
        }
        return rows;
    }

    @Test
    void version2FileFollowsTheRulesAndHoldsOhmsNotNormalised() {
        String text = Touchstone.write(Touchstone.Version.V2_0, EXAMPLE, List.of("test"), 50);
        List<double[]> rows = read(text, "2.0");
        assertEquals(3, rows.size());
        // v2.0 holds ohms: the ngspice row 1.0079026E+01 6.2445091E+00 at 1 kHz as it is
        assertEquals(1.0079026E+01, rows.get(1)[1], 1e-12);
        assertEquals(6.2445091E+00, rows.get(1)[2], 1e-12);
        assertTrue(text.contains("# Hz Z RI R 50\n"), text);
    }

    @Test
    void version11FileIsNormalisedToTheReferenceResistance() {
        String text = Touchstone.write(Touchstone.Version.V1_1, EXAMPLE, List.of(), 50);
        // v1.1 holds Z/R: the ngspice row at 1 kHz over 50 Ω is 2.0158052E-01 1.2489018E-01
        String line = text.lines().filter(l -> l.startsWith("1.000000000000E+03")).findFirst().orElseThrow();
        String[] c = line.split("\\s+");
        assertEquals(2.0158052E-01, Double.parseDouble(c[1]), 5e-9); // half a unit in the 8th printed digit
        assertEquals(1.2489018E-01, Double.parseDouble(c[2]), 5e-9);
        assertTrue(text.startsWith("# Hz Z RI R 50\n"), "v1.1: the option line is the first non-comment line");
        List<double[]> rows = read(text, "1.1");
        assertEquals(1.0079026E+01, rows.get(1)[1], 1e-9);
    }

    @Test
    void frequenciesThatDoNotIncreaseAreRefused() {
        assertThrows(IllegalArgumentException.class, () -> Touchstone.write(Touchstone.Version.V2_0,
                List.of(EXAMPLE.get(1), EXAMPLE.get(0)), List.of(), 50));
    }

    @Test
    void exportWritesOneFilePerSweepNamedByLevelAndBiasWithRepeatsAveraged() throws Exception {
        List<Impedance> high = EXAMPLE.stream().map(z -> new Impedance(z.frequencyHz(), z.resistanceOhm() * 1.01,
                z.reactanceOhm())).toList();
        Path dir = new TestRunFolders(tmp.resolve("run")).part("inductor", "KP-L1", 1e-3, "H", 20.0, null)
                .impedance("sweep", EXAMPLE, "V", 1.0, "V", 0.0, "none", 0)
                .impedance("sweep", high, "V", 1.0, "V", 0.0, "none", 1)
                .impedance("sweep", EXAMPLE, "A", 0.01, "A", 2.0, "none", 0).write();
        List<Path> files = Exports.touchstone(RunData.read(dir), tmp.resolve("out"), Touchstone.Version.V2_0, 50);
        assertEquals(List.of("sweep_1V_0V.s1p", "sweep_10mA_2A.s1p"),
                files.stream().map(p -> p.getFileName().toString()).toList());
        List<double[]> rows = read(Files.readString(files.get(0)), "2.0");
        assertEquals(1.0079026E+01 * 1.005, rows.get(1)[1], 1e-9); // mean of the two repeats
    }
}
