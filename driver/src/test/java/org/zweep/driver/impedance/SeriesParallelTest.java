package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.zweep.driver.impedance.Close.assertRel;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Series ↔ parallel equivalents at one frequency: Q = |Xs|/Rs = Rp/|Xp|, Rp = Rs(1 + Q²),
 * Xp = Xs(1 + 1/Q²), so Cp = Cs/(1 + D²) and Lp = Ls(1 + 1/Q²) (T. H. Lee, The Design of CMOS
 * Radio-Frequency Integrated Circuits, 2nd ed., ch. 3, impedance-matching networks, from memory;
 * it is Y = 1/Z written out). Figures marked "computed" are these formulas evaluated independently.
 */
class SeriesParallelTest {

    @Test
    void lossyCapacitorSeriesToParallelMatchesWorkedExampleP1() {
        Impedance z = Impedance.fromCsEsr(1e3, 1e-6, 1.0);
        assertRel(0.0062831853, z.dissipationFactor(), 1e-7); // Cs = 1 µF, Rs = 1 Ω at 1 kHz, computed
        assertRel(159.15494, z.qualityFactor(), 1e-7); // same
        assertRel(25_331.296, z.parallelResistanceOhm(), 1e-7); // same
        assertRel(0.9999605231e-6, z.parallelCapacitanceF(), 1e-10); // same, Cp = Cs/(1 + D²)
        double d = z.dissipationFactor();
        assertRel(1e-6 / (1 + d * d), z.parallelCapacitanceF(), 1e-12); // Cp = Cs/(1 + D²)
    }

    @Test
    void lossyInductorSeriesToParallelMatchesWorkedExampleP2() {
        Impedance z = Impedance.fromLsRs(1e3, 10e-3, 10.0);
        assertRel(6.2831853, z.qualityFactor(), 1e-7); // Ls = 10 mH, Rs = 10 Ω at 1 kHz, computed
        assertRel(404.78418, z.parallelResistanceOhm(), 1e-7); // same
        assertRel(10.25330296e-3, z.parallelInductanceH(), 1e-9); // same, Lp = Ls(1 + 1/Q²)
        double q = z.qualityFactor();
        assertRel(10.0 * (1 + q * q), z.parallelResistanceOhm(), 1e-12); // Rp = Rs(1 + Q²)
    }

    @Test
    void parallelToSeriesMatchesWorkedExampleP3() {
        Impedance z = Impedance.fromCpRp(1e3, 10e-9, 1e6);
        assertRel(62.831853, z.qualityFactor(), 1e-7); // Cp = 10 nF, Rp = 1 MΩ at 1 kHz, computed
        assertRel(0.015915494, z.dissipationFactor(), 1e-7); // same
        assertRel(253.23881, z.seriesResistanceOhm(), 1e-7); // same
        assertRel(10.00253303e-9, z.seriesCapacitanceF(), 1e-9); // same, Cs = Cp(1 + D²)
    }

    @Test
    void qualityFactorOfOneDoublesBothPartsP4() {
        ParallelEquivalent p = new Impedance(1e3, 10.0, 10.0).toParallel();
        assertEquals(20.0, p.resistanceOhm(), 1e-12); // Q = 1: Rp = Rs(1 + 1) and Xp = Xs(1 + 1), by hand
        assertEquals(20.0, p.reactanceOhm(), 1e-12); // same
        Impedance back = p.toSeries();
        assertEquals(10.0, back.resistanceOhm(), 1e-12); // same, the other way
        assertEquals(10.0, back.reactanceOhm(), 1e-12); // same
    }

    @Test
    void qualityFactorIsTheSameInSeriesAndParallelForm() {
        Impedance z = Impedance.fromLsRs(2e5, 3.3e-6, 0.7);
        ParallelEquivalent p = z.toParallel();
        // Q = |Xs|/Rs = Rp/|Xp|
        assertRel(z.qualityFactor(), p.resistanceOhm() / Math.abs(p.reactanceOhm()), 1e-12);
    }

    @Test
    void seriesAndParallelRoundTripBothWaysOverRandomImpedances() {
        SplittableRandom random = new SplittableRandom(20240602);
        for (int i = 0; i < 10_000; i++) {
            double f = Math.pow(10, random.nextDouble(0, 8));
            double m = Math.pow(10, random.nextDouble(-4, 9));
            double theta = random.nextDouble(-180, 180);
            Impedance z = Impedance.fromPolar(f, m, theta);
            Impedance back = z.toParallel().toSeries();
            // exactness: Z → Y → Z returns Z to rounding (common practice: Y = 1/Z)
            assertEquals(z.resistanceOhm(), back.resistanceOhm(), 1e-14 * m);
            assertEquals(z.reactanceOhm(), back.reactanceOhm(), 1e-14 * m);
            ParallelEquivalent p = new ParallelEquivalent(f, random.nextDouble(-1, 1) / m, random.nextDouble(-1, 1) / m);
            ParallelEquivalent pBack = p.toSeries().toParallel();
            double y = Math.hypot(p.conductanceS(), p.susceptanceS());
            assertEquals(p.conductanceS(), pBack.conductanceS(), 1e-14 * y);
            assertEquals(p.susceptanceS(), pBack.susceptanceS(), 1e-14 * y);
        }
    }

    @Test
    void conversionIsExactOnlyAtItsFrequency() {
        // the equivalents hold only at the frequency they were computed for: converting at f1 and comparing at f2 must fail
        Impedance at1k = Impedance.fromCsEsr(1e3, 1e-6, 1.0);
        Impedance sameCpRpAt10k = Impedance.fromCpRp(1e4, at1k.parallelCapacitanceF(), at1k.parallelResistanceOhm());
        Impedance seriesAt10k = Impedance.fromCsEsr(1e4, 1e-6, 1.0);
        assertEquals(1.0, seriesAt10k.resistanceOhm(), 1e-12);
        assertTrue(Math.abs(sameCpRpAt10k.resistanceOhm() - 1.0) > 0.5);
    }

    @Test
    void openCircuitHasNoSeriesEquivalent() {
        assertThrows(ArithmeticException.class, () -> new ParallelEquivalent(1e3, 0.0, 0.0).toSeries());
    }
}
