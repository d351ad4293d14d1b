package org.zweep.simulator.scpi;

import java.nio.file.Path;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;

/** {@link BenchLoader} for {@link SimulatedBench}: bench files and netlists. */
final class SimulatedBenchLoader implements BenchLoader {
    private final boolean ideal;
    private final TimingModel timing;

    SimulatedBenchLoader(boolean ideal, TimingModel timing) {
        this.ideal = ideal;
        this.timing = timing;
    }

    private SimulatedBench make(BenchSpec spec) {
        BenchSpec s = ideal ? spec.ideal() : spec;
        return new SimulatedBench(s.withTiming(timing == TimingModel.REAL ? Timing.REAL : Timing.NONE));
    }

    @Override
    public Bench load(Path benchFile) {
        return make(BenchSpec.load(benchFile));
    }

    @Override
    public Bench withDevice(Bench current, String netlist) {
        Bench next;
        if (current instanceof SimulatedBench sb) {
            next = new SimulatedBench(sb.spec().withNetlistDevice(netlist, "SIMulate:DEVice"));
        } else {
            next = make(BenchSpec.ofNetlist(netlist, "SIMulate:DEVice"));
        }
        next.setSlot(current.slot());
        next.setWiring(current.wiring());
        next.setSeed(current.seed());
        return next;
    }
}
