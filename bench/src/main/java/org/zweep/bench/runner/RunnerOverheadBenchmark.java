package org.zweep.bench.runner;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.runner.safety.Interruption;
import org.zweep.runner.verdict.CheckEvaluator;
import org.zweep.runner.engine.ProgressListener;
import org.zweep.runner.engine.ReadingCorrector;
import org.zweep.runner.engine.ReconnectPolicy;
import org.zweep.runner.engine.RunEngine;
import org.zweep.runner.engine.RunResult;
import org.zweep.runner.engine.Station;
import org.zweep.runner.engine.Waiter;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.TerminalConfiguration;
import org.zweep.runner.plan.FixturePlan;
import org.zweep.runner.plan.MeterChoice;
import org.zweep.runner.plan.Part;
import org.zweep.driver.impedance.PartKind;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.plan.PlannedStep;
import org.zweep.runner.plan.SafetyLimits;
import org.zweep.runner.plan.Wiring;
import org.zweep.runner.results.PointsCsvWriter;
import org.zweep.runner.safety.SafetyGuard;

/**
 * The runner's own time per point: safety check, apply, row building, derived parameters, point
 * checks and the {@code points.csv} append (synced per trigger, or not synced at all to show
 * what the disk costs), against a meter that answers at once. Point by point
 * ({@code listPoints = 0}) and with a 201-point list sweep.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class RunnerOverheadBenchmark {
    static final int POINTS = 1000;

    @Param({"0", "201"})
    int listPoints;

    @Param({"true", "false"})
    boolean sync;

    Plan plan;
    Path dir;
    int run;

    @Setup(Level.Trial)
    public void setUp() throws Exception {
        List<PlannedPoint> pts = new ArrayList<>();
        for (int i = 0; i < POINTS; i++) {
            pts.add(new PlannedPoint(i, 0, 0, MeasurementSetting.at(100 + i * 1000.0), Wiring.NONE, 0.0));
        }
        plan = Plan.builder().name("overhead").source(Path.of("overhead.yaml"))
                .meter(new MeterChoice("instant:", "standard")).safety(new SafetyLimits(10, 1, 2, 0.1))
                .fixture(new FixturePlan(TerminalConfiguration.FOUR_TERMINAL, CompensationMode.NONE, List.of(), null,
                        Duration.ZERO, null))
                .part(new Part(PartKind.CAPACITOR, "", 100e-9, 10, Double.NaN))
                .steps(List.of(new PlannedStep(0, "sweep", "", BiasControl.NONE, pts)))
                .checks(List.of(new CheckLimit("cs", "cs_f", "sweep", 100.0, 90e-9, 110e-9))).build();
        dir = Files.createTempDirectory("zweep-overhead");
    }

    @TearDown(Level.Trial)
    public void tearDown() throws Exception {
        try (var s = Files.walk(dir)) {
            s.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }

    @Benchmark
    @OperationsPerInvocation(POINTS)
    public RunResult runThousandPoints() {
        InstantMeter meter = new InstantMeter(listPoints);
        Interruption interruption = new Interruption();
        Station st = new Station(meter, new SafetyGuard(plan.safety()), (state, text) -> { }, Waiter.none(interruption),
                ReconnectPolicy.DEFAULT, line -> { });
        st.start();
        Path csv = dir.resolve("points-" + (run++) + ".csv");
        try (PointsCsvWriter w = PointsCsvWriter.open(csv, sync ? PointsCsvWriter.Sync.EACH_ROW : PointsCsvWriter.Sync.NONE)) {
            return new RunEngine(plan, st, ReadingCorrector.NONE, new CheckEvaluator(plan.checks()),
                    ProgressListener.QUIET, interruption).run(new BitSet(), w::append);
        } finally {
            csv.toFile().delete();
        }
    }
}
