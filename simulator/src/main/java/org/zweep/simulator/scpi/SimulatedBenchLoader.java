package org.zweep.simulator.scpi;

import java.nio.file.Path;
import java.util.List;
import org.zweep.simulator.InputFiles;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;

/** {@link BenchLoader} for {@link SimulatedBench}: bench files and netlists. */
final class SimulatedBenchLoader implements BenchLoader {
    private final boolean ideal;
    private final TimingModel timing;
    private final List<Path> folders;

    SimulatedBenchLoader(boolean ideal, TimingModel timing, List<Path> folders) {
        this.ideal = ideal;
        this.timing = timing;
        this.folders = folders;
    }

    private SimulatedBench make(BenchSpec spec) {
        BenchSpec s = ideal ? spec.ideal() : spec;
        return new SimulatedBench(s.withTiming(timing == TimingModel.REAL ? Timing.REAL : Timing.NONE));
    }

    @Override
    public Bench load(String name) {
        if (folders.isEmpty()) {
            throw new ScpiException(StandardError.EXECUTION_ERROR,
                    "bench files are read only from the folders given with --bench-dir, and none was given");
        }
        Path file = InputFiles.inside(name, folders);
        if (file == null) {
            String shown = name.length() > 80 ? name.substring(0, 80) + "..." : name;
            throw new ScpiException(StandardError.FILE_NAME_NOT_FOUND, shown + " is not a file in the bench folders");
        }
        return make(BenchSpec.load(file, folders));
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
