package org.zweep.driver.uncertainty;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

class MeterAccuracyTest {

    /** A made-up table: 0.1 % basic, 10 mΩ short residual, 10 nS open residual. */
    private static final MeterAccuracy.Band MID = new MeterAccuracy.Band("mid", 20, 100e3, 0.1, 2, false, 0.01,
            0.001, 0.01, 10e-9, Double.NaN);
    private static final MeterAccuracy.Band MID_SHORT = new MeterAccuracy.Band("mid-short", 20, 100e3, 0.1, 2, false,
            0, 0.003, 0.03, 30e-9, 0.004);
    private static final MeterAccuracy SPEC = new MeterAccuracy(List.of(MID_SHORT, MID),
            MeterAccuracy.Distribution.RECTANGULAR);

    @Test
    void theLimitHasItsMinimumAtTheGeometricMeanOfTheResiduals() {
        // e = A + Zs/|Z| + Yo·|Z| with A = 0.1 %, Zs = 10 mΩ, Yo = 10 nS: the two residual terms are equal at
        // |Z| = √(Zs/Yo) = 1 kΩ, e = A + 2√(Zs·Yo) = 0.102 %; 1.1 % at 1 Ω and at 1 MΩ
        assertEquals(0.00102, MID.magnitudeLimit(1e3), 1e-12);
        assertEquals(0.011, MID.magnitudeLimit(1.0), 1e-7);
        assertEquals(0.011, MID.magnitudeLimit(1e6), 1e-7);
        assertEquals(0.001 + 0.001 + 1e-7, MID.magnitudeLimit(10), 1e-15);
    }

    @Test
    void aRectangularLimitGivesUOfTheLimitOverRootThree() {
        Impedance reading = Impedance.fromPolar(1e3, 1e3, -60);
        UncertainImpedance u = SPEC.uncertainty(reading, 1.0, false, 0.1).orElseThrow();
        // JCGM 100:2008, 4.3.7: a ± a rectangular limit has u = a/√3
        assertEquals(1e3 * 0.00102 / Math.sqrt(3), u.standardUncertainty(DerivedParameter.Z), 1e-9);
        assertEquals(Math.toDegrees(0.00102 / Math.sqrt(3)), u.standardUncertainty(DerivedParameter.THETA), 1e-9);
        assertEquals(0.0, u.correlation(DerivedParameter.Z, DerivedParameter.THETA), 1e-9);
    }

    @Test
    void theLongestIntegrationTimeNotAboveThePointsSelectsTheRow() {
        assertEquals("mid", SPEC.band(1e3, 1, false, 0.1).orElseThrow().name());
        assertEquals("mid-short", SPEC.band(1e3, 1, false, 0.001).orElseThrow().name());
        assertTrue(SPEC.band(1e6, 1, false, 0.1).isEmpty()); // beyond every band's frequencies
        assertTrue(SPEC.band(1e3, 1e-3, true, 0.1).isEmpty()); // a current drive, no current band
        // the stated phase term replaces A in the phase limit
        assertEquals(0.004 + 0.03 / 100 + 30e-9 * 100, MID_SHORT.phaseLimitRad(100), 1e-15);
    }

    @Test
    void aLimitStatedAtKTwoIsHalved() {
        MeterAccuracy k2 = new MeterAccuracy(List.of(MID), MeterAccuracy.Distribution.NORMAL_K2);
        UncertainImpedance u = k2.uncertainty(new Impedance(1e3, 10, 0), 1, false, 1).orElseThrow();
        assertEquals(10 * (0.001 + 0.001 + 1e-7) / 2, u.uROhm(), 1e-12); // u = U/k, JCGM 100:2008, 4.3.3
    }
}
