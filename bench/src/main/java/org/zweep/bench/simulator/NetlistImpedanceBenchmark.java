package org.zweep.bench.simulator;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.infra.Blackhole;
import org.zweep.simulator.netlist.Netlist;

/**
 * Impedance of a 20-element netlist (a lossy LC ladder with one coupled pair) at 1,000
 * log-spaced frequencies from 10 Hz to 20 MHz. Target: under 20 ms per sweep after warm-up.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class NetlistImpedanceBenchmark {

    private Netlist netlist;
    private double[] frequenciesHz;
    private double[] re;
    private double[] im;

    /** Builds the ladder: six sections of L, C and a loss resistor, a coupled load, 20 lines. */
    @Setup
    public void setUp() {
        StringBuilder s = new StringBuilder("R0 hi n0 0.1\n");
        for (int i = 0; i < 5; i++) {
            s.append("L").append(i).append(" n").append(i).append(" n").append(i + 1)
                    .append(" ").append(1 + i).append("u\n");
            s.append("C").append(i).append(" n").append(i + 1).append(" lo ")
                    .append(2 - 0.3 * i).append("n\n");
            s.append("R").append(i + 1).append(" n").append(i + 1).append(" lo ")
                    .append(10 + 5 * i).append("k\n");
        }
        s.append("LP n5 lo 10u\nLS s lo 2.5u\nRS s lo 50\nK1 LP LS 0.95\n");
        netlist = Netlist.parse(s.toString(), "benchmark");
        if (netlist.elementCount() != 20) {
            throw new IllegalStateException("expected 20 elements, got " + netlist.elementCount());
        }
        frequenciesHz = new double[1000];
        for (int i = 0; i < frequenciesHz.length; i++) {
            frequenciesHz[i] = 10 * Math.pow(2e6, i / 999.0);
        }
        re = new double[frequenciesHz.length];
        im = new double[frequenciesHz.length];
    }

    /** One sweep of 1,000 frequencies. */
    @Benchmark
    public void impedanceAt1000Frequencies(Blackhole bh) {
        netlist.impedance(frequenciesHz, re, im);
        bh.consume(re);
        bh.consume(im);
    }
}
