package org.zweep.simulator.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.bench.MeterCorrection.Sample;
import org.zweep.simulator.bench.MeterCorrection.Standard;

class MeterCorrectionTest {

    private static List<Sample> one(double f, double re, double im) {
        return List.of(new Sample(f, re, im, false));
    }

    @Test
    void openShortCorrectionReproducesTestVectorTA() {
        // Zs = 0.05 Ω + 20 nH at the meter, Yo = 1 nS + 5 pF across a 0.5 Ω + 1 µH DUT, 1 MHz; readings computed from Zm = Zs + 1/(Yo + 1/Zdut), so the exact open/short
        // correction Zdut = (Zm − Zs)/(1 − (Zm − Zs)·Yo), Yo = 1/(Zo − Zs), must give 0.5 + j6.28318530718 back
        MeterCorrection c = MeterCorrection.none()
                .with(Standard.SHORT, one(1e6, 0.05, 0.125663706144))
                .with(Standard.OPEN, one(1e6, 1.0632118354, -31830.8629224));
        Complex z = c.apply(1e6, new Complex(0.550197489669, 6.41008164433));
        assertEquals(0.5, z.getReal(), 1e-9);
        assertEquals(6.28318530718, z.getImaginary(), 1e-9); // ωL = 2π·1 MHz·1 µH
    }

    @Test
    void threeStandardCorrectionReproducesTestVectorTOsl() {
        // A non-symmetric fixture, ABCD A = 1.02 + j0.01, B = 0.3 + j2, C = 1e-5 + j3e-5, D = 0.98 − j0.02, maps Z to
        // (A·Z + B)/(C·Z + D) (D. M. Pozar, Microwave Engineering, §4.4, from memory); readings of open, short, a
        // 100 Ω load and the 0.5 Ω + 1 µH DUT at 1 MHz computed. Three points fix a bilinear map (cross-ratio).
        MeterCorrection c = MeterCorrection.none()
                .with(Standard.OPEN, one(1e6, 10500, -30500))
                .with(Standard.SHORT, one(1e6, 0.264363030808, 2.04621149042))
                .with(Standard.LOAD, one(1e6, 104.197060198, 4.86376149172))
                .withLoadReference(new Complex(100, 0));
        Complex z = c.apply(1e6, new Complex(0.587717263528, 8.59911787287));
        assertEquals(0.5, z.getReal(), 1e-9);
        assertEquals(6.28318530718, z.getImaginary(), 1e-9);
    }

    @Test
    void aLoadWithoutOpenAndShortIsNotUsed() {
        MeterCorrection c = MeterCorrection.none().with(Standard.LOAD, one(1e6, 104, 4));
        assertFalse(c.isActive());
        assertEquals(new Complex(3, 4), c.apply(1e6, new Complex(3, 4))); 
    }

    @Test
    void shortAloneSubtractsTheResidualAndOpenAloneRemovesTheStray() {
        // Zdut = (Zm − Zs)/(1 − (Zm − Zs)·Yo): Zm − Zs with Yo = 0, Zm/(1 − Zm·Yo) with Zs = 0
        MeterCorrection s = MeterCorrection.none().with(Standard.SHORT, one(1e3, 0.1, 0.2));
        assertEquals(new Complex(9.9, 19.8), s.apply(1e3, new Complex(10, 20)));
        MeterCorrection o = MeterCorrection.none().with(Standard.OPEN, one(1e3, 0, -1e6));
        Complex zm = new Complex(100, 0);
        Complex yo = new Complex(0, 1e-6);
        Complex expected = zm.divide(Complex.ONE.subtract(zm.multiply(yo)));
        assertEquals(0, o.apply(1e3, zm).subtract(expected).abs(), 1e-12);
    }

    @Test
    void anOverloadedOpenCountsAsInfiniteImpedance() {
        MeterCorrection c = MeterCorrection.none()
                .with(Standard.OPEN, List.of(new Sample(1e3, Double.NaN, Double.NaN, true)))
                .with(Standard.SHORT, one(1e3, 0.1, 0));
        // Yo = 0 in Zdut = (Zm − Zs)/(1 − (Zm − Zs)·Yo) leaves Zm − Zs
        assertEquals(0, c.apply(1e3, new Complex(10.1, 5)).subtract(new Complex(10, 5)).abs(),
                1e-12);
    }

