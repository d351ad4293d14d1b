package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.SplittableRandom;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;

class CompensationTest {

    private static void assertClose(Complex expected, Complex actual, double relative) {
        double tolerance = expected.abs() * relative;
        assertEquals(expected.getReal(), actual.getReal(), tolerance, "real part of " + actual);
        assertEquals(expected.getImaginary(), actual.getImaginary(), tolerance, "imaginary part of " + actual);
    }

    @Test
    void openShortRecoversHandDerivedDut() {
        // Hand-derived: Zs = 1 + j, Yo = 0.01 S, DUT 10 Ω, so Zm = Zs + 1/(Yo + 1/10) = 1 + 100/11 + j
        // and the open reads Zs + 1/Yo = 101 + j.
        Compensation c = Compensation.openShort(new Complex(101, 1), new Complex(1, 1));
        assertClose(new Complex(10, 0), c.correct(new Complex(1 + 100.0 / 11, 1)), 1e-14);
    }

    @Test
    void openShortMatchesTopologyAVectorExactly() {
        // Series residual Zs = 0.05 Ω + 20 nH at the meter, stray Yo = 1 nS + 5 pF across a 0.5 Ω + 1 µH DUT,
        // f = 1 MHz; readings computed from Zm = Zs + 1/(Yo + 1/Zdut) (the "ShortOpen" order of scikit-rf's
        // skrf.calibration.deembedding), so the exact correction must give the DUT back.
        Complex open = new Complex(1.0632118354, -31830.8629224);
        Complex shortReading = new Complex(0.05, 0.125663706144);
        Complex dut = new Complex(0.550197489669, 6.41008164433);
        Complex corrected = Compensation.openShort(open, shortReading).correct(dut);
        assertClose(new Complex(0.5, 6.28318530718), corrected, 1e-10); // Zdut = (Zm − Zs)/(1 − (Zm − Zs)·Yo), Yo = 1/(Zo − Zs)
    }

    @Test
    void openShortWithOpenReadingAsAdmittanceMatchesTheUsualApproximation() {
        Complex open = new Complex(1.0632118354, -31830.8629224);
        Complex shortReading = new Complex(0.05, 0.125663706144);
        Complex dut = new Complex(0.550197489669, 6.41008164433);
        Complex corrected = Compensation.fromResiduals(shortReading, open.reciprocal()).correct(dut);
        // the same vector with Yo ≈ 1/Zo,meas (valid when |Zo| ≫ |Zs|): 0.499999997285 + j6.28318530262, computed
        assertClose(new Complex(0.499999997285, 6.28318530262), corrected, 1e-11);
    }

    @Test
    void theAdmittanceFormsAreTheImpedanceFormsWhenTheOpenIsReadable() {
        Complex open = new Complex(101, 1);
        Complex shortReading = new Complex(1, 1);
        Complex load = new Complex(1 + 100.0 / 3, 1);
        Complex reading = new Complex(1 + 100.0 / 11, 1);
        assertClose(Compensation.openShort(open, shortReading).correct(reading),
                Compensation.openShortFromAdmittance(open.reciprocal(), shortReading).correct(reading), 1e-14);
        assertClose(Compensation.openShortLoad(open, shortReading, load, new Complex(50, 0)).correct(reading),
                Compensation.openShortLoadFromAdmittance(open.reciprocal(), shortReading, load, new Complex(50, 0))
                        .correct(reading), 1e-13);
    }

    @Test
    void anOpenBeyondTheMetersReachLeavesOnlyTheSeriesResidual() {
        // Hand-derived: series residual Zs = 1 + j and no stray admittance, DUT 10 Ω reads 11 + j and a 50 Ω
        // load reads 51 + j; with Y_open = 0 both forms give Z = Zm − Zs (OSL: 50·(Zm − Zs)/(Zl − Zs)).
        Complex shortReading = new Complex(1, 1);
        assertClose(new Complex(10, 0),
                Compensation.openShortFromAdmittance(Complex.ZERO, shortReading).correct(new Complex(11, 1)), 1e-15);
        assertClose(new Complex(10, 0), Compensation.openShortLoadFromAdmittance(Complex.ZERO, shortReading,
                new Complex(51, 1), new Complex(50, 0)).correct(new Complex(11, 1)), 1e-14);
    }

    @Test
    void openShortLoadMatchesArbitraryFixtureVector() {
        // A non-symmetric fixture with ABCD A = 1.02 + j0.01, B = 0.3 + j2, C = 1e-5 + j3e-5, D = 0.98 − j0.02 maps
        // Z to (A·Z + B)/(C·Z + D) (D. M. Pozar, Microwave Engineering, §4.4, from memory); open, short, a 100 Ω
        // load and a 0.5 Ω + 1 µH DUT at 1 MHz read as below (computed). A bilinear map is fixed by three points
        // (L. V. Ahlfors, Complex Analysis, ch. 3, cross-ratio, from memory), so OSL gives the DUT back exactly.
        Compensation c = Compensation.openShortLoad(new Complex(10500, -30500),
                new Complex(0.264363030808, 2.04621149042), new Complex(104.197060198, 4.86376149172),
                new Complex(100, 0));
        Complex corrected = c.correct(new Complex(0.587717263528, 8.59911787287));
        assertClose(new Complex(0.5, 6.28318530718), corrected, 1e-9); // the DUT: 0.5 Ω + j2π·1 MHz·1 µH
    }

    @Test
    void openShortLoadRecoversHandDerivedDut() {
        // Same hand-derived fixture as above; a 50 Ω load reads 1 + j + 1/(0.01 + 0.02) = 34.333… + j.
        Compensation c = Compensation.openShortLoad(new Complex(101, 1), new Complex(1, 1),
                new Complex(1 + 100.0 / 3, 1), new Complex(50, 0));
        assertClose(new Complex(10, 0), c.correct(new Complex(1 + 100.0 / 11, 1)), 1e-13);
    }

    @Test
    void openShortLoadOnSymmetricFixtureIgnoresTheLoadValue() {
        // With A = D the open/short form Zo(Zm − Zs)/(Zo − Zm) is already exact for the bilinear map
        // (A·Z + B)/(C·Z + D), so OSL must return the true value whatever the load standard is.
        Complex a = new Complex(1.01, 0.02);
        Complex b = new Complex(0.2, 1.0);
        Complex cc = new Complex(2e-5, 4e-5);
        SplittableRandom random = new SplittableRandom(7);
        for (int i = 0; i < 200; i++) {
            Complex load = new Complex(random.nextDouble(1, 1000), random.nextDouble(-500, 500));
            Complex dut = new Complex(random.nextDouble(0.1, 100), random.nextDouble(-100, 100));
            Compensation c = Compensation.openShortLoad(a.divide(cc), b.divide(a), abcd(a, b, cc, a, load), load);
            assertClose(dut, c.correct(abcd(a, b, cc, a, dut)), 1e-9);
        }
    }

    private static Complex abcd(Complex a, Complex b, Complex c, Complex d, Complex z) {
        return a.multiply(z).add(b).divide(c.multiply(z).add(d));
    }

    @Test
    void noCompensationReturnsTheReading() {
        Impedance z = new Impedance(1e3, 3, -4);
        assertEquals(z, Compensation.none().correct(z));
    }

    @Test
    void equalOpenAndShortReadingsAreRejected() {
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> Compensation.openShort(new Complex(1, 1), new Complex(1, 1)));
        assertEquals("the open and short readings are equal ((1.0, 1.0) Ω): compensation data unusable",
                e.getMessage());
    }
}
