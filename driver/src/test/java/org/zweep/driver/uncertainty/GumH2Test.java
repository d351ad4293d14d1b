package org.zweep.driver.uncertainty;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/**
 * JCGM 100:2008 (the GUM), Annex H.2, "Simultaneous resistance and reactance measurement".
 *
 * <p>Inputs (H.2.2, Table H.2, means of five readings and their correlations):
 * V = 4.9990 V, u(V) = 0.0032 V; I = 19.6610 mA, u(I) = 0.0095 mA; φ = 1.04446 rad,
 * u(φ) = 0.00075 rad; r(V, I) = −0.36, r(V, φ) = 0.86, r(I, φ) = −0.65.
 *
 * <p>Results (H.2.4, Table H.3, approach 1): R = 127.732 Ω, u(R) = 0.071 Ω; X = 219.847 Ω,
 * u(X) = 0.295 Ω; |Z| = 254.260 Ω, u(|Z|) = 0.236 Ω; r(R, X) = −0.588, r(R, |Z|) = −0.485,
 * r(X, |Z|) = 0.993. The GUM's own figures carry some round-off (its u(R) = 0.071 Ω, where exact
 * first-order arithmetic on Table H.2 gives 0.0700 Ω), so the tolerances below are a little
 * wider than the last printed digit where that is so.
 */
class GumH2Test {

    private static final double F_HZ = 50; // H.2 names no frequency; any positive value serves

    @Test
    void fromRAndXTheGumsMagnitudeUncertaintyAndCorrelationsFollow() {
        // JCGM 100:2008, H.2, Table H.3 (inputs R, X, u(R), u(X), r(R, X))
        UncertainImpedance z = new UncertainImpedance(new Impedance(F_HZ, 127.732, 219.847), 0.071, 0.295, -0.588);
        assertEquals(254.260, z.value().magnitudeOhm(), 0.0005); // JCGM 100:2008, H.2, Table H.3: |Z| = 254.260 Ω
        assertEquals(0.236, z.standardUncertainty(DerivedParameter.Z), 0.0005); // same: u(|Z|) = 0.236 Ω
        assertEquals(-0.485, z.correlation(DerivedParameter.R, DerivedParameter.Z), 0.0005); // same: r(R, Z)
        assertEquals(0.993, z.correlation(DerivedParameter.X, DerivedParameter.Z), 0.001); // same: r(X, Z)
        assertEquals(-0.588, z.correlation(DerivedParameter.R, DerivedParameter.X), 1e-12); // the input itself
    }

    @Test
    void fromVoltageCurrentAndPhaseTheGumsResistanceAndReactanceFollow() {
        double v = 4.9990; // JCGM 100:2008, H.2, Table H.2
        double i = 19.6610e-3;
        double phi = 1.04446;
        double[] u = {0.0032, 0.0095e-3, 0.00075};
        double[][] r = {{1, -0.36, 0.86}, {-0.36, 1, -0.65}, {0.86, -0.65, 1}};
        double[][] jacobian = {
            {Math.cos(phi) / i, -v * Math.cos(phi) / (i * i), -v * Math.sin(phi) / i},
            {Math.sin(phi) / i, -v * Math.sin(phi) / (i * i), v * Math.cos(phi) / i},
            {1 / i, -v / (i * i), 0}};
        double[][] c = LinearPropagation.propagate(jacobian, LinearPropagation.covariance(u, r));
        double uR = Math.sqrt(c[0][0]);
        double uX = Math.sqrt(c[1][1]);
        double uZ = Math.sqrt(c[2][2]);
        assertEquals(127.732, v / i * Math.cos(phi), 0.0005); // JCGM 100:2008, H.2, Table H.3: R = 127.732 Ω
        assertEquals(219.847, v / i * Math.sin(phi), 0.0005); // same: X = 219.847 Ω
        assertEquals(0.071, uR, 0.0015); // same: u(R) = 0.071 Ω (the GUM's round-off, see above)
        assertEquals(0.295, uX, 0.001); // same: u(X) = 0.295 Ω
        assertEquals(0.236, uZ, 0.001); // same: u(|Z|) = 0.236 Ω
        assertEquals(-0.588, c[0][1] / (uR * uX), 0.005); // same: r(R, X) = −0.588
        assertEquals(-0.485, c[0][2] / (uR * uZ), 0.008); // same: r(R, Z) = −0.485
        assertEquals(0.993, c[1][2] / (uX * uZ), 0.001); // same: r(X, Z) = 0.993

        // The impedance record agrees with the general matrix form on |Z| once given R, X and their covariance.
        UncertainImpedance z = UncertainImpedance.fromCovariance(
                new Impedance(F_HZ, v / i * Math.cos(phi), v / i * Math.sin(phi)), c[0][0], c[1][1], c[0][1]);
        assertEquals(uZ, z.standardUncertainty(DerivedParameter.Z), 1e-9);
    }
}
