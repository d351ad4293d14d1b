package org.zweep.runner.cli;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.SimAddress;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.verdict.CheckOutcome;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.compensation.CompensationWorkflow;
import org.zweep.runner.engine.ConsoleProgress;
import org.zweep.runner.engine.FixturePort;
import org.zweep.runner.safety.Interruption;
import org.zweep.runner.engine.ProgressListener;
import org.zweep.runner.engine.Prompter;
import org.zweep.runner.engine.ReconnectPolicy;
import org.zweep.runner.engine.RunInterruptedException;
import org.zweep.runner.engine.RunEstimate;
import org.zweep.runner.engine.RunResult;
import org.zweep.runner.engine.RunSession;
import org.zweep.runner.engine.ScpiMeterLink;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.text.Figures;
import org.zweep.runner.verdict.CheckText;
import org.zweep.runner.plan.MeterChoice;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.results.FolderLock;
import org.zweep.runner.results.RunFolder;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.safety.BiasGuard;
import org.zweep.runner.safety.BiasOffHook;
import org.zweep.runner.safety.BiasRamp;
import org.zweep.runner.safety.SafetyGuard;
import org.zweep.runner.sequence.SequenceLoader;
import org.zweep.runner.sim.MeterLinks;

/** What {@code zweep run} and {@code zweep demo} share: starting or resuming a run and summing it up. */
final class RunLauncher {
    /**
     * Options of one run; build with {@link #builder()}, which holds the defaults {@code run} and
     * {@code demo} share.
     *
     * @param meter an address overriding the sequence's, or {@code null}
     * @param dialect a dialect overriding the sequence's, or {@code null}
     * @param out the run folder to create, or {@code null} for a fresh one under {@code resultsDir}
     * @param resultsDir where fresh run folders go
     * @param fixture who changes what is in the fixture
     * @param seed the noise seed of a {@code sim:} meter's bench, or {@code null}
     * @param quiet no progress output
     * @param trace a traffic trace file, or {@code null}
     * @param timeout the slack of each reply's deadline beyond the meter's expected work
     * @param reconnectBudget the most time spent reconnecting after one failure
     */
    record Options(String meter, String dialect, Path out, Path resultsDir, FixtureOptions fixture, Long seed,
            boolean quiet, Path trace, Duration timeout, Duration reconnectBudget) {
        /** The reply slack of a run when {@code --timeout} is not given. */
        static final Duration DEFAULT_TIMEOUT = Duration.ofSeconds(10);
        /** The reconnect budget of a run when {@code --reconnect-budget} is not given. */
        static final Duration DEFAULT_RECONNECT_BUDGET = Duration.ofMillis(
                Math.round(ReconnectPolicy.DEFAULT.budgetS() * 1000));
        /** Where fresh run folders go. */
        static final Path DEFAULT_RESULTS = Path.of("results");

        /** A builder with the defaults: fresh folder under {@code results/}, default fixture, no trace. */
        static Builder builder() {
            return new Builder();
        }

        /** Builds {@link Options}; every field starts at its default. */
        static final class Builder {
            private String meter;
            private String dialect;
            private Path out;
            private Path resultsDir = DEFAULT_RESULTS;
            private FixtureOptions fixture = FixtureOptions.defaults();
            private Long seed;
            private boolean quiet;
            private Path trace;
            private Duration timeout = DEFAULT_TIMEOUT;
            private Duration reconnectBudget = DEFAULT_RECONNECT_BUDGET;

            Builder meter(String v) {
                meter = v;
                return this;
            }

            Builder dialect(String v) {
                dialect = v;
                return this;
            }

            Builder out(Path v) {
                out = v;
                return this;
            }

            Builder resultsDir(Path v) {
                resultsDir = v;
                return this;
            }

            Builder fixture(FixtureOptions v) {
                fixture = v;
                return this;
            }

            Builder seed(Long v) {
                seed = v;
                return this;
            }

            Builder quiet(boolean v) {
                quiet = v;
                return this;
            }

            Builder trace(Path v) {
                trace = v;
                return this;
            }

            Builder timeout(Duration v) {
                timeout = v;
                return this;
            }

            Builder reconnectBudget(Duration v) {
                reconnectBudget = v;
                return this;
            }

            Options build() {
                return new Options(meter, dialect, out, resultsDir, fixture, seed, quiet, trace, timeout,
                        reconnectBudget);
            }
        }
    }

