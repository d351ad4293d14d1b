package org.zweep.runner.engine;

import org.zweep.runner.safety.BiasWatcher;
import org.zweep.runner.safety.Interruption;
import java.net.InetAddress;
import java.net.UnknownHostException;
import java.time.Clock;
import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import java.util.Locale;
import java.util.function.Consumer;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.MeterException;
import org.zweep.runner.plan.Part;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.results.PointsCsvReader;
import org.zweep.runner.results.PointsCsvWriter;
import org.zweep.runner.results.RunFolder;
import org.zweep.runner.results.RunId;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.verdict.CheckEvaluator;
import org.zweep.runner.verdict.CheckOutcome;
import org.zweep.runner.safety.SafetyGuard;

/**
 * One run (or resumed run) into a run folder, from start to verdict: checks the plan against its
 * safety limits, reads back what is already on disk, starts the station, prepares compensation,
 * runs the engine, evaluates the checks and keeps {@code run.json} up to date. DC bias is off on
 * every way out. Not thread-safe; one run per session.
 */
public final class RunSession {

    /**
     * Everything a run needs besides the plan and the meter.
     *
     * @param folder the run folder (fresh, or existing when {@code resuming})
     * @param resuming whether this continues a run already in {@code folder}
     * @param sequenceFile the original sequence file (for {@code run.json})
     * @param dialect the dialect name or file in use
     * @param seed the noise seed of the meter's bench, recorded in {@code run.json}; {@code null} when none
     * @param reconnect how to reconnect after a lost link
     * @param fixture changes what is in the fixture
     * @param progress where progress goes
     * @param interruption stop requests (Ctrl-C, shutdown)
     * @param compensation prepares fixture compensation
     * @param sweepChecks evaluates whole-sweep checks at the end
     * @param clock the wall clock
     * @param version the software version
     * @param rowSync when rows reach the storage device: {@link RowSync#BEHIND} (the default, the
     *     run-folder contract) while the next point is measured, durable before the point after it
     *     is triggered, or {@link RowSync#BEFORE_NEXT} before the next point starts
     */
    public record Setup(RunFolder folder, boolean resuming, String sequenceFile, String dialect, Long seed,
            ReconnectPolicy reconnect, FixturePort fixture, ProgressListener progress, Interruption interruption,
            FixtureCompensation compensation, SweepChecks sweepChecks, Clock clock, String version,
            RowSync rowSync) {

        /**
         * A builder for a run into {@code folder}: a fresh run, {@link ReconnectPolicy#DEFAULT}, no
         * compensation, no whole-sweep checks, quiet, the system clock in UTC, rows synced
         * {@link RowSync#BEHIND}; the fixture, dialect and sequence file must be set.
         */
        public static Builder builder(RunFolder folder) {
            return new Builder(folder);
        }

        /** Builds a {@link Setup} by field name. */
        public static final class Builder {
            private final RunFolder folder;
            private boolean resuming;
            private String sequenceFile;
            private String dialect;
            private Long seed;
            private ReconnectPolicy reconnect = ReconnectPolicy.DEFAULT;
            private FixturePort fixture;
            private ProgressListener progress = ProgressListener.QUIET;
            private Interruption interruption = new Interruption();
            private FixtureCompensation compensation = FixtureCompensation.NONE;
            private SweepChecks sweepChecks = SweepChecks.NONE;
            private Clock clock = Clock.systemUTC();
            private String version = "";
            private RowSync rowSync = RowSync.BEHIND;

            private Builder(RunFolder folder) {
                this.folder = folder;
            }

            /** @see Setup#resuming() */
            public Builder resuming(boolean v) {
                resuming = v;
                return this;
            }

            /** @see Setup#sequenceFile() */
            public Builder sequenceFile(String v) {
                sequenceFile = v;
                return this;
            }

            /** @see Setup#dialect() */
            public Builder dialect(String v) {
                dialect = v;
                return this;
            }

            /** @see Setup#seed() */
            public Builder seed(Long v) {
                seed = v;
                return this;
            }

            /** @see Setup#reconnect() */
            public Builder reconnect(ReconnectPolicy v) {
                reconnect = v;
                return this;
            }

            /** @see Setup#fixture() */
            public Builder fixture(FixturePort v) {
                fixture = v;
                return this;
            }

            /** @see Setup#progress() */
            public Builder progress(ProgressListener v) {
                progress = v;
                return this;
            }

            /** @see Setup#interruption() */
            public Builder interruption(Interruption v) {
                interruption = v;
                return this;
            }

            /** @see Setup#compensation() */
            public Builder compensation(FixtureCompensation v) {
                compensation = v;
                return this;
            }

            /** @see Setup#sweepChecks() */
            public Builder sweepChecks(SweepChecks v) {
                sweepChecks = v;
                return this;
            }

            /** @see Setup#clock() */
            public Builder clock(Clock v) {
                clock = v;
                return this;
            }

            /** @see Setup#version() */
            public Builder version(String v) {
                version = v;
                return this;
            }

            /** @see Setup#rowSync() */
            public Builder rowSync(RowSync v) {
                rowSync = v;
                return this;
            }

            /** The setup. */
            public Setup build() {
                return new Setup(folder, resuming, sequenceFile, dialect, seed, reconnect, fixture, progress,
                        interruption, compensation, sweepChecks, clock, version, rowSync);
            }
        }
    }

