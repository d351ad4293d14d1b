package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.PointRow;

/**
 * Host-side and meter-side compensation on the simulator, with a fixture whose residuals dominate
 * the part's impedance at the top of the sweep: both recover the part as an ideal fixture shows
 * it, and agree with each other within the noise.
 */
class CompensationIT {
    @TempDir
    Path dir;

    /** The shipped capacitor bench with the fixture replaced. */
    Path bench(String name, String fixture) throws Exception {
        String text = Files.readString(Sims.sequences().resolve("benches/kp-c0805-104.bench.yaml"));
        int from = text.indexOf("fixture:");
        int to = text.indexOf("load:");
        Path p = dir.resolve(name + ".bench.yaml");
        Files.writeString(p, text.substring(0, from) + fixture + text.substring(to));
        return p;
    }

    Map<Integer, PointRow> run(Path bench, String compensation) throws Exception {
        String seq = """
                format: zweep-sequence/1
                name: comp-%s
                meter:
                  address: "sim:%s"
                safety:
                  max_bias_voltage: 0 V
                  max_bias_current: 0 A
                  max_level_voltage: 1 V
                  max_level_current: 0 A
                fixture:
                  terminals: 4
                  compensation: %s
                part:
                  kind: capacitor
                  nominal: 100 nF
                  tolerance: K
                steps:
                  - name: sweep
                    frequency: {start: 1 kHz, stop: 1 MHz, points: 7, spacing: log}
                    level: 0.5 V
                    integration: 20 ms
                """.formatted(compensation, bench, compensation);
        Path file = dir.resolve("comp-" + compensation + "-" + bench.getFileName() + ".yaml");
        Files.writeString(file, seq);
        Path out = dir.resolve("out-" + file.getFileName());
        Sims.Result r = Sims.zweep("run", file.toString(), "--meter", "sim:" + bench + "?timing=none", "--out",
                out.toString(), "--seed", "5", "--quiet");
        assertEquals(0, r.code(), r.out() + r.err());
        return Rows.of(out);
    }

    static double relErr(PointRow a, PointRow b) {
        return Math.hypot(a.rOhm() - b.rOhm(), a.xOhm() - b.xOhm()) / Math.hypot(b.rOhm(), b.xOhm());
    }

    @Test
    void hostAndMeterSideCompensationRecoverThePartBehindADominantFixtureAndAgree() throws Exception {
        // 2 ohm + 300 nH in series and 40 pF across: at 1 MHz |jwL| = 1.9 ohm against the part's 1.6 ohm
        Path bad = bench("residual", """
                fixture:
                  connection: 4-terminal
                  residual_resistance_ohm: 2.0
                  residual_inductance_h: 300.0e-9
                  stray_conductance_s: 1.0e-8
                  stray_capacitance_f: 40.0e-12
                  lead_resistance_ohm: 0.06
                """);
        Path ideal = bench("ideal", """
                fixture:
                  connection: 4-terminal
                  residual_resistance_ohm: 0
                  residual_inductance_h: 0
                  stray_conductance_s: 0
                  stray_capacitance_f: 0
                  lead_resistance_ohm: 0.06
                """);
        Map<Integer, PointRow> truth = run(ideal, "none");
        Map<Integer, PointRow> raw = run(bad, "none");
        Map<Integer, PointRow> host = run(bad, "host");
        Map<Integer, PointRow> meter = run(bad, "meter");
        int top = 6; // 1 MHz
        assertTrue(relErr(raw.get(top), truth.get(top)) > 0.5, "the residuals dominate: raw error "
                + relErr(raw.get(top), truth.get(top)));
        for (int i = 0; i <= top; i++) {
            // the bench's noise is 1e-4 relative (kp-c0805-104.bench.yaml); 1 % leaves room for the
            // noise of the standards and for the meter's grid interpolation
            assertTrue(relErr(host.get(i), truth.get(i)) < 0.01, "host vs truth at point " + i + ": "
                    + relErr(host.get(i), truth.get(i)));
            assertTrue(relErr(meter.get(i), truth.get(i)) < 0.01, "meter vs truth at point " + i + ": "
                    + relErr(meter.get(i), truth.get(i)));
            assertTrue(relErr(host.get(i), meter.get(i)) < 0.01, "host vs meter at point " + i);
        }
    }
}
