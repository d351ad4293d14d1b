package org.zweep.bench.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.CircuitFit;
import org.zweep.runner.analysis.CircuitModel;
import org.zweep.runner.analysis.EquivalentCircuitFit;

/**
 * Fitting a 1,000-point sweep with the capacitor model (target: under 50 ms after warm-up).
 * The sweep: a 100 nF, 20 mΩ, 1 nH capacitor, 100 Hz to 100 MHz log-spaced,
 * with 0.1 % relative noise.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class CapacitorFitBenchmark {
    List<Impedance> sweep;

    @Setup
    public void setUp() {
        Random random = new Random(1);
        sweep = new ArrayList<>();
        for (int i = 0; i < 1000; i++) {
            double f = 100 * Math.pow(1e6, i / 999.0);
            double w = 2 * Math.PI * f;
            double r = 0.02;
            double x = w * 1e-9 - 1 / (w * 100e-9);
            double s = 1e-3 * Math.hypot(r, x);
            sweep.add(new Impedance(f, r + s * random.nextGaussian(), x + s * random.nextGaussian()));
        }
    }

    @Benchmark
    public CircuitFit fitCapacitor1000Points() {
        return EquivalentCircuitFit.fit(CircuitModel.CAPACITOR, sweep);
    }
}