    private final PrintWriter out;
    private final PrintWriter err;
    private Path finishedFolder;
    private java.net.InetSocketAddress live;

    private RunManifest.Identity identity;
    private org.zweep.runner.store.Database index;
    private boolean indexAsked;

    /**
     * Indexes each run this launcher ends (completed or failed) in {@code db}; never fails the run.
     * A resumed run that was started with {@code --no-index} (its {@code run.json} says so) is not
     * indexed unless {@code asked} ({@code --index} on the resume).
     */
    void indexInto(org.zweep.runner.store.Database db, boolean asked) {
        this.index = db;
        this.indexAsked = asked;
    }

    /** Records {@code id} (serial, lot, operator, station) in the runs this launcher starts. */
    void identity(RunManifest.Identity id) {
        this.identity = id;
    }

    /** Serves the live page of the runs this launcher starts on {@code bind}. */
    void live(java.net.InetSocketAddress bind) {
        this.live = bind;
    }

    RunLauncher(PrintWriter out, PrintWriter err) {
        this.out = out;
        this.err = err;
    }

    /** The folder of the run whose summary was printed last, or null. */
    Path finishedFolder() {
        return finishedFolder;
    }

    /** Starts a new run of {@code sequenceFile}; returns the exit code. */
    int start(Path sequenceFile, Options o) {
        o.fixture().check();
        Plan plan = SequenceLoader.loadForMeter(sequenceFile, o.dialect());
        plan = withMeter(plan, o.meter(), o.dialect());
        new SafetyGuard(plan.safety()).checkPlan(plan);
        MeterLinks.seeded(plan.meter().address(), o.seed()); // a seed for a meter that has none: refused now
        Clock clock = Clock.systemUTC();
        boolean existed = o.out() != null && Files.isDirectory(o.out());
        boolean resultsDirExisted = o.out() != null || Files.isDirectory(o.resultsDir());
        boolean hadLockFile = existed && Files.exists(o.out().resolve(FolderLock.FILE));
        FolderLock lock = o.out() != null ? RunFolder.lockAt(o.out(), clock.instant()) : null;
        RunFolder folder;
        try {
            folder = o.out() != null ? RunFolder.createAt(o.out(), sequenceFile)
                    : RunFolder.createUnder(o.resultsDir(), plan.name(), clock.instant(), ZoneId.systemDefault(),
                            sequenceFile);
        } catch (RuntimeException e) {
            if (lock != null) {
                lock.close();
                if (!existed) {
                    discardIfUnstarted(new RunFolder(o.out()), true);
                } else if (!hadLockFile) {
                    deleteQuietly(o.out().resolve(FolderLock.FILE));
                }
            }
            throw e;
        }
        try {
            if (lock == null) {
                lock = FolderLock.acquire(folder.dir(), clock.instant());
            }
            try {
                copyBench(plan, sequenceFile, folder);
                copyDialect(plan, sequenceFile, folder);
                // written before the meter is reached, so that a run stopped before its first point
                // (SIGTERM while connecting) leaves a folder that --resume completes
                RunManifest first = RunSession.freshManifest(plan, folder, sequenceFile.toAbsolutePath().toString(),
                        new RunManifest.MeterInfo(plan.meter().address(), plan.meter().dialect(), null), o.seed(),
                        clock, ZweepVersion.current());
                first.identified(first.id(), identity).toBuilder().index(index != null).build()
                        .write(folder.manifest());
            } catch (UncheckedIOException e) {
                // nothing measured yet: the folder is refused (a full disk, permissions)
                throw new InvalidInputException(e.getMessage(), e);
            }
            return execute(plan, folder, false, sequenceFile.toAbsolutePath().toString(), o.seed(), o);
        } catch (RuntimeException e) {
            if (!(e instanceof RunInterruptedException)) {
                discardIfUnstarted(folder, !existed); // a stop request leaves a folder that --resume completes
                if (!resultsDirExisted) {
                    deleteQuietly(o.resultsDir()); // only when empty: the refused run made it
                }
            }
            throw e;
        } finally {
            if (lock != null) {
                lock.close();
            }
        }
    }

