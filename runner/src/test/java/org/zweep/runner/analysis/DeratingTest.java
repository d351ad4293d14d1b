package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class DeratingTest {
    @Test
    void saturationCurrentsOfTheSyntheticInductorMatchTheExactValues() {
        // synthetic inductor L(I) = L0/(1 + (I/I0)²), L0 = 10 µH, I0 = 5 A: x % down at I = I0·√(1/(1 − x) − 1)
        int n = 401;
        double[] i = new double[n];
        double[] l = new double[n];
        for (int k = 0; k < n; k++) {
            i[k] = k * 0.025;
            l[k] = 10e-6 / (1 + Math.pow(i[k] / 5, 2));
        }
        Derating d = Derating.of("ls_h", 100e3, 0.1, "A", i, l, Derating.INDUCTOR_DROPS);
        // exact: 1.6667 A, 2.5000 A, 3.2733 A; linear interpolation on a 25 mA grid errs by
        // at most h²/8·|I''(L)|/|I'(L)|-order terms, well below 0.5 mA here
        assertEquals(5 * Math.sqrt(1 / 0.9 - 1), d.drops().get(10), 5e-4);
        assertEquals(2.5000, d.drops().get(20), 5e-4);
        assertEquals(3.2733, d.drops().get(30), 5e-4);
        assertTrue(d.notes().isEmpty(), d.notes().toString());
    }

    @Test
    void dropIsInterpolatedLinearlyBetweenTheTwoPointsAroundIt() {
        // C falls from 100 % at 0 V to 90 % at 10 V and 60 % at 20 V: 80 % lies a third of the way from 10 to 20 V
        // (plain linear interpolation)
        Derating d = Derating.of("cs_f", 1e3, 1.0, "V", new double[] {20, 0, 10}, new double[] {60e-9, 100e-9, 90e-9},
                Derating.CAPACITOR_DROPS);
        assertEquals(10 + 10.0 / 3, d.drops().get(20), 1e-12);
        assertNull(d.drops().get(50));
        assertEquals(60.0, d.points().get(2).percent(), 1e-12);
        assertTrue(d.notes().stream().anyMatch(s -> s.startsWith("never falls by 50 %")), d.notes().toString());
    }

    @Test
    void sweepWithoutAZeroBiasPointIsRelativeToItsLowestBiasAndSaysSo() {
        Derating d = Derating.of("cs_f", 1e3, 1.0, "V", new double[] {1, 2}, new double[] {1e-9, 0.4e-9},
                Derating.CAPACITOR_DROPS);
        assertEquals(1.0, d.referenceBias());
        assertTrue(d.notes().get(0).startsWith("no 0 V point"), d.notes().toString());
    }

    @Test
    void saturationCurrentCarriesTheUncertaintyOfTheInterpolatedCrossing() {
        // L falls from 10 µH (0 A) through 9.5 µH (1 A) to 8.5 µH (2 A), each with u = 20 nH: the 10 % drop
        // (9 µH) lies at 1.5 A. By hand (law of propagation, JCGM 100:2008, 5.1.2): with s = 1 A / 1 µH,
        // ∂I/∂L(1 A) = s·(9 − 8.5)/1 = 0.5 A/µH, ∂I/∂L(2 A) = s·(9.5 − 9)/1 = 0.5 A/µH, ∂I/∂L(0) = −0.9 A/µH:
        // u(I) = 0.02·√(0.25 + 0.25 + 0.81) = 22.891 mA
        double[] i = {0, 1, 2};
        double[] l = {10e-6, 9.5e-6, 8.5e-6};
        double[] u = {20e-9, 20e-9, 20e-9};
        Derating d = Derating.of("ls_h", 100e3, 0.1, "A", i, l, u, Derating.INDUCTOR_DROPS);
        assertEquals(1.5, d.drops().get(10), 1e-12);
        assertEquals(0.02 * Math.sqrt(0.25 + 0.25 + 0.81), d.dropsU().get(10), 1e-12);
        assertEquals(d.dropsU().get(10), d.biasAtDropU(10), 0);
        assertNull(d.dropsU().get(20));
        assertTrue(Double.isNaN(d.biasAtDropU(20)));
        // the same crossing by Monte Carlo (JCGM 101:2008, 7.2): draw the three values, interpolate; 20,000
        // draws estimate a standard deviation to about 0.5 % (1σ), the model being nearly linear at this u
        java.util.SplittableRandom rnd = new java.util.SplittableRandom(12);
        int n = 20_000;
        double sum = 0;
        double sum2 = 0;
        for (int k = 0; k < n; k++) {
            double[] lk = {l[0] + u[0] * rnd.nextGaussian(), l[1] + u[1] * rnd.nextGaussian(),
                l[2] + u[2] * rnd.nextGaussian()};
            double at = Derating.of("ls_h", 100e3, 0.1, "A", i, lk, Derating.INDUCTOR_DROPS).drops().get(10);
            sum += at;
            sum2 += at * at;
        }
        double sd = Math.sqrt(sum2 / n - (sum / n) * (sum / n));
        assertEquals(d.dropsU().get(10), sd, 0.025 * sd);
        // a crossing right after the reference point: the reference value is also the one before it
        Derating first = Derating.of("ls_h", 100e3, 0.1, "A", new double[] {0, 1}, new double[] {10e-6, 8e-6},
                new double[] {20e-9, 20e-9}, Derating.INDUCTOR_DROPS);
        assertEquals(0.5, first.drops().get(10), 1e-12);
        // I = (L0 − 0.9·L0)/(L0 − L1) with L0 = 10, L1 = 8 µH: ∂I/∂L0 = (0.1·(L0 − L1) − 0.1·L0)/(L0 − L1)² = −0.2,
        // ∂I/∂L1 = 0.1·L0/(L0 − L1)² = 0.25 (per µH)
        assertEquals(0.02 * Math.hypot(0.2, 0.25), first.dropsU().get(10), 1e-12);
        // without the points' u the crossing's is unknown
        assertTrue(Double.isNaN(Derating.of("ls_h", 100e3, 0.1, "A", i, l, Derating.INDUCTOR_DROPS).dropsU().get(10)));
    }
}
