package org.zweep.simulator.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class BenchPhysicsTest {

    private static final double W1K = 2 * Math.PI * 1e3;

    @Test
    void levelAcrossTheDeviceIsTheSourceResistanceDivider() {
        // voltage divider V·R/(R + Rs) (Ohm's law, textbook)
        for (double rs : new double[] {25, 100, 400}) {
            SimulatedBench b = new SimulatedBench(BenchSpec.parse("meter:\n"
                    + "  source_resistance_ohm: " + rs + "\n"
                    + "device:\n  resistor:\n    resistance_ohm: 100\n", "t", null).ideal());
            PointResult r = b.measure(Requests.voltage(1e3, 1.0));
            assertEquals(100 / (100 + rs), r.deviceLevelRms(), 1e-12, "Rs = " + rs);
            assertEquals(100, r.real(), 1e-12);
        }
    }

    @Test
    void levelAcrossACapacitorFollowsItsImpedance() {
        // |V| = |Z/(Z + Rs)|: 100 nF at 1 kHz is −j1591.55 Ω, at 100 kHz −j15.9155 Ω (X = 1/ωC)
        SimulatedBench b = Requests.ideal("  capacitor:\n    capacitance_f: 100e-9\n");
        double x1k = 1 / (W1K * 100e-9);
        double x100k = x1k / 100;
        assertEquals(x1k / Math.hypot(100, x1k),
                b.measure(Requests.at(1e3)).deviceLevelRms(), 1e-12);
        assertEquals(x100k / Math.hypot(100, x100k),
                b.measure(Requests.at(100e3)).deviceLevelRms(), 1e-12);
    }

    @Test
    void currentDriveSetsTheLevelByOhmsLaw() {
        // V = I·R (Ohm's law)
        SimulatedBench b = Requests.ideal("  resistor:\n    resistance_ohm: 10\n");
        assertEquals(0.1, b.measure(Requests.current(1e3, 0.01)).deviceLevelRms(), 1e-12);
    }

    @Test
    void levelDependentCapacitorRespondsToTheLevelActuallyAcrossIt() {
        // C = C0·(1 + a·V), V = the level across the part after the source-resistance divider
        SimulatedBench b = Requests.ideal("  capacitor:\n    capacitance_f: 100e-9\n"
                + "    level_coefficient_per_vrms: 0.1\n");
        for (double f : new double[] {1e3, 30e3, 300e3}) {
            PointResult r = b.measure(Requests.at(f));
            double c = -1 / (2 * Math.PI * f * r.imaginary());
            assertEquals(100e-9 * (1 + 0.1 * r.deviceLevelRms()), c, 1e-20, "at " + f + " Hz");
            double z = 1 / (2 * Math.PI * f * c);
            assertEquals(z / Math.hypot(100, z), r.deviceLevelRms(), 1e-10);
        }
    }

    @Test
    void twoTerminalConnectionAddsTheLeadResistanceAndFourTerminalDoesNot() {
        // leads of 0.10593 Ω (about 2 × 1 m of AWG 22 copper): a 100 mΩ part reads 205.9 mΩ two-terminal
        // and 100 mΩ four-terminal, where the sense path carries no current
        String fixture = "meter:\n  noise: 0\nfixture:\n  residual_resistance_ohm: 0\n"
                + "  residual_inductance_h: 0\n  stray_conductance_s: 0\n"
                + "  stray_capacitance_f: 0\n  lead_resistance_ohm: 0.10593\n";
        String device = "device:\n  resistor:\n    resistance_ohm: 0.1\n";
        SimulatedBench two = Requests.bench(fixture + "  connection: 2-terminal\n" + device);
        SimulatedBench four = Requests.bench(fixture + "  connection: 4-terminal\n" + device);
        assertEquals(0.2059, two.measure(Requests.at(1e3)).real(), 5e-5);
        assertEquals(0.1, four.measure(Requests.at(1e3)).real(), 1e-12);
    }

    @Test
    void idealBenchHasNoLeadResistanceEvenInTwoTerminal() {
        SimulatedBench b = new SimulatedBench(BenchSpec.parse("fixture:\n"
                + "  connection: 2-terminal\n  lead_resistance_ohm: 0.1\n"
                + "device:\n  resistor:\n    resistance_ohm: 0.1\n", "t", null).ideal());
        assertEquals(0.1, b.measure(Requests.at(1e3)).real(), 1e-15); // four-terminal sensing
    }

    @Test
    void fixtureReadingsMatchTheCompensationTestVector() {
        // Zs = 0.05 Ω + 20 nH at the meter, Yo = 1 nS + 5 pF across a 0.5 Ω + 1 µH DUT at 1 MHz;
        // expected readings computed independently from Zm = Zs + 1/(Yo + 1/Zdut), short Zs, open Zs + 1/Yo
        SimulatedBench b = Requests.bench("meter:\n  noise: 0\nfixture:\n"
                + "  connection: 4-terminal\n  residual_resistance_ohm: 0.05\n"
                + "  residual_inductance_h: 20e-9\n  stray_conductance_s: 1e-9\n"
                + "  stray_capacitance_f: 5e-12\n"
                + "device:\n  resistor:\n    resistance_ohm: 0.5\n    series_inductance_h: 1e-6\n");
        PointResult dut = b.measure(Requests.at(1e6));
        assertEquals(0.550197489669, dut.real(), 1e-11);
        assertEquals(6.41008164433, dut.imaginary(), 1e-10);
        b.setSlot(FixtureSlot.SHORT);
        PointResult shorted = b.measure(Requests.at(1e6));
        assertEquals(0.05, shorted.real(), 1e-15);
        assertEquals(0.125663706144, shorted.imaginary(), 1e-11);
        b.setSlot(FixtureSlot.OPEN);
        PointResult open = b.measure(Requests.at(1e6));
        assertEquals(1.0632118354, open.real(), 1e-9);
        assertEquals(-31830.8629224, open.imaginary(), 1e-6);
    }

    @Test
    void openShortCorrectionRemovesTheFixtureResidualsAtEveryFrequency() {
        // series residual at the meter, stray admittance across the device: the exact open/short correction
        // (Zm − Zs)/(1 − (Zm − Zs)·Yo) gives the true 0.5 Ω + 1 µH back, between the acquired frequencies too
        SimulatedBench b = Requests.bench("meter:\n  noise: 0\nfixture:\n"
                + "  residual_resistance_ohm: 0.05\n  residual_inductance_h: 20e-9\n"
                + "  stray_conductance_s: 1e-9\n  stray_capacitance_f: 5e-12\n"
                + "device:\n  resistor:\n    resistance_ohm: 0.5\n    series_inductance_h: 1e-6\n");
        double[] grid = MeterCorrection.frequencies(b.limits(), 10);
        PointRequest template = Requests.at(1e3);
        b.setSlot(FixtureSlot.OPEN);
        MeterCorrection c = MeterCorrection.none().with(MeterCorrection.Standard.OPEN,
                MeterCorrection.acquire(b, grid, template).samples());
        b.setSlot(FixtureSlot.SHORT);
        c = c.with(MeterCorrection.Standard.SHORT,
                MeterCorrection.acquire(b, grid, template).samples());
        b.setSlot(FixtureSlot.DEVICE);
        for (double f : new double[] {1e3, 12345, 1e6, 3.3e6}) {
            PointResult raw = b.measure(Requests.at(f));
            var z = c.apply(f, new org.apache.commons.math3.complex.Complex(raw.real(),
                    raw.imaginary()));
            assertEquals(0.5, z.getReal(), 1e-9, "R at " + f);
            assertEquals(2 * Math.PI * f * 1e-6, z.getImaginary(), 1e-9, "X at " + f);
            assertTrue(Math.abs(raw.real() - 0.5) > 0.04, "the raw reading carries the residual");
        }
    }

    @Test
    void capacitanceFallsWithDcBiasAlongTheDeratingCurve() {
        // a synthetic class-2 curve, C(V)/C(0) decreasing with bias: C0/(1 + (V/V½)^2), exactly 1/2 at V½
        SimulatedBench b = Requests.ideal("  capacitor:\n    capacitance_f: 100e-9\n"
                + "    bias_half_voltage_v: 25\n    bias_exponent: 2\n");
        double previous = Double.POSITIVE_INFINITY;
        for (double v : new double[] {0, 5, 10, 25, 40}) {
            PointResult r = b.measure(Requests.biased(1e3, 0.01, SourceKind.VOLTAGE, v));
            double c = -1 / (W1K * r.imaginary());
            assertEquals(100e-9 / (1 + Math.pow(v / 25, 2)), c, 1e-18, "at " + v + " V");
            assertTrue(c < previous);
            previous = c;
        }
    }

    @Test
    void inductanceFallsWithDcBiasCurrentThroughTheSaturationPoints() {
        // L(I) = L0/(1 + (I/I0)^2), L0 = 10 µH, I0 = 5 A: x % down at I = I0·√(1/(1 − x) − 1), computed:
        // 10 % at 1.6667 A, 20 % at 2.5000 A, 30 % at 3.2733 A
        SimulatedBench b = Requests.ideal("  inductor:\n    inductance_h: 10e-6\n"
                + "    saturation_current_a: 5\n    saturation_exponent: 2\n");
        double[][] points = {{1.6667, 0.9}, {2.5, 0.8}, {3.2733, 0.7}};
        for (double[] p : points) {
            PointResult r = b.measure(Requests.biased(1e3, 0.005, SourceKind.CURRENT, p[0]));
            double l = r.imaginary() / W1K;
            assertEquals(p[1] * 10e-6, l, 2e-4 * 10e-6, "at " + p[0] + " A");
        }
    }

    @Test
    void transformerPrimaryOpenShortedAndVoltageRatioMatchTheWorkedExample() {
        // L1 = 10 mH, n = 4, k = 0.99: short-circuit inductance L1(1 − k²) = 199.0 µH (the JIS C 5602-1986 method,
        // as Wikipedia "Short-circuit inductance" gives it) and V1/V2 = L1/M = n/k = 4.0404 (M = k√(L1·L2)), computed
        SimulatedBench b = Requests.ideal("  transformer:\n    primary_inductance_h: 10e-3\n"
                + "    turns_ratio: 4\n    coupling: 0.99\n");
        assertEquals(10e-3, b.measure(Requests.at(1e3)).imaginary() / W1K, 1e-15);
        b.setWiring(Wiring.SECONDARY_SHORTED);
        assertEquals(199.0e-6, b.measure(Requests.at(1e3)).imaginary() / W1K, 1e-12);
        PointResult ratio = b.measure(Requests.ratio(1e3));
        assertEquals(4.0404, 1 / ratio.real(), 1e-4);
        assertEquals(0, ratio.imaginary(), 1e-15);
    }

    @Test
    void aDeviceWithoutASecondWindingReadsAZeroVoltageRatio() {
        SimulatedBench b = Requests.ideal("  resistor:\n    resistance_ohm: 10\n");
        PointResult r = b.measure(Requests.ratio(1e3));
        assertEquals(0, r.real(), 0);
        assertEquals(0, r.imaginary(), 0);
    }

    @Test
    void heldRangeFarFromTheImpedanceOverloadsAndAutoRangeDoesNot() {
        SimulatedBench b = Requests.ideal("  resistor:\n    resistance_ohm: 1000\n");
        assertTrue(b.measure(Requests.held(1e3, 100)).overload()); // 10× over the range
        assertTrue(b.measure(Requests.held(1e3, 1e8)).overload()); // 1e-5 of the range
        assertFalse(b.measure(Requests.held(1e3, 1e3)).overload());
        PointResult auto = b.measure(Requests.at(1e3));
        assertFalse(auto.overload());
        assertEquals(1e3, auto.rangeUsedOhm(), 0);
        assertTrue(Double.isNaN(b.measure(Requests.held(1e3, 100)).real()));
    }

    @Test
    void anIdealOpenOverloads() {
        SimulatedBench b = Requests.ideal("  resistor:\n    resistance_ohm: 1000\n");
        b.setSlot(FixtureSlot.OPEN);
        assertTrue(b.measure(Requests.at(1e3)).overload());
        b.setSlot(FixtureSlot.SHORT);
        PointResult shorted = b.measure(Requests.at(1e3));
        assertFalse(shorted.overload());
        assertEquals(0, shorted.real(), 0);
    }

    @Test
    void loadSlotReadsTheLoadStandard() {
        SimulatedBench b = new SimulatedBench(BenchSpec.parse("load:\n  resistance_ohm: 50\n"
                + "device:\n  resistor:\n    resistance_ohm: 1\n", "t", null).ideal());
        b.setSlot(FixtureSlot.LOAD);
        assertEquals(50, b.measure(Requests.at(1e3)).real(), 1e-12);
    }
}
