package org.zweep.driver.uncertainty;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

class UncertainImpedanceTest {

    /** Central differences of the derived parameter itself, to check every analytic sensitivity. */
    private static double numericUncertainty(UncertainImpedance z, DerivedParameter p) {
        Impedance v = z.value();
        double hR = 1e-6 * Math.max(Math.abs(v.resistanceOhm()), v.magnitudeOhm() * 1e-3);
        double hX = 1e-6 * Math.max(Math.abs(v.reactanceOhm()), v.magnitudeOhm() * 1e-3);
        double gR = (p.of(new Impedance(v.frequencyHz(), v.resistanceOhm() + hR, v.reactanceOhm()))
                - p.of(new Impedance(v.frequencyHz(), v.resistanceOhm() - hR, v.reactanceOhm()))) / (2 * hR);
        double gX = (p.of(new Impedance(v.frequencyHz(), v.resistanceOhm(), v.reactanceOhm() + hX))
                - p.of(new Impedance(v.frequencyHz(), v.resistanceOhm(), v.reactanceOhm() - hX))) / (2 * hX);
        return Math.sqrt(gR * gR * z.varianceR() + gX * gX * z.varianceX() + 2 * gR * gX * z.covarianceRX());
    }

    @Test
    void everySensitivityMatchesCentralDifferencesForCapacitiveAndInductiveParts() {
        for (Impedance v : new Impedance[] {new Impedance(1e3, 1.0, -159.155), new Impedance(1e5, 3.0, 62.8),
                new Impedance(120, -0.4, -2.0)}) {
            UncertainImpedance z = new UncertainImpedance(v, 0.01 * v.magnitudeOhm(), 0.02 * v.magnitudeOhm(), 0.3);
            for (DerivedParameter p : DerivedParameter.values()) {
                double expected = numericUncertainty(z, p);
                assertEquals(expected, z.standardUncertainty(p), 1e-5 * expected + 1e-300, p + " at " + v);
            }
        }
    }

    @Test
    void polarUncertaintyOfAPureReactanceLandsOnTheMatchingAxes() {
        // |Z| = 100 Ω at θ = −90°: u(|Z|) is all along X, u(θ) all along R (arc length |Z|·u(θ) in rad)
        Impedance v = new Impedance(1e3, 0, -100);
        UncertainImpedance z = UncertainImpedance.fromPolar(v, 0.5, Math.toDegrees(0.01), 0);
        assertEquals(1.0, z.uROhm(), 1e-9); // 100 Ω · 0.01 rad
        assertEquals(0.5, z.uXOhm(), 1e-9);
        assertEquals(0.0, z.correlation(), 1e-9);
        // and back: u(|Z|), u(θ) recovered
        assertEquals(0.5, z.standardUncertainty(DerivedParameter.Z), 1e-9);
        assertEquals(Math.toDegrees(0.01), z.standardUncertainty(DerivedParameter.THETA), 1e-9);
    }

    @Test
    void independentContributionsAddTheirCovariances() {
        Impedance v = new Impedance(1e3, 10, 20);
        UncertainImpedance a = new UncertainImpedance(v, 0.3, 0.4, 0.5);
        UncertainImpedance b = new UncertainImpedance(v, 0.4, 0.3, -0.5);
        UncertainImpedance sum = a.plus(b);
        assertEquals(0.5, sum.uROhm(), 1e-12);
        assertEquals(0.5, sum.uXOhm(), 1e-12);
        assertEquals(0.0, sum.covarianceRX(), 1e-12);
        assertEquals(2 * sum.standardUncertainty(DerivedParameter.Z), sum.expandedUncertainty(DerivedParameter.Z));
    }

    @Test
    void refusesNegativeUncertaintiesAndCorrelationsBeyondOne() {
        Impedance v = new Impedance(1e3, 1, 1);
        assertThrows(InvalidInputException.class, () -> new UncertainImpedance(v, -1, 0, 0));
        assertThrows(InvalidInputException.class, () -> new UncertainImpedance(v, 1, 1, 1.5));
        assertThrows(InvalidInputException.class, () -> new UncertainImpedance(v, Double.NaN, 1, 0));
    }
}