    /**
     * How the run ended.
     *
     * @param result the engine's result
     * @param checks the outcome of every check, in sequence order (empty when the run did not complete)
     * @param manifest the final manifest
     */
    public record Summary(RunResult result, List<CheckOutcome> checks, RunManifest manifest) {
        /** {@code pass} when completed and every evaluated check passed, {@code fail}, or {@code none} when not completed. */
        public String verdict() {
            return manifest.verdict();
        }
    }

    private final Plan plan;
    private final MeterLink link;
    private final Setup setup;
    private Station station;
    private BiasWatcher biasWatcher = BiasWatcher.NONE;

    /** A session running {@code plan} on {@code link} as {@code setup} says. */
    public RunSession(Plan plan, MeterLink link, Setup setup) {
        this.plan = plan;
        this.link = link;
        this.setup = setup;
    }

    /** Makes {@code w} hear of every DC bias change of the run, before it is sent (the guard process). */
    public void watchBias(BiasWatcher w) {
        this.biasWatcher = w;
    }

    /** Turns bias off now (for a shutdown hook); never throws. */
    public boolean biasOffNow() {
        Station s = station;
        if (s != null) {
            return s.biasOffNow();
        }
        try {
            link.meter().biasOff();
            return true;
        } catch (RuntimeException e) {
            return false;
        }
    }

    /**
     * Runs to the end, to a stop request or to a failure.
     *
     * @throws InvalidInputException when the plan or the folder's data cannot be used (bias is off)
     * @throws MeterException when the meter fails before the first point (bias is off)
     */
    public Summary run() {
        RunFolder folder = setup.folder();
        SafetyGuard guard = new SafetyGuard(plan.safety());
        guard.checkPlan(plan);
        List<PlannedPoint> points = plan.points();
        CheckEvaluator checks = new CheckEvaluator(plan.checks());
        BitSet done = new BitSet(points.size());
        PointsCsvReader.Recovery rec = PointsCsvReader.recover(folder.points(), row -> {
            if (row.point() < 0 || row.point() >= points.size()
                    || points.get(row.point()).stepIndex() != row.stepIndex()) {
                throw new InvalidInputException(folder.points() + ": point " + row.point()
                        + " does not belong to this sequence's plan");
            }
            done.set(row.point());
            checks.judge(row);
        });
        ProgressListener progress = setup.progress();
        if (rec.tornLineDropped()) {
            progress.note("resume: dropped an incomplete last line of " + folder.points()
                    + " (the point being written when the run stopped); it is measured again");
        }
        Consumer<String> log = progress::note;
        Interruption interruption = setup.interruption();
        Waiter waiter = link.timed() ? Waiter.sleeping(interruption) : Waiter.none(interruption);
        station = new Station(link, guard, setup.fixture(), waiter, setup.reconnect(), log);
        station.watchBias(biasWatcher);
        station.reportWorkTo(progress::work);
        RunManifest manifest = null;
        try (PointsCsvWriter writer = PointsCsvWriter.open(folder.points(), PointsCsvWriter.Sync.EACH_ROW)) {
            Long seed = setup.seed();
            station.start();
            SafetyGuard.checkCapabilities(plan, station.capabilities(), "dialect " + setup.dialect());
            SafetyGuard.checkCapabilities(plan, station.statedLimits(), "as the meter states its limits");
            manifest = manifest(seed);
            manifest.write(folder.manifest());
            ReadingCorrector corrector = ReadingCorrector.NONE;
            if (done.cardinality() < points.size()) {
                FixtureCompensation.Prepared comp = setup.compensation().prepare(station, setup.resuming(), log);
                corrector = comp.corrector();
                manifest = manifest.withCompensation(comp.info());
                manifest.write(folder.manifest());
            }
            RunResult result = new RunEngine(plan, station, corrector,
                    new PointUncertainty(link.accuracy().orElse(null), corrector), checks, progress, interruption,
                    setup.rowSync()).run(done, writer::append);
            List<CheckOutcome> outcomes = List.of();
            String verdict = "none";
            if (result.outcome() == RunResult.Outcome.COMPLETED) {
                writer.close();
                // the whole-sweep figures read the run again (analysis): only when a check needs them
                outcomes = checks.outcomes(checks.needsSweepFigures() ? setup.sweepChecks().figures(folder)
                        : org.zweep.runner.verdict.SweepFigures.NONE);
                verdict = CheckOutcome.verdictOf(outcomes);
            }
            manifest = manifest.finished(result.outcome().word(), setup.clock().instant().toString(),
                    new RunManifest.Counts(points.size(), done.cardinality()), verdict);
            if (outcomes.size() == manifest.checks().size()) {
                List<RunManifest.CheckInfo> judged = new ArrayList<>();
                for (int i = 0; i < outcomes.size(); i++) {
                    CheckOutcome o = outcomes.get(i);
                    judged.add(manifest.checks().get(i).judged(o.result(), o.expandedU(), o.probability()));
                }
                manifest = manifest.withChecks(judged);
            }
            manifest.write(folder.manifest());
            return new Summary(result, outcomes, manifest);
        } catch (RunInterruptedException e) {
            // a stop request before the engine ran (while identifying the meter or compensating)
            station.stopBias();
            if (manifest == null) {
                throw e;
            }
            manifest = manifest.finished("aborted", setup.clock().instant().toString(),
                    new RunManifest.Counts(points.size(), done.cardinality()), "none");
            manifest.write(folder.manifest());
            RunResult result = new RunResult(RunResult.Outcome.ABORTED, points.size(), done.cardinality(),
                    List.of("stopped: " + e.getMessage()));
            return new Summary(result, List.of(), manifest);
        } catch (RuntimeException e) {
            station.stopBias();
            if (manifest != null) {
                try {
                    manifest.finished("failed", setup.clock().instant().toString(),
                            new RunManifest.Counts(points.size(), done.cardinality()), "none")
                            .write(folder.manifest());
                } catch (RuntimeException second) {
                    // a full disk fails this too: the first failure is what the user must see
                    e.addSuppressed(second);
                }
            }
            throw e;
        } finally {
            interruption.markStopped();
        }
    }