    private static void deleteQuietly(Path p) {
        try {
            Files.deleteIfExists(p);
        } catch (IOException e) {
            // best effort: the refusal itself is what the user must see
        }
    }

    /**
     * Removes what {@link #start} put into a run folder when the run was refused before its first
     * point (no measured row, no compensation data, and not stopped by Ctrl-C or a signal, which
     * leaves a resumable folder): a refused run leaves nothing, and the same {@code --out} can be
     * used again.
     */
    static void discardIfUnstarted(RunFolder folder, boolean removeDir) {
        Path dir = folder.dir();
        if (!Files.isDirectory(dir) || Files.exists(folder.compensation())) {
            return;
        }
        try {
            if (Files.exists(folder.manifest()) && "aborted".equals(RunManifest.read(folder.manifest()).outcome())) {
                return;
            }
        } catch (RuntimeException e) {
            return; // a manifest that cannot be read: keep everything
        }
        try {
            if (Files.exists(folder.points()) && hasRows(folder.points())) {
                return; // rows: keep them, whatever they are
            }
            try (var files = Files.walk(dir)) {
                for (Path p : files.sorted(Comparator.reverseOrder()).toList()) {
                    if (!p.equals(dir) || removeDir) {
                        Files.deleteIfExists(p);
                    }
                }
            }
        } catch (IOException | UncheckedIOException e) {
            // best effort: the refusal itself is what the user must see
        }
    }

    /** Whether {@code points} has a line after its header (read no further than that). */
    private static boolean hasRows(Path points) throws IOException {
        try (BufferedReader r = Files.newBufferedReader(points, StandardCharsets.UTF_8)) {
            return r.readLine() != null && r.readLine() != null;
        }
    }

    /** Resumes the run in {@code dir}; returns the exit code. */
    int resume(Path dir, Options o) {
        o.fixture().check();
        RunFolder folder = RunFolder.existing(dir);
        try (FolderLock lock = FolderLock.acquire(dir, Clock.systemUTC().instant())) {
            return resumeLocked(folder, o);
        }
    }

    private int resumeLocked(RunFolder folder, Options o) {
        Path dir = folder.dir();
        RunManifest m = RunManifest.read(folder.manifest()).requireResumable(folder.manifest());
        if ("completed".equals(m.outcome())) {
            out.println(dir + ": the run is already complete (" + m.counts().measured() + " points); nothing to do");
            return CheckOutcome.failed(m.verdict()) ? ExitCode.CHECK_FAILED : ExitCode.OK;
        }
        String sha = RunFolder.sha256(folder.sequenceCopy());
        if (!m.sequence().sha256().equalsIgnoreCase(sha)) {
            throw new InvalidInputException(folder.sequenceCopy() + ": changed since the run started (SHA-256 "
                    + sha + ", run.json records " + m.sequence().sha256() + "); a resumed run must measure the plan"
                    + " it started with: restore the copy, or start a new run");
        }
        Plan plan;
        try {
            plan = SequenceLoader.load(folder.sequenceCopy());
        } catch (InvalidInputException e) {
            // a file the copy refers to is not in the folder: resolve against the original's place
            try {
                plan = SequenceLoader.parse(Files.readString(folder.sequenceCopy(), StandardCharsets.UTF_8),
                        Path.of(m.sequence().file()));
            } catch (IOException io) {
                throw new UncheckedIOException(io);
            }
        }
        String address = o.meter() != null ? o.meter() : m.meter().address();
        String dialect = o.dialect() != null ? o.dialect() : m.meter().dialect();
        plan = withMeter(plan, address, dialect);
        new SafetyGuard(plan.safety()).checkPlan(plan);
        out.println("resuming run folder: " + folder.dir());
        Long seed = o.seed() != null ? o.seed() : Address.parse(address) instanceof SimAddress ? m.seed() : null;
        MeterLinks.seeded(plan.meter().address(), seed);
        return execute(plan, folder, true, m.sequence().file(), seed, o);
    }

