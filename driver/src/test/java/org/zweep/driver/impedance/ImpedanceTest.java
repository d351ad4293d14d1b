package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.zweep.driver.impedance.Close.assertRel;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;

class ImpedanceTest {

    @Test
    void reactanceOfOneMicrofaradAtOneKilohertzIsMinus159Ohms() {
        Impedance z = Impedance.fromCsEsr(1e3, 1e-6, 0.0);
        assertRel(-159.15494, z.reactanceOhm(), 1e-7); // check-values.md §1.2 further values, [calc]
        assertEquals(-90.0, z.phaseDeg(), 1e-12); // common practice, no source: ideal capacitor
    }

    @Test
    void reactanceOfTenMillihenriesAtOneKilohertzIs62Ohms() {
        Impedance z = Impedance.fromLsRs(1e3, 10e-3, 0.0);
        assertRel(62.831853, z.reactanceOhm(), 1e-8); // check-values.md §1.2 further values, [calc]
    }

    @Test
    void inductiveReactanceMatchesPublishedWorkedExample() {
        Impedance z = Impedance.fromLsRs(2e3, 1e-3, 0.0);
        assertEquals(12.57, z.reactanceOhm(), 0.005); // check-values.md §1.2 E1, Box Hill Institute course sample
    }

    @Test
    void capacitiveReactanceMatchesPublishedWorkedExample() {
        Impedance z = Impedance.fromCsEsr(60, 1e-6, 0.0);
        assertEquals(-2653, z.reactanceOhm(), 0.5); // check-values.md §1.2 E5 (Q&A page, weak)
        Impedance roundingTrap = Impedance.fromCsEsr(100, 0.5e-6, 0.0);
        assertRel(-3183.10, roundingTrap.reactanceOhm(), 1e-6); // check-values.md §1.2 E6, full-precision π
    }

    @Test
    void phaseOfEightyDegreesGivesLossAngleOfTenDegrees() {
        Impedance z = Impedance.fromPolar(1e3, 100.0, 80.0);
        assertEquals(10.0, z.lossAngleDeg(), 1e-12); // common practice: δ = 90° − |θ|
        Impedance c = Impedance.fromPolar(1e3, 100.0, -80.0);
        assertEquals(10.0, c.lossAngleDeg(), 1e-12); // common practice: δ = 90° − |θ|
    }

    @Test
    void qualityFactorIsTanThetaAndDissipationIsTanDelta() {
        for (double theta : new double[] {5, 30, 45, 80, 89.9, -10, -60, -89.99}) {
            Impedance z = Impedance.fromPolar(1e4, 47.0, theta);
            double q = Math.tan(Math.toRadians(Math.abs(theta)));
            assertRel(q, z.qualityFactor(), 1e-12); // check-values.md §1.1: Q = tan|θ|
            assertRel(1.0 / q, z.dissipationFactor(), 1e-12); // check-values.md §1.1: D = 1/Q
            assertRel(Math.tan(Math.toRadians(z.lossAngleDeg())), z.dissipationFactor(), 1e-9); // §1.1: D = tan δ
        }
    }

    @Test
    void seriesRlMatchesTextbookValues() {
        Impedance z = Impedance.fromLsRs(60, 10e-3, 5.0);
        assertRel(3.76991, z.reactanceOhm(), 1e-5); // check-values.md §1.2 E12 (c), Kuphaldt vol. II
        assertRel(6.26197, z.magnitudeOhm(), 1e-5); // check-values.md §1.2 E12 (c)
        assertRel(37.0156, z.phaseDeg(), 1e-5); // check-values.md §1.2 E12 (c)
        assertRel(0.75398, z.qualityFactor(), 1e-5); // check-values.md §1.2 E12 (c)
    }

