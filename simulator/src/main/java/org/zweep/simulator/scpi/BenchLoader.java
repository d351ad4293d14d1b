package org.zweep.simulator.scpi;

import java.nio.file.Path;
import org.zweep.simulator.bench.Bench;

/** Builds benches for {@code SIMulate:BENCh} and {@code SIMulate:DEVice}. */
public interface BenchLoader {
    /**
     * Loads a bench file.
     *
     * @throws RuntimeException with a one-line message when the file is not a valid bench
     */
    Bench load(Path benchFile);

    /**
     * A bench like {@code current} (same meter and fixture, same slot and seed) with the device
     * described by {@code netlist} (SPICE element lines between terminals {@code hi} and {@code lo}).
     *
     * @throws RuntimeException with a one-line message when the netlist is not valid
     */
    Bench withDevice(Bench current, String netlist);

    /**
     * The loader for the physics benches ({@link org.zweep.simulator.bench.SimulatedBench}).
     *
     * @param ideal load every bench as {@link org.zweep.simulator.bench.BenchSpec#ideal()}
     * @param timing the timing model every loaded bench gets
     */
    static BenchLoader simulated(boolean ideal, TimingModel timing) {
        return new SimulatedBenchLoader(ideal, timing);
    }
}
