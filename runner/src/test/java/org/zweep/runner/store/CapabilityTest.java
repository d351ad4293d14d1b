package org.zweep.runner.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

class CapabilityTest {
    @Test
    void cpkOfTheHandbookExample() {
        // NIST/SEMATECH e-Handbook of Statistical Methods, section 6.1.6 "What is Process Capability?",
        // example: USL = 20, LSL = 8, mean 16, standard deviation 2 give Cp = 1 and
        // Cpk = min((20 - 16)/6, (16 - 8)/6) = 0.6667 (from memory). Values 14, 16, 18 have that mean
        // and sample standard deviation: sqrt((4 + 0 + 4) / (3 - 1)) = 2.
        Capability c = Capability.of(List.of(14.0, 16.0, 18.0), 8.0, 20.0);
        assertEquals(3, c.n());
        assertEquals(16.0, c.mean(), 1e-12);
        assertEquals(2.0, c.sigma(), 1e-12);
        assertEquals(0.6667, c.cpk(), 5e-5);
        assertEquals(22.0, c.ucl(), 1e-12);
        assertEquals(10.0, c.lcl(), 1e-12);
    }

    @Test
    void cpkOfFiveCapacitorsAgainstTheirTolerance() {
        // Hand-computed with Cpk = min(USL - mean, mean - LSL) / (3 s) (ISO 22514-2; s with n - 1):
        // 98, 100, 101, 102, 99 nF against 95 ... 105 nF: mean 100 nF, squared deviations
        // 4 + 0 + 1 + 4 + 1 = 10 (nF²), s = sqrt(10 / 4) = 1.58114 nF, Cpk = 5 / 4.74342 = 1.05409.
        Capability c = Capability.of(List.of(98e-9, 100e-9, 101e-9, 102e-9, 99e-9), 95e-9, 105e-9);
        assertEquals(100e-9, c.mean(), 1e-20);
        assertEquals(1.58114e-9, c.sigma(), 1e-14);
        assertEquals(1.05409, c.cpk(), 1e-5);
    }

    @Test
    void anOffCentreProcessIsJudgedByTheNearerLimit() {
        // hand-computed: mean 103 nF, s = 1.58114 nF: (105 - 103) / 4.74342 = 0.42164
        Capability c = Capability.of(List.of(101e-9, 103e-9, 104e-9, 105e-9, 102e-9), 95e-9, 105e-9);
        assertEquals(0.42164, c.cpk(), 1e-5);
    }

    @Test
    void oneSidedLimitsUseTheirSideAndTooFewValuesDefineNothing() {
        // dissipation factor with a maximum only: (USL - mean) / 3s = (0.025 - 0.012) / (3 * 0.001) = 4.3333
        Capability upper = Capability.of(List.of(0.011, 0.012, 0.013), Double.NaN, 0.025);
        assertEquals(4.3333, upper.cpk(), 1e-4);
        // self-resonance with a minimum only: (mean - LSL) / 3s = (17.8 - 10) / (3 * 0.1) = 26 (MHz cancel)
        Capability lower = Capability.of(List.of(17.7e6, 17.8e6, 17.9e6), 10e6, Double.NaN);
        assertEquals(26.0, lower.cpk(), 1e-9);
        assertTrue(Double.isNaN(Capability.of(List.of(1.0), 0.0, 2.0).cpk()));
        assertTrue(Double.isNaN(Capability.of(List.of(1.0, 1.0), 0.0, 2.0).cpk()), "sigma = 0");
        assertTrue(Double.isNaN(Capability.of(List.of(1.0, 2.0), Double.NaN, Double.NaN).cpk()), "no limit");
    }
}