    @Test
    void seriesRcMatchesTextbookValues() {
        Impedance z = Impedance.fromCsEsr(60, 100e-6, 5.0);
        assertRel(-26.5258, z.reactanceOhm(), 1e-5); // check-values.md §1.2 E13 (c)
        assertRel(26.9929, z.magnitudeOhm(), 1e-5); // check-values.md §1.2 E13 (c)
        assertRel(-79.3253, z.phaseDeg(), 1e-6); // check-values.md §1.2 E13 (c)
        assertRel(0.188496, z.dissipationFactor(), 1e-5); // check-values.md §1.2 E13 (c)
        assertRel(10.6747, z.lossAngleDeg(), 1e-5); // check-values.md §1.2 E13 (c)
    }

    @Test
    void lossyInductorAndCapacitorMatchCalculatedValues() {
        Impedance l = Impedance.fromLsRs(1e3, 10e-3, 10.0);
        assertRel(63.6227, l.magnitudeOhm(), 1e-5); // check-values.md §1.2 further values [calc]
        assertRel(80.9569, l.phaseDeg(), 1e-6); // same
        assertRel(6.28319, l.qualityFactor(), 1e-5); // same
        assertRel(0.159155, l.dissipationFactor(), 1e-5); // same
        assertRel(9.0431, l.lossAngleDeg(), 1e-5); // same
        Impedance c = Impedance.fromCsEsr(1e3, 1e-6, 1.0);
        assertRel(159.158, c.magnitudeOhm(), 1e-5); // check-values.md §1.2 further values [calc]
        assertRel(-89.6400, c.phaseDeg(), 1e-6); // same
        assertRel(6.28319e-3, c.dissipationFactor(), 1e-5); // same
        assertRel(0.3600, c.lossAngleDeg(), 1e-4); // same
    }

    @Test
    void threePlusFourJHasMagnitudeFive() {
        Impedance z = new Impedance(1e3, 3, 4);
        assertEquals(5.0, z.magnitudeOhm(), 1e-15); // check-values.md §1.2 further values
        assertRel(53.1301, z.phaseDeg(), 1e-6); // same
        assertRel(1.33333, z.qualityFactor(), 1e-5); // same
        assertEquals(0.75, z.dissipationFactor(), 1e-15); // same
    }

    @Test
    void admittanceOfThreePlusFourJIsThreeMinusFourJOver25() {
        Impedance z = new Impedance(1e3, 3, 4);
        assertEquals(0.2, z.admittanceMagnitudeS(), 1e-15); // common practice: |Y| = 1/|Z|
        assertEquals(0.12, z.conductanceS(), 1e-15); // common practice: Y = (R − jX)/|Z|²
        assertEquals(-0.16, z.susceptanceS(), 1e-15); // same
    }

    @Test
    void capacitanceOfAnInductiveImpedanceIsNegativeAndInductanceOfACapacitiveOne() {
        Impedance l = Impedance.fromLsRs(1e3, 10e-3, 0.0);
        // common practice, no source: meters show −1/(ω²L) as the C of an inductor
        assertRel(-1.0 / (Math.pow(2 * Math.PI * 1e3, 2) * 10e-3), l.seriesCapacitanceF(), 1e-12);
        assertRel(-1.0 / (Math.pow(2 * Math.PI * 1e3, 2) * 10e-3), l.parallelCapacitanceF(), 1e-12);
        Impedance c = Impedance.fromCsEsr(1e3, 1e-6, 0.0);
        assertRel(-1.0 / (Math.pow(2 * Math.PI * 1e3, 2) * 1e-6), c.seriesInductanceH(), 1e-12); // same
        assertRel(-1.0 / (Math.pow(2 * Math.PI * 1e3, 2) * 1e-6), c.parallelInductanceH(), 1e-12); // same
    }

    @Test
    void losslessReactanceHasInfiniteQZeroDAndInfiniteRp() {
        Impedance z = new Impedance(1e3, 0.0, -100.0);
        assertEquals(Double.POSITIVE_INFINITY, z.qualityFactor()); // common practice: Q = |X|/R, R = 0
        assertEquals(0.0, z.dissipationFactor()); // D = R/|X|
        assertEquals(Double.POSITIVE_INFINITY, z.parallelResistanceOhm()); // Rp = |Z|²/R
        assertEquals(0.0, z.lossAngleDeg()); // δ = 90° − 90°
        Impedance negativeZero = new Impedance(1e3, -0.0, 100.0);
        assertEquals(Double.POSITIVE_INFINITY, negativeZero.qualityFactor()); // −0 is still lossless
        assertEquals(Double.POSITIVE_INFINITY, negativeZero.parallelResistanceOhm());
    }

