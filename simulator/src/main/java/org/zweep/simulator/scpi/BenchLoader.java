package org.zweep.simulator.scpi;

import java.nio.file.Path;
import java.util.List;
import org.zweep.simulator.bench.Bench;

/** Builds benches for {@code SIMulate:BENCh} and {@code SIMulate:DEVice}. */
public interface BenchLoader {
    /**
     * Loads the bench file {@code name} from the loader's bench folders (a relative name is looked
     * up in each folder in turn; an absolute one must lie in one of them).
     *
     * @throws ScpiException {@code -256} when no such bench file is in the folders (the same for a
     *     file outside them), {@code -200} when the loader has no folders
     * @throws RuntimeException with a one-line message when the file is not a valid bench
     */
    Bench load(String name);

    /**
     * A bench like {@code current} (same meter and fixture, same slot and seed) with the device
     * described by {@code netlist} (SPICE element lines between terminals {@code hi} and {@code lo}).
     *
     * @throws RuntimeException with a one-line message when the netlist is not valid
     */
    Bench withDevice(Bench current, String netlist);

    /**
     * The loader for the physics benches ({@link org.zweep.simulator.bench.SimulatedBench}), with
     * no bench folders: {@code SIMulate:BENCh} is refused, {@code SIMulate:DEVice} works.
     *
     * @param ideal load every bench as {@link org.zweep.simulator.bench.BenchSpec#ideal()}
     * @param timing the timing model every loaded bench gets
     */
    static BenchLoader simulated(boolean ideal, TimingModel timing) {
        return new SimulatedBenchLoader(ideal, timing, List.of());
    }

    /**
     * The loader for the physics benches that reads bench files (and their netlist files) only
     * from {@code benchFolders}, as {@code zweep sim --bench-dir} gives them.
     *
     * @see #simulated(boolean, TimingModel)
     */
    static BenchLoader simulated(boolean ideal, TimingModel timing, List<Path> benchFolders) {
        return new SimulatedBenchLoader(ideal, timing, List.copyOf(benchFolders));
    }
}
