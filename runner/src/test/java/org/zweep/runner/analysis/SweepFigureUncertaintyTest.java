package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.verdict.CheckOutcome;

/**
 * Whole-sweep figures (fitted values, the self-resonance, transformer figures) carry their
 * uncertainty into the checks that judge them, and the checks decide with it as point checks do;
 * the bins name a conditional pass as what it is.
 */
class SweepFigureUncertaintyTest {
    @TempDir
    Path tmp;

    /** A 100 nF + 20 mΩ + 1 nH series RLC from 1 MHz to 30 MHz (resonance at 15.92 MHz), u = 1e-3·|Z|. */
    private Path capacitorRun(String check, String parameter, Double min, Double max, String rule) throws Exception {
        List<Impedance> sweep = Sweeps.sweep(Sweeps.logSpaced(1e6, 30e6, 31), Sweeps.seriesRlc(0.02, 1e-9, 100e-9));
        return new TestRunFolders(tmp.resolve(check)).uncertainty(1e-3)
                .impedance("sweep", sweep, "V", 1.0, "V", 0.0, "none", 0)
                .check(check, parameter, "sweep", null, min, max, rule).write();
    }

    private static CheckOutcome only(AnalysisResult a) {
        assertEquals(1, a.checks().size());
        return a.checks().get(0);
    }

    @Test
    void aFittedValueNearItsLimitIsAConditionalPassWithTheFitsUncertainty() throws Exception {
        AnalysisResult a = Analysis.analyze(RunData.read(capacitorRun("c", "c_f", 99e-9, 100.0001e-9, "guarded")), null);
        CircuitFit fit = a.steps().get(0).primaryFit().fit();
        assertTrue(fit.weighted());
        double sigma = fit.sigma().get("c_f");
        assertTrue(sigma > 1e-13 && sigma < 1e-9, "sigma " + sigma);
        CheckOutcome c = only(a);
        assertEquals(2 * sigma, c.expandedU(), 1e-6 * sigma); // U = k·u, k = 2 (JCGM 100:2008, 6.2.1)
        assertEquals(CheckOutcome.Verdict.CONDITIONAL_PASS, c.verdict());
        assertTrue(c.probability() > 0.5 && c.probability() < 0.95, "p " + c.probability());
        assertEquals("conditional pass", a.verdict());
    }

    @Test
    void theSelfResonanceIsJudgedWithItsPropagatedUncertainty() throws Exception {
        double srf = 1 / (2 * Math.PI * Math.sqrt(1e-9 * 100e-9)); // 15.9155 MHz, series RLC (common practice, no source)
        AnalysisResult a = Analysis.analyze(RunData.read(capacitorRun("srf", "srf_hz", srf * 0.99999, null,
                "guarded")), null);
        CircuitFit fit = a.steps().get(0).primaryFit().fit();
        assertEquals(srf, fit.srfHz(), 1e-6 * srf);
        assertTrue(fit.srfU() > 0 && fit.srfU() < 1e-3 * srf, "u(SRF) " + fit.srfU());
        CheckOutcome c = only(a);
        assertEquals(2 * fit.srfU(), c.expandedU(), 1e-9 * srf);
        assertFalse(Double.isNaN(c.probability()));
        // 15.9155 MHz − 10 ppm lies within U of the lower limit: not a proven pass
        assertEquals(CheckOutcome.Verdict.CONDITIONAL_PASS, c.verdict());
        AnalysisResult far = Analysis.analyze(RunData.read(capacitorRun("srf-far", "srf_hz", 10e6, null, "guarded")),
                null);
        assertEquals(CheckOutcome.Verdict.PASS, only(far).verdict());
    }

    @Test
    void theSaturationCurrentIsJudgedWithTheUncertaintyOfItsInterpolatedCrossing() throws Exception {
        // a 10 µH inductor (0.1 Ω) at 100 kHz falling to 9.5, 8.5 and 7 µH at 1, 2 and 3 A: down 10 % at 1.5 A
        double w = 2 * Math.PI * 100e3;
        double[] henries = {10e-6, 9.5e-6, 8.5e-6, 7e-6};
        java.util.function.Function<Double, Path> run = min -> {
            try {
                TestRunFolders t = new TestRunFolders(tmp.resolve("sat-" + min)).part("inductor", "L", 10e-6, "H", null,
                        null).uncertainty(1e-3);
                for (int i = 0; i < henries.length; i++) {
                    t.impedance("bias", List.of(new Impedance(100e3, 0.1, w * henries[i])), "V", 0.5, "A", i, "none", 0);
                }
                return t.check("sat", "saturation", "bias", 100e3, min, null)
                        .withDrop(10.0, "guarded").write();
            } catch (Exception e) {
                throw new IllegalStateException(e);
            }
        };
        AnalysisResult a = Analysis.analyze(RunData.read(run.apply(1.499)), null);
        Derating d = a.steps().get(0).derating().get(0);
        assertEquals(1.5, d.drops().get(10), 1e-9);
        double u = d.dropsU().get(10);
        // u(L) ≈ 1e-3·|Z|/ω ≈ 1e-3·L; ∂I/∂L = 0.5, 0.5, −0.9 A/µH (see DeratingTest): about 11 mA
        assertTrue(u > 5e-3 && u < 20e-3, "u " + u);
        CheckOutcome c = only(a);
        assertEquals(2 * u, c.expandedU(), 1e-12); // U = k·u, k = 2 (JCGM 100:2008, 6.2.1)
        // 1.5 A lies 1 mA above a 1.499 A minimum, well within U: not a proven pass
        assertEquals(CheckOutcome.Verdict.CONDITIONAL_PASS, c.verdict());
        assertEquals(CheckOutcome.Verdict.PASS, only(Analysis.analyze(RunData.read(run.apply(1.4)), null)).verdict());
    }