    @Test
    void pureResistanceHasZeroQAndInfiniteSeriesCapacitance() {
        Impedance z = new Impedance(1e3, 50.0, 0.0);
        assertEquals(0.0, z.qualityFactor()); // Q = |X|/R
        assertEquals(Double.POSITIVE_INFINITY, z.dissipationFactor()); // D = R/|X|
        assertEquals(Double.POSITIVE_INFINITY, z.seriesCapacitanceF()); // Cs = −1/(ωX), X → 0⁻
        assertEquals(0.0, z.parallelCapacitanceF()); // Cp = B/ω
        assertEquals(Double.POSITIVE_INFINITY, z.parallelInductanceH()); // Lp = −1/(ωB)
        assertEquals(50.0, z.parallelResistanceOhm(), 1e-12); // Rp = R when X = 0
    }

    @Test
    void shortCircuitHasNoNanParameter() {
        Impedance z = new Impedance(1e3, 0.0, 0.0);
        for (DerivedParameter p : DerivedParameter.values()) {
            assertFalse(Double.isNaN(p.of(z)), p.key());
        }
        // a short: G = 1/R is infinite and Rp = 1/G is zero; common practice, no source
        assertEquals(Double.POSITIVE_INFINITY, z.conductanceS());
        assertEquals(0.0, z.parallelResistanceOhm());
    }

    @Test
    void phaseStaysInMinus180Exclusive180Inclusive() {
        assertEquals(180.0, new Impedance(1e3, -5.0, -0.0).phaseDeg()); // (−180°, 180°], DESIGN.md
        assertEquals(180.0, new Impedance(1e3, -5.0, 0.0).phaseDeg()); // same
        assertEquals(-90.0, new Impedance(1e3, 0.0, -1.0).phaseDeg()); // same
    }

    @Test
    void negativeResistanceGivesNegativeQDAndLossAngle() {
        Impedance z = new Impedance(1e3, -1.0, 10.0);
        assertEquals(-10.0, z.qualityFactor(), 1e-12); // Q = |X|/R
        assertEquals(-0.1, z.dissipationFactor(), 1e-12); // D = R/|X|
        assertRel(Math.tan(Math.toRadians(z.lossAngleDeg())), z.dissipationFactor(), 1e-9); // D = tan δ
    }

    @Test
    void polarFormIsExactAtMultiplesOfNinetyDegrees() {
        assertEquals(0.0, Impedance.fromPolar(1e3, 10.0, 90.0).resistanceOhm()); // cos 90° = 0 exactly
        assertEquals(0.0, Impedance.fromPolar(1e3, 10.0, -90.0).resistanceOhm()); // same
        assertEquals(-10.0, Impedance.fromPolar(1e3, 10.0, 180.0).resistanceOhm()); // cos 180° = −1
        assertEquals(0.0, Impedance.fromPolar(1e3, 10.0, 180.0).reactanceOhm()); // sin 180° = 0
    }

    @Test
    void factoriesRejectNonPositiveFrequencyAndInfiniteResults() {
        InvalidInputException f = assertThrows(InvalidInputException.class, () -> Impedance.fromRX(0.0, 1, 1));
        assertEquals("the frequency must be positive and finite, got 0.0 Hz", f.getMessage());
        InvalidInputException c = assertThrows(InvalidInputException.class, () -> Impedance.fromCsD(1e3, 0.0, 0.01));
        assertEquals("Cs/D at 1000.0 Hz gives no finite impedance (R = Infinity Ω, X = -Infinity Ω)",
                c.getMessage());
    }
}