    private int execute(Plan plan, RunFolder folder, boolean resuming, String sequenceFile, Long seed, Options o) {
        ScpiSettings.Builder sb = ScpiSettings.builder().readTimeout(o.timeout());
        if (o.trace() != null) {
            sb.tracePath(o.trace());
        }
        Interruption interruption = new Interruption();
        boolean terminal = System.console() != null;
        TerminalWidth width = terminal && !o.quiet() ? TerminalWidth.open() : null;
        ProgressListener console = o.quiet() ? ProgressListener.QUIET
                : new ConsoleProgress(out, terminal, System::nanoTime, 5.0, RunEstimate.of(plan),
                        width == null ? () -> 0 : width::columns);
        org.zweep.runner.live.EventLog events = org.zweep.runner.live.EventLog.open(folder.dir(), Clock.systemUTC());
        ProgressListener shown = new org.zweep.runner.live.EventRecorder(events, console,
                Analysis.mainParameter(plan.part().kind()), plan.name());
        ProgressListener progress = resuming ? shown : announcingFolder(folder, shown);
        org.zweep.runner.live.LiveServer server = null;
        boolean ended = false;
        Long noiseSeed = seed != null ? seed : MeterLinks.seedOf(plan.meter().address());
        try (ScpiMeterLink link = MeterLinks.open(MeterLinks.seeded(plan.meter().address(), seed),
                plan.meter().dialect(), sb.build())) {
            if (live != null) {
                server = org.zweep.runner.live.LiveServer.start(folder.dir(), live);
                out.println("live view: " + server.url());
                out.flush();
            }
            Prompter livePrompter = live == null ? null : new org.zweep.runner.live.LivePrompter(events, out,
                    terminal ? new BufferedReader(new InputStreamReader(System.in, StandardCharsets.UTF_8)) : null,
                    interruption);
            FixturePort fixture = o.fixture().port(link, livePrompter, out, progress::note);
            Clock clock = Clock.systemUTC();
            RunSession session = new RunSession(plan, link, RunSession.Setup.builder(folder).resuming(resuming)
                    .sequenceFile(sequenceFile).dialect(plan.meter().dialect()).seed(noiseSeed)
                    .reconnect(ReconnectPolicy.DEFAULT.withBudgetS(o.reconnectBudget().toMillis() / 1000.0))
                    .fixture(fixture).progress(progress).interruption(interruption)
                    .compensation((station, res, log) -> CompensationWorkflow.prepare(plan, station, folder, res, clock,
                            log))
                    .sweepChecks(f -> Analysis.sweepFigures(RunData.read(f.dir()))).clock(clock)
                    .version(ZweepVersion.current()).build());
            RunSession.Summary s;
            BiasGuard guard = appliesBias(plan) ? startGuard(plan.meter().address(), folder) : null;
            if (guard != null) {
                session.watchBias(guard);
            }
            BiasOffHook hook = BiasOffHook.install(interruption, session::biasOffNow, err, shutdownGraceMillis(plan));
            try (hook) {
                s = session.run();
            } finally {
                if (guard != null) {
                    guard.close();
                }
            }
            printSummary(folder, s, stepUnits(plan));
            recordEnd(events, s);
            ended = true;
            if (s.result().outcome() != RunResult.Outcome.ABORTED) {
                indexQuietly(folder);
            }
            return exitCode(s);
        } finally {
            if (!ended) {
                events.write("finished", n -> {
                    n.put("outcome", "failed");
                    n.put("verdict", "none");
                });
            }
            console.finished();
            if (width != null) {
                width.close();
            }
            if (server != null) {
                lingerThenClose(server);
            }
            events.close();
        }
    }

