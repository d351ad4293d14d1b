package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.runner.verdict.CheckOutcome;
import org.junit.jupiter.api.io.TempDir;

class TransformerAnalysisTest {
    @TempDir
    Path tmp;

    @Test
    void x7TransformerFiguresComeOutOfARunFolder() throws Exception {
        // L1 = 10 mH, n = 4, k = 0.99 (TestRunFolders.x7Transformer), computed: M = k√(L1·L2) = 2.475 mH,
        // Lsc1 = L1(1 − k²) = 199.0 µH, V1/V2 = L1/M = n/k = 4.0404
        Path dir = TestRunFolders.x7Transformer(tmp.resolve("run")).check("coupling", "k", "open", null, 0.98, null)
                .write();
        AnalysisResult a = Analysis.analyze(RunData.read(dir), null);
        TransformerResult t = a.transformer();
        assertEquals(0.99, t.k(), 1e-12); // k = √(1 − Lsc/Loc) (JIS C 5602-1986, as Wikipedia "Short-circuit inductance" cites it)
        assertEquals(4.0404, t.voltageRatio(), 1e-4); // the measured V1/V2
        assertEquals(4.000, t.turnsRatio(), 1e-12); // n = k·V1/V2
        assertEquals(2.475e-3, t.mutualH(), 1e-12); // M = k√(L1·L2)
        // L_sc1 = L1·(1 − k²) = 10 mH × (1 − 0.99²) = 199.0 µH; the one leakage figure is the measured L_sc
        assertEquals(199.0e-6, t.shortH(), 1e-15); // L_sc = L1·(1 − k²), from memory
        assertEquals(t.shortH(), t.leakageH(), 0.0);
        assertEquals("4:1", t.turnsRatioText()); // N1:N2 stated one way
        assertEquals("4.04:1", t.voltageRatioText()); // measured V1:V2 = L1/M = 4.0404, 4 significant digits
        List<CheckOutcome> checks = a.checks();
        assertEquals("pass", checks.get(0).result()); // k = 0.99 against our own demo limit k >= 0.98
        assertTrue(AnalysisJson.tree(a).at("/transformer/turns_ratio").isNumber());
    }
}
