package org.zweep.runner.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.TestRunFolders;

/** Run folders shared by the command and report tests. */
public final class CliTestRuns {
    private CliTestRuns() {
    }

    /** A 100 nF capacitor: a 31-point sweep (ESR 20 mΩ, ESL 1 nH), a bias sweep at 1 kHz, two repeats. */
    public static Path capacitorRun(Path dir, Double srfMin) throws Exception {
        List<Impedance> sweep = new ArrayList<>();
        for (int i = 0; i < 31; i++) {
            double f = 100e3 * Math.pow(10, i / 10.0);
            double w = 2 * Math.PI * f;
            sweep.add(new Impedance(f, 0.02, w * 1e-9 - 1 / (w * 100e-9)));
        }
        List<Impedance> again = sweep.stream()
                .map(z -> new Impedance(z.frequencyHz(), z.resistanceOhm() * 1.001, z.reactanceOhm() * 0.999)).toList();
        TestRunFolders run = new TestRunFolders(dir).impedance("sweep", sweep, "V", 1.0, "V", 0.0, "none", 0)
                .impedance("sweep", again, "V", 1.0, "V", 0.0, "none", 1);
        // synthetic class-2 bias curve C(V) = C0/(1 + (V/V0)²), V0 = 10 V
        for (int v = 0; v <= 25; v += 5) {
            double c = 100e-9 / (1 + Math.pow(v / 10.0, 2));
            double w = 2 * Math.PI * 1000;
            run.impedance("bias", List.of(new Impedance(1000, 0.05, -1 / (w * c))), "V", 1.0, "V", v, "none", 0);
        }
        run.check("c at 100 kHz", "cs_f", "sweep", 100e3, 90e-9, 110e-9)
                .check("srf", "srf_hz", "sweep", null, srfMin, null);
        return run.write();
    }

}