    @Test
    void shortResidualIsInterpolatedLinearlyInFrequency() {
        // a residual R + jωL is linear in f, so two samples fix it everywhere between
        double l = 20e-9;
        MeterCorrection c = MeterCorrection.none().with(Standard.SHORT, List.of(
                new Sample(1e3, 0.05, 2 * Math.PI * 1e3 * l, false),
                new Sample(1e6, 0.05, 2 * Math.PI * 1e6 * l, false)));
        double f = 123456;
        Complex zs = new Complex(0.05, 2 * Math.PI * f * l);
        Complex corrected = c.apply(f, zs.add(new Complex(1, 1)));
        assertEquals(0, corrected.subtract(new Complex(1, 1)).abs(), 1e-12);
        // outside the samples the nearest end is used
        Complex above = c.apply(2e6, new Complex(1, 1));
        assertEquals(1 - 0.05, above.getReal(), 1e-12);
    }

    @Test
    void overloadedShortOrEmptyReadingsAreRefused() {
        assertThrows(IllegalArgumentException.class, () -> MeterCorrection.none()
                .with(Standard.SHORT, List.of(new Sample(1e3, 0, 0, true))));
        assertThrows(IllegalArgumentException.class,
                () -> MeterCorrection.none().with(Standard.OPEN, List.of()));
        assertThrows(IllegalArgumentException.class,
                () -> MeterCorrection.none().withLoadReference(Complex.ZERO));
    }

    @Test
    void acquisitionFrequenciesSpanTheMeterLogarithmically() {
        double[] f = MeterCorrection.frequencies(MeterSpec.defaults().limits(), 5);
        // 10 Hz to 20 MHz: MeterSpec.defaults
        assertEquals(10, f[0], 0);
        assertEquals(20e6, f[f.length - 1], 0);
        for (int i = 1; i < f.length; i++) {
            assertTrue(f[i] > f[i - 1]);
        }
        // ceil(log10(20e6 / 10)·5) + 1 = ceil(6.301·5) + 1
        assertEquals(33, f.length);
    }

    @Test
    void threeStandardCorrectionOnTheBenchRecoversTheDeviceThroughATwoTerminalFixture() {
        // OSL is exact for any linear (bilinear-map) fixture, so it removes leads, residuals and strays alike
        SimulatedBench b = Requests.bench("meter:\n  noise: 0\nfixture:\n"
                + "  connection: 2-terminal\n  lead_resistance_ohm: 0.2\n"
                + "  residual_resistance_ohm: 0.05\n  residual_inductance_h: 20e-9\n"
                + "  stray_conductance_s: 1e-9\n  stray_capacitance_f: 5e-12\n"
                + "load:\n  resistance_ohm: 100\n"
                + "device:\n  capacitor:\n    capacitance_f: 1e-9\n    esr_ohm: 0.3\n");
        double[] grid = {1e3, 1e4, 1e5, 1e6};
        PointRequest t = Requests.at(1e3);
        MeterCorrection c = MeterCorrection.none();
        for (FixtureSlot s : new FixtureSlot[] {FixtureSlot.OPEN, FixtureSlot.SHORT,
                FixtureSlot.LOAD}) {
            b.setSlot(s);
            c = c.with(Standard.valueOf(s.name()), MeterCorrection.acquire(b, grid, t).samples());
        }
        b.setSlot(FixtureSlot.DEVICE);
        PointResult raw = b.measure(Requests.at(1e5));
        Complex z = c.apply(1e5, new Complex(raw.real(), raw.imaginary()));
        // the device's own values (1 nF, 0.3 Ω ESR)
        double x = -1 / (2 * Math.PI * 1e5 * 1e-9); // X = −1/ωC
        assertEquals(0.3, z.getReal(), 1e-6);
        assertEquals(x, z.getImaginary(), 1e-6 * Math.abs(x));
    }
}
