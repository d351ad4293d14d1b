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
}