    /**
     * Adds the ended run to the results index. A failure only warns: the run folder holds
     * everything, and {@code zweep index} adds it later.
     */
    private void indexQuietly(RunFolder folder) {
        if (index == null) {
            return;
        }
        if (!indexAsked && Boolean.FALSE.equals(RunManifest.read(folder.manifest()).index())) {
            out.println("not indexed: the run was started with --no-index ('zweep index " + folder.dir()
                    + "' adds it)");
            out.flush();
            return;
        }
        try (org.zweep.runner.store.ResultsStore st = org.zweep.runner.store.ResultsStore.open(index)) {
            st.index(folder.dir());
            out.println("indexed in: " + index.describe());
        } catch (RuntimeException | LinkageError e) {
            err.println("zweep: WARNING: the run was not indexed (" + String.valueOf(e.getMessage()).replace('\n', ' ')
                    + "); the run folder keeps everything: 'zweep index " + folder.dir() + "' adds it later");
        }
        out.flush();
        err.flush();
    }

    /** Whether any point of {@code plan} has DC bias on: a plan without bias needs no guard process. */
    static boolean appliesBias(Plan plan) {
        return plan.points().stream().anyMatch(p -> p.setting().bias().on());
    }

    /**
     * Starts the guard process that ramps bias down should this process die (not for a {@code sim:}
     * meter in this process, which dies with it); {@code null}, after a note, when it cannot be started.
     */
    private BiasGuard startGuard(String address, RunFolder folder) {
        if (Address.parse(address) instanceof SimAddress s && !s.bench().startsWith("tcp://")) {
            return null;
        }
        try {
            return BiasGuard.start(address, folder.dir());
        } catch (UncheckedIOException e) {
            err.println("zweep: WARNING: " + e.getMessage() + "; the run goes on without it");
            return null;
        }
    }

    /**
     * How long JVM shutdown (SIGTERM) waits for the run to stop by itself: the longest bias ramp
     * down the plan can need, plus 10 s for the point in progress and writing.
     */
    static long shutdownGraceMillis(Plan plan) {
        double longest = 0.0;
        for (var step : plan.steps()) {
            for (var p : step.points()) {
                var b = p.setting().bias();
                if (b.on()) {
                    longest = Math.max(longest, BiasRamp.durationS(b.value(), 0.0, step.bias().rampPerS()));
                }
            }
        }
        return (long) Math.ceil((longest + 10.0) * 1000);
    }

    /**
     * {@code shown}, printing {@code run folder: DIR} when the first point is about to be measured:
     * a run refused before that (safety, the meter's limits, compensation, no meter) prints no
     * such line and leaves no folder.
     */
    private ProgressListener announcingFolder(RunFolder folder, ProgressListener shown) {
        return new ProgressListener() {
            @Override
            public void started(int total, int done) {
                out.println("run folder: " + folder.dir());
                out.flush();
                shown.started(total, done);
            }

            @Override
            public void measured(org.zweep.runner.results.PointRow row, int done, int total) {
                shown.measured(row, done, total);
            }

            @Override
            public void note(String line) {
                shown.note(line);
            }

            @Override
            public void finished() {
                shown.finished();
            }
        };
    }

    /** The checks and the end of the run, for the live view. */
    private static void recordEnd(org.zweep.runner.live.EventLog events, RunSession.Summary s) {
        for (CheckOutcome c : s.checks()) {
            events.write("check", n -> {
                n.put("name", c.limit().name());
                n.put("parameter", c.limit().parameter());
                n.put("label", CheckText.label(c));
                n.put("value", c.lastValue());
                n.put("value_text", CheckText.value(c));
                n.put("result", c.result());
            });
        }
        RunResult r = s.result();
        events.write("finished", n -> {
            n.put("outcome", r.outcome().word());
            n.put("verdict", s.verdict());
            n.put("measured", r.measured());
            n.put("total", r.planned());
        });
    }

