package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.zweep.driver.impedance.Close.assertRel;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;

/**
 * Figures marked "computed" are the textbook formulas Z_C = 1/(jωC), Z_L = jωL, |Z| = √(R² + X²),
 * θ = atan2(X, R), Q = |X|/R, D = R/|X| = tan δ (C. K. Alexander, M. N. O. Sadiku, Fundamentals of
 * Electric Circuits, §9.5 "Impedance and Admittance", from memory) evaluated independently of this code.
 */
class ImpedanceTest {

    @Test
    void reactanceOfOneMicrofaradAtOneKilohertzIsMinus159Ohms() {
        Impedance z = Impedance.fromCsEsr(1e3, 1e-6, 0.0);
        assertRel(-159.15494, z.reactanceOhm(), 1e-7); // X_C = −1/(2πfC), computed
        assertEquals(-90.0, z.phaseDeg(), 1e-12); // ideal capacitor: Z_C = 1/(jωC), computed
    }

    @Test
    void reactanceOfTenMillihenriesAtOneKilohertzIs62Ohms() {
        Impedance z = Impedance.fromLsRs(1e3, 10e-3, 0.0);
        assertRel(62.831853, z.reactanceOhm(), 1e-8); // X_L = 2πfL, computed
    }

    @Test
    void inductiveReactanceMatchesPublishedWorkedExample() {
        Impedance z = Impedance.fromLsRs(2e3, 1e-3, 0.0);
        assertEquals(12.57, z.reactanceOhm(), 0.005); // Box Hill Institute (TAFE), ElecNE161 course sample, "Inductive reactance": 1 mH at 2 kHz is 12.57 Ω
    }

    @Test
    void capacitiveReactanceMatchesPublishedWorkedExample() {
        Impedance z = Impedance.fromCsEsr(60, 1e-6, 0.0);
        assertEquals(-2653, z.reactanceOhm(), 0.5); // X_C = −1/(2πfC) = −2652.58 Ω, computed
        Impedance roundingTrap = Impedance.fromCsEsr(100, 0.5e-6, 0.0);
        assertRel(-3183.10, roundingTrap.reactanceOhm(), 1e-6); // computed with full-precision π (π = 3.142 would give −3184.7 Ω)
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
            assertRel(q, z.qualityFactor(), 1e-12); // Q = |X|/R = tan|θ|, computed
            assertRel(1.0 / q, z.dissipationFactor(), 1e-12); // D = 1/Q, computed
            assertRel(Math.tan(Math.toRadians(z.lossAngleDeg())), z.dissipationFactor(), 1e-9); // D = tan δ, δ = 90° − |θ|
        }
    }

    @Test
    void seriesRlMatchesTextbookValues() {
        Impedance z = Impedance.fromLsRs(60, 10e-3, 5.0);
        assertRel(3.76991, z.reactanceOhm(), 1e-5); // 5 Ω + 10 mH at 60 Hz: T. R. Kuphaldt, Lessons in Electric Circuits, Vol. II (AC), series R-L example, from memory; computed
        assertRel(6.26197, z.magnitudeOhm(), 1e-5); // same
        assertRel(37.0156, z.phaseDeg(), 1e-5); // same
        assertRel(0.75398, z.qualityFactor(), 1e-5); // same
    }

    @Test
    void seriesRcMatchesTextbookValues() {
        Impedance z = Impedance.fromCsEsr(60, 100e-6, 5.0);
        assertRel(-26.5258, z.reactanceOhm(), 1e-5); // 5 Ω + 100 µF at 60 Hz: Kuphaldt, Vol. II, series R-C example, from memory; computed
        assertRel(26.9929, z.magnitudeOhm(), 1e-5); // same
        assertRel(-79.3253, z.phaseDeg(), 1e-6); // same
        assertRel(0.188496, z.dissipationFactor(), 1e-5); // same
        assertRel(10.6747, z.lossAngleDeg(), 1e-5); // same
    }

    @Test
    void lossyInductorAndCapacitorMatchCalculatedValues() {
        Impedance l = Impedance.fromLsRs(1e3, 10e-3, 10.0);
        assertRel(63.6227, l.magnitudeOhm(), 1e-5); // 10 mH + 10 Ω at 1 kHz, computed
        assertRel(80.9569, l.phaseDeg(), 1e-6); // same
        assertRel(6.28319, l.qualityFactor(), 1e-5); // same
        assertRel(0.159155, l.dissipationFactor(), 1e-5); // same
        assertRel(9.0431, l.lossAngleDeg(), 1e-5); // same
        Impedance c = Impedance.fromCsEsr(1e3, 1e-6, 1.0);
        assertRel(159.158, c.magnitudeOhm(), 1e-5); // 1 µF + 1 Ω at 1 kHz, computed
        assertRel(-89.6400, c.phaseDeg(), 1e-6); // same
        assertRel(6.28319e-3, c.dissipationFactor(), 1e-5); // same
        assertRel(0.3600, c.lossAngleDeg(), 1e-4); // same
    }

    @Test
    void threePlusFourJHasMagnitudeFive() {
        Impedance z = new Impedance(1e3, 3, 4);
        assertEquals(5.0, z.magnitudeOhm(), 1e-15); // 3 + j4 Ω: |Z| = 5, θ = atan(4/3), computed
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
        assertEquals(180.0, new Impedance(1e3, -5.0, -0.0).phaseDeg()); // the principal value of atan2, (−180°, 180°]
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