    @Test
    void anUnweightedFitsFigureHasNoUncertaintyForADecision() throws Exception {
        List<Impedance> sweep = Sweeps.sweep(Sweeps.logSpaced(1e6, 30e6, 31), Sweeps.seriesRlc(0.02, 1e-9, 100e-9));
        Path dir = new TestRunFolders(tmp.resolve("plain")).impedance("sweep", sweep, "V", 1.0, "V", 0.0, "none", 0)
                .check("c", "c_f", "sweep", null, 90e-9, 110e-9, "guarded").write();
        CheckOutcome c = only(Analysis.analyze(RunData.read(dir), null));
        // the scatter about an unweighted fit is not the meter's accuracy: U unknown proves nothing
        assertTrue(Double.isNaN(c.expandedU()));
        assertEquals(CheckOutcome.Verdict.CONDITIONAL_PASS, c.verdict());
    }

    @Test
    void theCouplingAndLeakageCarryTheirUncertaintyFromTheInductances() throws Exception {
        // a 4:1 transformer, L1 = 10 mH, k = 0.99: Lsc = L1·(1 − k²) = 199.0 µH at 1 kHz (common practice,
        // no source); u = 1e-3·|Z| on every point
        Path dir = TestRunFolders.x7Transformer(tmp.resolve("x7")).write();
        double w = 2 * Math.PI * 1000;
        TestRunFolders t = new TestRunFolders(tmp.resolve("x7u")).part("transformer", "KP-T-4", 10e-3, "H", null, 4.0)
                .uncertainty(1e-3)
                .impedance("open", List.of(new Impedance(1000, 2.0, w * 10e-3)), "V", 1.0, "V", 0, "secondary_open", 0)
                .impedance("short", List.of(new Impedance(1000, 2.5, w * 199.0e-6)), "V", 1.0, "V", 0,
                        "secondary_shorted", 0)
                .check("leak", "leakage_h", "short", null, null, 199.1e-6, "guarded")
                .check("coupling", "k", "open", null, 0.98, null, "guarded");
        AnalysisResult a = Analysis.analyze(RunData.read(t.write()), null);
        TransformerResult r = a.transformer();
        double loc = r.openH();
        double lsc = r.shortH();
        List<org.zweep.runner.results.PointRow> rows = new java.util.ArrayList<>();
        RunData.read(tmp.resolve("x7u")).forEachRow(rows::add);
        double uLoc = rows.get(0).uncertainty().of("ls_h");
        double uLsc = rows.get(1).uncertainty().of("ls_h");
        assertEquals(uLoc, r.uOpenH(), 1e-12 * loc);
        assertEquals(uLsc, r.uLeakageH(), 1e-12 * lsc);
        // k = √(1 − Lsc/Loc): u² = (Lsc/(2k·Loc²)·u(Loc))² + (u(Lsc)/(2k·Loc))², JCGM 100:2008, 5.1.2
        double k = r.k();
        double uK = Math.hypot(lsc / (2 * k * loc * loc) * uLoc, uLsc / (2 * k * loc));
        assertEquals(uK, r.uK(), 1e-9 * uK);
        CheckOutcome leak = a.checks().get(0);
        assertEquals(2 * uLsc, leak.expandedU(), 1e-9 * lsc);
        // 199.0 µH with U ≈ 0.4 µH against a 199.1 µH maximum: inside, but not proven
        assertEquals(CheckOutcome.Verdict.CONDITIONAL_PASS, leak.verdict());
        assertEquals(CheckOutcome.Verdict.PASS, a.checks().get(1).verdict());
        // without a stated accuracy the figures' u is unknown, as the points' is
        assertTrue(Double.isNaN(Analysis.analyze(RunData.read(dir), null).transformer().uK()));
    }

    @Test
    void aConditionalPassNextToABinWithinToleranceIsNotCalledAFailure() throws Exception {
        List<Impedance> sweep = Sweeps.sweep(Sweeps.logSpaced(1e3, 10e3, 11), Sweeps.seriesRlc(0.02, 0, 109e-9));
        Path dir = new TestRunFolders(tmp.resolve("cond")).uncertainty(1e-3)
                .impedance("sweep", sweep, "V", 1.0, "V", 0.0, "none", 0)
                .check("cap", "cs_f", "sweep", 1e3, 90e-9, 109.1e-9, "guarded").write();
        AnalysisResult a = Analysis.analyze(RunData.read(dir), null);
        assertEquals(CheckOutcome.Verdict.CONDITIONAL_PASS, only(a).verdict());
        // the bin: 109 nF against 100 nF ± 10 % under the same (guarded) rule, U ≈ 0.1 nF: a proven pass
        assertEquals("pass", a.bins().tolerance().decision().word());
        assertEquals("guarded", a.bins().tolerance().rule());
        String text = a.bins().versusChecks();
        assertFalse(text.contains("failed"), text);
        assertTrue(text.contains("cap (cs_f): conditional pass (inside its limits, but within U of one: not a proven"
                + " pass)"), text);
        assertTrue(text.contains("against the stated tolerance: pass [guarded]."), text);
    }
}