    private RunManifest manifest(Long seed) {
        RunFolder folder = setup.folder();
        RunManifest.MeterInfo meter = new RunManifest.MeterInfo(link.address(), setup.dialect(),
                station.identity().toString());
        if (setup.resuming()) {
            RunManifest old = RunManifest.read(folder.manifest());
            return old.toBuilder().meter(meter).seed(seed).ended(null).outcome("running").verdict("none")
                    .id(old.id() != null ? old.id() : RunId.next(setup.clock().instant())).build();
        }
        RunManifest fresh = freshManifest(plan, folder, setup.sequenceFile(), meter, seed, setup.clock(),
                setup.version());
        if (java.nio.file.Files.isRegularFile(folder.manifest())) {
            // the launcher wrote the first manifest: keep its id, the part's identity and the index choice
            RunManifest first = RunManifest.read(folder.manifest());
            if (first.id() != null) {
                fresh = fresh.identified(first.id(), first.identity()).toBuilder().index(first.index()).build();
            }
        }
        return fresh;
    }

    /**
     * The manifest of a run starting now in {@code folder} (outcome {@code running}, nothing
     * measured), from the plan and the sequence copy already in the folder.
     *
     * @param meter the meter; its identity may be {@code null} before the meter was reached
     * @param seed the noise seed of the meter's bench, or {@code null}
     */
    public static RunManifest freshManifest(Plan plan, RunFolder folder, String sequenceFile,
            RunManifest.MeterInfo meter, Long seed, Clock clock, String version) {
        Part p = plan.part();
        List<RunManifest.StepInfo> steps = plan.steps().stream()
                .map(s -> new RunManifest.StepInfo(s.index(), s.name(), s.points().size(),
                        s.deratingDrops().isEmpty() ? null : s.deratingDrops())).toList();
        List<RunManifest.CheckInfo> checks = plan.checks().stream().map(RunManifest.CheckInfo::of).toList();
        return RunManifest.builder()
                .sequence(new RunManifest.SequenceInfo(plan.name(), sequenceFile, RunFolder.sha256(folder.sequenceCopy()),
                        RunFolder.SEQUENCE_COPY))
                .part(new RunManifest.PartInfo(p.kind().word(), p.name(), finite(p.nominal()),
                        p.nominalUnit(), finite(p.tolerancePercent()), finite(p.turnsRatio())))
                .steps(steps).checks(checks).meter(meter)
                .compensation(new RunManifest.CompensationInfo("none", List.of(), null))
                .software(new RunManifest.SoftwareInfo("zweep", version)).host(host()).seed(seed)
                .started(clock.instant().toString()).counts(new RunManifest.Counts(plan.points().size(), 0))
                .outcome("running").verdict("none").id(RunId.next(clock.instant())).build();
    }

    private static Double finite(double v) {
        return Double.isFinite(v) ? v : null;
    }

    private static String host() {
        try {
            return InetAddress.getLocalHost().getHostName();
        } catch (UnknownHostException e) {
            String h = System.getenv("HOSTNAME");
            return h == null ? "unknown" : h;
        }
    }
}
