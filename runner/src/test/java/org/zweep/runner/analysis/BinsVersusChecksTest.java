package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;

/** The bins' "within stated tolerance" never contradicts a check on the part's value without saying why. */
class BinsVersusChecksTest {
    @TempDir
    Path tmp;

    @Test
    void aFailedPointCheckNextToAFittedValueWithinToleranceIsExplained() throws Exception {
        // 100 nF + 20 mΩ + 1 nH: near 10 MHz the apparent Cs = C/(1 − ω²LC) is 165 nF, far outside ±10 %,
        // while the fitted C stays 100 nF (series RLC)
        List<Impedance> sweep = new ArrayList<>();
        for (int i = 0; i < 21; i++) {
            double f = 100e3 * Math.pow(10, i / 10.0);
            double w = 2 * Math.PI * f;
            sweep.add(new Impedance(f, 0.02, w * 1e-9 - 1 / (w * 100e-9)));
        }
        Path dir = new TestRunFolders(tmp.resolve("run")).impedance("sweep", sweep, "V", 1.0, "V", 0.0, "none", 0)
                .check("c-10mhz", "cs_f", "sweep", 10e6, 90e-9, 110e-9).write();
        AnalysisResult a = Analysis.analyze(RunData.read(dir), null);
        assertEquals("fail", a.verdict());
        assertEquals(Boolean.TRUE, a.bins().withinTolerance());
        assertTrue(a.bins().versusChecks().contains("c-10mhz"), a.bins().versusChecks());
        assertTrue(a.bins().versusChecks().contains("the verdict is the checks'"), a.bins().versusChecks());
    }

    @Test
    void agreeingChecksNeedNoExplanation() throws Exception {
        List<Impedance> sweep = new ArrayList<>();
        for (int i = 0; i < 11; i++) {
            double f = 1e3 * Math.pow(10, i / 10.0);
            double w = 2 * Math.PI * f;
            sweep.add(new Impedance(f, 0.02, -1 / (w * 100e-9)));
        }
        Path dir = new TestRunFolders(tmp.resolve("run")).impedance("sweep", sweep, "V", 1.0, "V", 0.0, "none", 0)
                .check("c-1khz", "cs_f", "sweep", 1e3, 90e-9, 110e-9).write();
        AnalysisResult a = Analysis.analyze(RunData.read(dir), null);
        assertEquals("pass", a.verdict());
        assertEquals("", a.bins().versusChecks());
    }
}