    /** Gives connected pages a moment to receive the last events, then stops serving. */
    private static void lingerThenClose(org.zweep.runner.live.LiveServer server) {
        try {
            Thread.sleep(1500);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        server.close();
    }

    static int exitCode(RunSession.Summary s) {
        return switch (s.result().outcome()) {
            case COMPLETED -> CheckOutcome.failed(s.verdict()) ? ExitCode.CHECK_FAILED : ExitCode.OK;
            case ABORTED -> BiasOffHook.EXIT_INTERRUPTED;
            case FAILED -> ExitCode.METER;
        };
    }

    void printSummary(RunFolder folder, RunSession.Summary s,
            java.util.function.Function<String, CheckText.StepUnits> units) {
        RunResult r = s.result();
        finishedFolder = folder.dir();
        out.printf(Locale.ROOT, "results: %s%n", folder.dir());
        out.printf(Locale.ROOT, "points: %d of %d measured (%s)%n", r.measured(), r.planned(), r.outcome().word());
        for (String p : r.problems()) {
            err.println("zweep: " + p);
        }
        if (r.outcome() != RunResult.Outcome.COMPLETED) {
            err.println("zweep: the run folder is resumable: zweep run --resume " + folder.dir());
        }
        for (CheckOutcome c : s.checks()) {
            out.println(CheckText.line(c, units.apply(c.step())));
        }
        out.println("verdict: " + s.verdict());
        out.flush();
    }

    /** The units of each step's bias and drive level in {@code plan}, for the check lines. */
    static java.util.function.Function<String, CheckText.StepUnits> stepUnits(Plan plan) {
        java.util.Map<String, CheckText.StepUnits> byStep = new java.util.HashMap<>();
        for (org.zweep.runner.plan.PlannedStep st : plan.steps()) {
            if (!st.points().isEmpty()) {
                var setting = st.points().get(0).setting();
                byStep.put(st.name(), new CheckText.StepUnits(Figures.unit(setting.bias().mode().unit()),
                        Figures.unit(setting.drive().mode().unit())));
            }
        }
        return step -> byStep.getOrDefault(step, CheckText.StepUnits.UNKNOWN);
    }

    /** {@code plan} with its meter address and dialect replaced where {@code meter} or {@code dialect} is not null. */
    private static Plan withMeter(Plan plan, String meter, String dialect) {
        if (meter == null) {
            plan.meter().requireUsable(); // the sequence's own meter: refused here when its bench is missing
        }
        if (meter == null && dialect == null) {
            return plan;
        }
        MeterChoice m = meter != null ? new MeterChoice(meter, dialect != null ? dialect : plan.meter().dialect())
                : plan.meter().withDialect(dialect);
        Address.parse(m.address());
        Dialect.load(m.dialect());
        return plan.toBuilder().meter(m).build();
    }

    /** Copies a dialect file that lies under the sequence's folder to the same place in the run folder. */
    private static void copyDialect(Plan plan, Path sequenceFile, RunFolder folder) {
        if (Dialect.isPath(plan.meter().dialect())) {
            copyBeside(Path.of(plan.meter().dialect()), sequenceFile, folder, "dialect");
        }
    }

    private static void copyBeside(Path source, Path sequenceFile, RunFolder folder, String what) {
        Path file = source.toAbsolutePath().normalize();
        Path base = sequenceFile.toAbsolutePath().getParent();
        if (base == null || !file.startsWith(base) || !Files.isRegularFile(file)) {
            return;
        }
        Path target = folder.dir().resolve(base.relativize(file));
        if (Files.exists(target)) {
            return;
        }
        try {
            Files.createDirectories(target.getParent());
            Files.copy(file, target);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot copy the " + what + " file into " + folder.dir() + ": "
                    + e.getMessage(), e);
        }
    }

    /** Copies a sim: bench file that lies under the sequence's folder to the same place in the run folder. */
    private static void copyBench(Plan plan, Path sequenceFile, RunFolder folder) {
        Address a = Address.parse(plan.meter().address());
        if (!(a instanceof SimAddress sim)) {
            return;
        }
        String bench = sim.bench();
        int q = bench.indexOf('?');
        copyBeside(Path.of(q >= 0 ? bench.substring(0, q) : bench), sequenceFile, folder, "bench");
    }
}
