package org.zweep.simulator.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.junit.jupiter.api.Test;

class NoiseAndTimingTest {

    /** Noise on, fixture without residuals, so the true reading is 500 Ω. */
    private static final String NOISY = "seed: 7\nmeter:\n  noise: 1e-3\n"
            + "fixture:\n  residual_resistance_ohm: 0\n  residual_inductance_h: 0\n"
            + "  stray_conductance_s: 0\n  stray_capacitance_f: 0\n"
            + "device:\n  resistor:\n    resistance_ohm: 500\n";

    @Test
    void sameSeedKeyAndRequestGiveBitIdenticalReadingsInAnyOrderAndThread() throws Exception {
        SimulatedBench a = Requests.bench(NOISY);
        List<PointResult> forward = new ArrayList<>();
        for (long key = 0; key < 20; key++) {
            forward.add(a.measure(Requests.keyed(1e3, key, 0.01, 1)));
        }
        SimulatedBench b = Requests.bench(NOISY);
        ExecutorService pool = Executors.newFixedThreadPool(4);
        try {
            List<Future<PointResult>> backward = new ArrayList<>();
            for (long key = 19; key >= 0; key--) {
                long k = key;
                backward.add(0, pool.submit(() -> b.measure(Requests.keyed(1e3, k, 0.01, 1))));
            }
            for (int i = 0; i < 20; i++) {
                PointResult x = forward.get(i);
                PointResult y = backward.get(i).get();
                assertEquals(Double.doubleToRawLongBits(x.real()),
                        Double.doubleToRawLongBits(y.real()), "key " + i);
                assertEquals(Double.doubleToRawLongBits(x.imaginary()),
                        Double.doubleToRawLongBits(y.imaginary()), "key " + i);
            }
        } finally {
            pool.shutdownNow();
        }
    }

    @Test
    void anotherKeyOrSeedGivesOtherNoise() {
        SimulatedBench b = Requests.bench(NOISY);
        double k1 = b.measure(Requests.keyed(1e3, 1, 0.01, 1)).real();
        double k2 = b.measure(Requests.keyed(1e3, 2, 0.01, 1)).real();
        assertNotEquals(k1, k2);
        b.setSeed(8);
        assertNotEquals(k1, b.measure(Requests.keyed(1e3, 1, 0.01, 1)).real());
        b.setSeed(7);
        assertEquals(k1, b.measure(Requests.keyed(1e3, 1, 0.01, 1)).real(), 0);
    }

    @Test
    void noiseFallsAsOneOverTheSquareRootOfIntegrationTimesAverages() {
        // white noise averaged over N samples: σ/√N (textbook statistics, common practice)
        SimulatedBench b = Requests.bench(NOISY);
        double e1 = b.measure(Requests.keyed(1e3, 5, 0.01, 1)).real() - 500;
        double e4 = b.measure(Requests.keyed(1e3, 5, 0.01, 4)).real() - 500;
        double e16 = b.measure(Requests.keyed(1e3, 5, 0.04, 4)).real() - 500;
        assertEquals(e1 / 2, e4, 1e-12 * 500);
        assertEquals(e1 / 4, e16, 1e-12 * 500);
    }

    @Test
    void noiseHasTheDocumentedStandardDeviation() {
        // 1σ = noise·(|Z|(1 + |Z|/U) + U/1000): 500 Ω on the 1 kΩ range → 1e-3·(750 + 1) Ω
        SimulatedBench b = Requests.bench(NOISY);
        int n = 4000;
        double sum = 0;
        double sumSq = 0;
        for (long key = 0; key < n; key++) {
            double e = b.measure(Requests.keyed(1e3, key, 0.01, 1)).real() - 500;
            sum += e;
            sumSq += e * e;
        }
        double sd = Math.sqrt(sumSq / n - (sum / n) * (sum / n));
        assertEquals(0.751, sd, 0.751 * 0.05); // 5 % ≈ 4.5 standard errors of σ at n = 4000
        assertEquals(0, sum / n, 4 * 0.751 / Math.sqrt(n));
    }

    @Test
    void idealBenchHasNoNoise() {
        SimulatedBench b = new SimulatedBench(BenchSpec.parse(NOISY, "t", null).ideal());
        assertEquals(500, b.measure(Requests.keyed(1e3, 1, 0.01, 1)).real(), 0);
        assertEquals(500, b.measure(Requests.keyed(1e3, 2, 0.01, 1)).real(), 0);
    }

    @Test
    void realTimingIsOverheadPlusAveragedApertureAndSettlingAfterABiasChange() {
        // the documented timing model (README, formats-simulator)
        SimulatedBench b = Requests.bench("meter:\n  timing: real\n  point_overhead_s: 0.002\n"
                + "  bias_settling_s: 0.05\ndevice:\n  capacitor:\n    capacitance_f: 1e-6\n");
        PointRequest plain = PointRequest.at(1e3).averages(4).apertureS(0.1).build();
        assertEquals(0.402, b.measure(plain).durationS(), 1e-12);
        PointRequest biased = PointRequest.at(1e3).bias(SourceKind.VOLTAGE, 2, true).averages(4).apertureS(0.1)
                .noiseKey(2).build();
        assertEquals(0.452, b.measure(biased).durationS(), 1e-12);
        assertEquals(0.402, b.measure(biased).durationS(), 1e-12);
        assertEquals(0.452, b.measure(plain).durationS(), 1e-12);
        // at 10 Hz one integration lasts at least two periods (0.2 s), not the 10 ms aperture
        PointRequest slow = PointRequest.at(10).noiseKey(3).build();
        assertEquals(0.202, b.measure(slow).durationS(), 1e-12);
    }

    @Test
    void noTimingMakesEveryPointInstant() {
        SimulatedBench b = new SimulatedBench(BenchSpec.parse("meter:\n  timing: none\n"
                + "device:\n  resistor:\n    resistance_ohm: 1\n", "t", null));
        PointResult r = b.measure(Requests.biased(10, 1, SourceKind.VOLTAGE, 1));
        assertEquals(0, r.durationS(), 0);
        assertTrue(BenchSpec.parse("device:\n  resistor:\n    resistance_ohm: 1\n", "t", null)
                .withTiming(Timing.NONE).timing() == Timing.NONE);
    }
}
