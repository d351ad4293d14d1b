package org.zweep.runner.export;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.TestRunFolders;
import org.zweep.runner.cli.Cli;

/**
 * The CSV and JSON exports, read back: field set, row selection, quoting (RFC 4180) and values,
 * with derived values checked against the textbook series formulas Cs = −1/(ωX), |Z| = √(R² + X²),
 * D = R/|X| written out here.
 */
class ExportsTest {
    @TempDir
    Path tmp;

    static final String STEP = "sweep, \"1 V\""; // a comma and quotes, to exercise CSV quoting

    /** A 100 nF, 20 mΩ, 1 nH capacitor at three frequencies, a no-value point and a voltage-ratio row. */
    private Path run() throws Exception {
        List<Impedance> z = new ArrayList<>();
        for (double f : new double[] {100e3, 1e6, 10e6}) {
            double w = 2 * Math.PI * f;
            z.add(new Impedance(f, 0.02, w * 1e-9 - 1 / (w * 100e-9)));
        }
        return new TestRunFolders(tmp.resolve("run")).impedance(STEP, z, "V", 1.0, "V", 0.0, "none", 0)
                .noValue(STEP, 20e6).ratio("ratio", 1000, 0.25).write();
    }

    private static int cli(StringWriter out, StringWriter err, String... args) {
        return Cli.run(args, new PrintWriter(out), new PrintWriter(err));
    }

    /** RFC 4180 fields of one line: commas separate, a quoted field may hold commas and doubled quotes. */
    static List<String> fields(String line) {
        List<String> out = new ArrayList<>();
        StringBuilder cur = new StringBuilder();
        boolean quoted = false;
        for (int i = 0; i < line.length(); i++) {
            char c = line.charAt(i);
            if (quoted) {
                if (c == '"' && i + 1 < line.length() && line.charAt(i + 1) == '"') {
                    cur.append('"');
                    i++;
                } else if (c == '"') {
                    quoted = false;
                } else {
                    cur.append(c);
                }
            } else if (c == '"') {
                quoted = true;
            } else if (c == ',') {
                out.add(cur.toString());
                cur.setLength(0);
            } else {
                cur.append(c);
            }
        }
        out.add(cur.toString());
        return out;
    }

    @Test
    void csvReadsBackWithTheDocumentedColumnsAndExactValues() throws Exception {
        Path dir = run();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        assertEquals(0, cli(out, err, "export", dir.toString(), "--format", "csv"), err.toString());
        Path file = dir.resolve("export.csv");
        assertEquals(file.toString(), out.toString().strip());
        List<String> lines = Files.readAllLines(file);
        List<String> header = fields(lines.get(0));
        assertEquals(List.of("step", "repeat", "quantity", "wiring", "frequency_hz", "drive_mode", "level", "bias_mode",
                "bias", "r_ohm", "x_ohm", "z_ohm", "theta_deg", "cs_f", "cp_f", "ls_h", "lp_h", "rs_ohm", "rp_ohm", "d",
                "q", "ratio", "run_id", "serial", "lot", "verdict"), header);
        // three impedance points and the ratio row; the point without a value is left out
        assertEquals(5, lines.size());
        List<String> first = fields(lines.get(1));
        assertEquals(header.size(), first.size());
        assertEquals(STEP, first.get(header.indexOf("step")));
        double f = Double.parseDouble(first.get(header.indexOf("frequency_hz")));
        double r = Double.parseDouble(first.get(header.indexOf("r_ohm")));
        double x = Double.parseDouble(first.get(header.indexOf("x_ohm")));
        double w = 2 * Math.PI * 100e3;
        assertEquals(100e3, f);
        // Double.toString round-trips exactly (RUNFOLDER.md number form)
        assertEquals(w * 1e-9 - 1 / (w * 100e-9), x);
        assertEquals(0.02, r);
        assertEquals(-15.91486599, x, 1e-8); // Im Z at 100 kHz, also from ngspice-39's AC analysis of the same series RLC
        assertEquals(-1 / (w * x), Double.parseDouble(first.get(header.indexOf("cs_f"))), 1e-22);
        assertEquals(Math.hypot(r, x), Double.parseDouble(first.get(header.indexOf("z_ohm"))), 1e-12);
        assertEquals(r / Math.abs(x), Double.parseDouble(first.get(header.indexOf("d"))), 1e-15);
        assertEquals("", first.get(header.indexOf("ratio")));
        List<String> ratio = fields(lines.get(4));
        assertEquals("voltage_ratio", ratio.get(header.indexOf("quantity")));
        assertEquals(0.25, Double.parseDouble(ratio.get(header.indexOf("ratio"))));
        for (String derived : List.of("z_ohm", "theta_deg", "cs_f", "cp_f", "ls_h", "lp_h", "rs_ohm", "rp_ohm", "d",
                "q")) {
            assertEquals("", ratio.get(header.indexOf(derived)), derived + " is not applicable to a voltage ratio");
        }
    }

    @Test
    void jsonReadsBackWithManifestPointsAndAnalysis() throws Exception {
        Path dir = run();
        Path file = tmp.resolve("out").resolve("all.json");
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        assertEquals(0, cli(out, err, "export", dir.toString(), "--format", "json", "--out", file.toString()),
                err.toString());
        assertEquals(file.toString(), out.toString().strip());
        JsonNode root = new ObjectMapper().readTree(Files.readString(file));
        assertEquals("zweep-export/1", root.get("format").asText());
        assertEquals("KP-C0805-104", root.at("/run/part/name").asText());
        assertEquals("zweep-run/1", root.at("/run/format").asText());
        JsonNode points = root.get("points");
        assertEquals(4, points.size());
        List<String> keys = new ArrayList<>();
        points.get(0).fieldNames().forEachRemaining(keys::add);
        assertEquals(List.of("step", "repeat", "quantity", "wiring", "frequency_hz", "drive_mode", "level", "bias_mode",
                "bias", "r_ohm", "x_ohm", "z_ohm", "theta_deg", "cs_f", "cp_f", "ls_h", "lp_h", "rs_ohm", "rp_ohm", "d",
                "q", "ratio", "time"), keys);
        JsonNode p = points.get(2);
        double w = 2 * Math.PI * 10e6;
        double x = w * 1e-9 - 1 / (w * 100e-9);
        assertEquals(STEP, p.get("step").asText());
        assertEquals(10e6, p.get("frequency_hz").asDouble());
        assertEquals(x, p.get("x_ohm").asDouble());
        // above resonance X > 0: Ls = X/ω is positive and Cs negative (meters show them so)
        assertEquals(x / w, p.get("ls_h").asDouble(), 1e-22);
        assertEquals(-1 / (w * x), p.get("cs_f").asDouble(), 1e-20);
        assertTrue(p.get("ratio").isNull());
        assertEquals("2024-05-01T10:00:00.300Z", p.get("time").asText());
        JsonNode ratio = points.get(3);
        assertTrue(ratio.get("cs_f").isNull());
        assertEquals(0.25, ratio.get("ratio").asDouble());
        assertEquals("zweep-analysis/1", root.at("/analysis/format").asText());
        assertEquals(STEP, root.at("/analysis/steps/0/name").asText());
        // three frequencies are too few for a three-parameter fit (it needs parameters + 1): no model
        assertTrue(root.at("/analysis/steps/0/model").isNull());
    }
}
