package org.zweep.bench.runner;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.atomic.DoubleAdder;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.engine.FixturePort;
import org.zweep.runner.engine.RunSession;
import org.zweep.runner.engine.ScpiMeterLink;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.engine.RowSync;
import org.zweep.runner.results.RunFolder;
import org.zweep.runner.sequence.SequenceLoader;
import org.zweep.runner.sim.InProcessSimulator;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.FixtureSlot;
import org.zweep.simulator.bench.MeterLimits;
import org.zweep.simulator.bench.PointRequest;
import org.zweep.simulator.bench.PointResult;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.bench.Wiring;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Wall time of a run against the simulated meter's own time, with timing {@code real}:
 * {@code java -cp bench/target/benchmarks.jar org.zweep.bench.runner.RealTimingCheck [REPO [POINTS]]}.
 * The meter time is the sum of the bench's point durations; a sweep of POINTS (default 200)
 * points is run point by point and with list sweeps, each with rows synced before the next point
 * starts (the run-folder contract) and synced behind, overlapped with the next point, after a
 * discarded warm-up run.
 */
public final class RealTimingCheck {
    private RealTimingCheck() {
    }

    public static void main(String[] args) throws Exception {
        Path repo = Path.of(args.length > 0 ? args[0] : ".").toAbsolutePath();
        int points = args.length > 1 ? Integer.parseInt(args[1]) : 200;
        Path dir = Files.createTempDirectory("zweep-timing");
        // the first run in a JVM pays for class loading and compilation (~0.5 s), not per point
        runOnce(repo, dir, 50, 0, RowSync.BEFORE_NEXT, false);
        for (int list : new int[] {0, 201}) {
            for (RowSync sync : RowSync.values()) {
                runOnce(repo, dir, points, list, sync, true);
            }
        }
    }

    private static void runOnce(Path repo, Path dir, int points, int list, RowSync sync,
            boolean report)
            throws Exception {
        Path seq = BenchFiles.sweep(dir, BenchFiles.capacitorBench(repo), points, "20 ms");
        String dialect = BenchFiles.dialect(dir, list);
        DoubleAdder meterS = new DoubleAdder();
        Bench inner = new SimulatedBench(BenchSpec.load(BenchFiles.capacitorBench(repo)).withTiming(Timing.REAL));
        SimulatorServer server = SimulatorServer.start(counting(inner, meterS), ServerOptions.defaults()
                .withTcp(false).withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.REAL)));
        ScpiMeterLink link = ScpiMeterLink.open("sim:counting", org.zweep.driver.dialect.Dialect.load(dialect), () -> ScpiClient.connect(
                InProcessSimulator.transport(server.connectInMemory(), "sim:counting"), ScpiSettings.DEFAULTS),
                server::close);
        Plan plan = SequenceLoader.load(seq);
        RunFolder folder = RunFolder.createAt(dir.resolve("run-" + points + "-" + list + "-" + sync), seq);
        RunSession session = new RunSession(plan, link, RunSession.Setup.builder(folder).sequenceFile(seq.toString())
                .dialect(dialect).fixture(FixturePort.meter(link, FixturePort.refusing("nobody at the fixture"), line -> { }))
                .version("bench").rowSync(sync).build());
        meterS.reset();
        long t0 = System.nanoTime();
        session.run();
        double wall = (System.nanoTime() - t0) / 1e9;
        link.close();
        double m = meterS.sum();
        if (!report) {
            return;
        }
        System.out.printf(Locale.ROOT,
                "%s, rows synced %s: %d points, wall %.3f s, simulated meter time %.3f s, excess %.2f %%%n",
                list == 0 ? "point by point" : "list sweep (201)", sync == RowSync.BEFORE_NEXT
                        ? "before the next point" : "behind (overlapped)", plan.points().size(), wall, m,
                100 * (wall - m) / m);
    }

    static Bench counting(Bench b, DoubleAdder total) {
        return new Bench() {
            @Override
            public MeterLimits limits() {
                return b.limits();
            }

            @Override
            public PointResult measure(PointRequest request) {
                PointResult r = b.measure(request);
                total.add(r.durationS());
                return r;
            }

            @Override
            public FixtureSlot slot() {
                return b.slot();
            }

            @Override
            public void setSlot(FixtureSlot slot) {
                b.setSlot(slot);
            }

            @Override
            public Wiring wiring() {
                return b.wiring();
            }

            @Override
            public void setWiring(Wiring wiring) {
                b.setWiring(wiring);
            }

            @Override
            public long seed() {
                return b.seed();
            }

            @Override
            public void setSeed(long seed) {
                b.setSeed(seed);
            }
        };
    }
}
