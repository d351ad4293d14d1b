package org.zweep.driver.uncertainty;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.EnumSet;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/**
 * The linear law against the Monte Carlo method, with JCGM 101:2008, 8.2's validation: the linear
 * 95 % interval is accepted when both of its ends are within the numerical tolerance (half a unit
 * of the second significant digit of u, JCGM 101:2008, 7.9.2) of the Monte Carlo interval's ends.
 */
class MonteCarloTest {

    private static final int TRIALS = 1_000_000; // JCGM 101:2008, 7.2.2: 10⁶ trials for a 95 % interval
    private static final long SEED = 20261203L;

    private static boolean validated(UncertainImpedance z, DerivedParameter p, MonteCarlo.Result mc) {
        double u = z.standardUncertainty(p);
        return MonteCarlo.validatesLinear(p.of(z.value()), u, mc, MonteCarlo.numericalTolerance(u, 2));
    }

    @Test
    void aWellConditionedCapacitorValidatesTheLinearLawForEveryParameter() {
        // 1 µF with 1 Ω ESR at 1 kHz, read to 0.1 % in R and 0.03 % in X
        UncertainImpedance z = new UncertainImpedance(new Impedance(1e3, 1.0, -159.155), 0.001, 0.05, 0.2);
        List<DerivedParameter> all = List.of(DerivedParameter.Z, DerivedParameter.THETA, DerivedParameter.DELTA,
                DerivedParameter.Q, DerivedParameter.D, DerivedParameter.G, DerivedParameter.B, DerivedParameter.CS,
                DerivedParameter.CP, DerivedParameter.LS, DerivedParameter.LP, DerivedParameter.RS, DerivedParameter.RP);
        Map<DerivedParameter, MonteCarlo.Result> mc = MonteCarlo.propagate(z, all, TRIALS, SEED);
        for (DerivedParameter p : all) {
            assertTrue(validated(z, p, mc.get(p)), () -> p + ": linear u = " + z.standardUncertainty(p) + ", MC "
                    + mc.get(p));
            assertEquals(z.standardUncertainty(p), mc.get(p).standardUncertainty(), 0.01 * z.standardUncertainty(p),
                    p.toString());
        }
    }

    @Test
    void nearlyLosslessPartQIsNotValidatedWhileDIs() {
        // R = 0.02 Ω ± 0.01 Ω on X = 100 Ω: Q = |X|/R ≈ 5000 is far from linear in R (JCGM 101:2008, 5.10:
        // the law fails when the model is markedly non-linear within the uncertainty), D = R/|X| is linear.
        UncertainImpedance z = new UncertainImpedance(new Impedance(1e3, 0.02, 100), 0.01, 0.01, 0);
        Map<DerivedParameter, MonteCarlo.Result> mc = MonteCarlo.propagate(z,
                EnumSet.of(DerivedParameter.Q, DerivedParameter.D), TRIALS, SEED);
        assertFalse(validated(z, DerivedParameter.Q, mc.get(DerivedParameter.Q)), mc.get(DerivedParameter.Q)::toString);
        assertTrue(validated(z, DerivedParameter.D, mc.get(DerivedParameter.D)), mc.get(DerivedParameter.D)::toString);
        // the Monte Carlo interval is strongly skewed: its upper end is far beyond Q + 1.96·u
        double q = DerivedParameter.Q.of(z.value());
        assertTrue(mc.get(DerivedParameter.Q).high95() > q + 10 * z.standardUncertainty(DerivedParameter.Q));
    }

    @Test
    void nearlyPureResistanceQNearZeroIsNotValidated() {
        // X = 0.05 Ω ± 0.1 Ω on R = 10 Ω: Q = |X|/R folds at X = 0, so its distribution is not normal.
        UncertainImpedance z = new UncertainImpedance(new Impedance(1e3, 10, 0.05), 0.01, 0.1, 0);
        Map<DerivedParameter, MonteCarlo.Result> mc = MonteCarlo.propagate(z,
                EnumSet.of(DerivedParameter.Q, DerivedParameter.X), TRIALS, SEED);
        assertFalse(validated(z, DerivedParameter.Q, mc.get(DerivedParameter.Q)), mc.get(DerivedParameter.Q)::toString);
        assertTrue(mc.get(DerivedParameter.Q).low95() >= 0); // Q is never negative, the linear interval is
        assertTrue(validated(z, DerivedParameter.X, mc.get(DerivedParameter.X)), mc.get(DerivedParameter.X)::toString);
    }

    @Test
    void seriesCapacitanceNearResonanceIsNotValidatedWhileLsIs() {
        // X = −0.5 Ω ± 0.3 Ω (near series resonance): Cs = −1/(ωX) has a pole inside the interval.
        UncertainImpedance z = new UncertainImpedance(new Impedance(1e6, 0.1, -0.5), 0.01, 0.3, 0);
        Map<DerivedParameter, MonteCarlo.Result> mc = MonteCarlo.propagate(z,
                EnumSet.of(DerivedParameter.CS, DerivedParameter.LS), TRIALS, SEED);
        assertFalse(validated(z, DerivedParameter.CS, mc.get(DerivedParameter.CS)),
                mc.get(DerivedParameter.CS)::toString);
        assertTrue(validated(z, DerivedParameter.LS, mc.get(DerivedParameter.LS)),
                mc.get(DerivedParameter.LS)::toString);
    }

    @Test
    void theSameSeedGivesTheSameResult() {
        UncertainImpedance z = new UncertainImpedance(new Impedance(1e3, 1, -100), 0.1, 0.1, 0);
        assertEquals(MonteCarlo.propagate(z, EnumSet.of(DerivedParameter.Z), 1000, 7),
                MonteCarlo.propagate(z, EnumSet.of(DerivedParameter.Z), 1000, 7));
    }
}
