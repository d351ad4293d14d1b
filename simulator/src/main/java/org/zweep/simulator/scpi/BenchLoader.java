package org.zweep.simulator.scpi;

import java.nio.file.Path;
import org.zweep.simulator.bench.Bench;

/** Builds benches for {@code SIMulate:BENCh} and {@code SIMulate:DEVice}. */
public interface BenchLoader {
    /**
     * Loads a bench file.
     *
     * @throws IllegalArgumentException with a one-line message when the file is not a valid bench
     */
    Bench load(Path benchFile);

    /**
     * A bench like {@code current} (same meter and fixture, same slot and seed) with the device
     * described by {@code netlist} (SPICE element lines between terminals {@code hi} and {@code lo}).
     *
     * @throws IllegalArgumentException with a one-line message when the netlist is not valid
     */
    Bench withDevice(Bench current, String netlist);
}
