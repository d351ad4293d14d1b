package org.zweep.simulator.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.zweep.simulator.SimulatorInputException;

/** A bench that states its accuracy errs exactly as stated, so its claim can be checked. */
class StatedAccuracyTest {

    private static String bench(String distribution) {
        return "seed: 11\nmeter:\n  accuracy:\n    distribution: " + distribution + "\n    bands:\n"
                + "      - frequency_hz: [20, 1.0e5]\n        level_vrms: [0.1, 2]\n        integration_min_s: 0.001\n"
                + "        basic: 0.001\n        short_ohm: 0.01\n        open_s: 1.0e-8\n        phase_rad: 0.002\n"
                + "fixture:\n  residual_resistance_ohm: 0\n  residual_inductance_h: 0\n"
                + "  stray_conductance_s: 0\n  stray_capacitance_f: 0\n"
                + "device:\n  resistor:\n    resistance_ohm: 1000\n";
    }

    @Test
    void normalStatedLimitsAreTwoStandardDeviationsOfTheErrors() {
        SimulatedBench b = Requests.bench(bench("normal-k2"));
        // e(|Z|) = 0.001 + 0.01/1000 + 1e-8·1000 = 0.00102; e(θ) = 0.002 + 0.00002 = 0.00202 rad
        double em = 0.00102;
        double et = 0.00202;
        int n = 20_000;
        int inside = 0;
        double ssM = 0;
        double ssT = 0;
        for (long key = 0; key < n; key++) {
            PointResult r = b.measure(Requests.keyed(1e3, key, 0.01, 1));
            double dm = Math.hypot(r.real(), r.imaginary()) / 1000 - 1;
            double dt = Math.atan2(r.imaginary(), r.real());
            ssM += dm * dm;
            ssT += dt * dt;
            inside += Math.abs(dm) <= em ? 1 : 0;
        }
        assertEquals(em / 2, Math.sqrt(ssM / n), 0.02 * em / 2);
        assertEquals(et / 2, Math.sqrt(ssT / n), 0.02 * et / 2);
        // a normal variable lies within ±2σ with probability 0.9545 (Abramowitz and Stegun, Table 26.1)
        assertEquals(0.9545, inside / (double) n, 0.006);
    }

    @Test
    void rectangularStatedLimitsBoundEveryError() {
        SimulatedBench b = Requests.bench(bench("rectangular"));
        double ss = 0;
        int n = 20_000;
        for (long key = 0; key < n; key++) {
            PointResult r = b.measure(Requests.keyed(1e3, key, 0.01, 1));
            double dm = Math.hypot(r.real(), r.imaginary()) / 1000 - 1;
            assertTrue(Math.abs(dm) <= 0.00102 + 1e-15);
            ss += dm * dm;
        }
        // uniform on ±a: σ = a/√3 (JCGM 100:2008, 4.3.7)
        assertEquals(0.00102 / Math.sqrt(3), Math.sqrt(ss / n), 0.02 * 0.00102 / Math.sqrt(3));
    }

    @Test
    void outsideEveryBandTheNoiseModelApplies() {
        SimulatedBench b = Requests.bench(bench("normal-k2"));
        PointResult r = b.measure(Requests.voltage(1e6, 1.0)); // 1 MHz: no band covers it
        double dm = Math.hypot(r.real(), r.imaginary()) / 1000 - 1;
        assertTrue(Math.abs(dm) < 0.001); // the default noise (1e-4 relative) is far smaller than the band's
    }

    @Test
    void aBandWithoutLevelsIsRefusedWithItsPlace() {
        String text = bench("normal-k2").replace("        level_vrms: [0.1, 2]\n", "");
        SimulatorInputException e = org.junit.jupiter.api.Assertions.assertThrows(SimulatorInputException.class,
                () -> Requests.bench(text));
        assertTrue(e.getMessage().contains("'meter.accuracy.bands[0]' needs one of level_vrms, level_arms"),
                e.getMessage());
    }
}
