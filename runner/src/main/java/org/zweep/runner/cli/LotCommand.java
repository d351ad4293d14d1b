package org.zweep.runner.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.ZoneId;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import java.util.function.IntFunction;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.FixtureState;
import org.zweep.runner.engine.FixturePort;
import org.zweep.runner.lot.LotManifest;
import org.zweep.runner.lot.LotReport;
import org.zweep.runner.lot.LotTable;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.results.RunFolder;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.safety.BiasOffHook;
import org.zweep.runner.sequence.SequenceLoader;
import org.zweep.runner.sim.MeterLinks;
import org.zweep.runner.store.StationFile;
import org.zweep.runner.verdict.CheckOutcome;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep lot SEQUENCE --lot L (--count N | --serials FILE | --scan)}: part after part, one run folder each. */
@Command(
        name = "lot",
        mixinStandardHelpOptions = true,
        defaultValueProvider = OptionDefaults.class,
        description = {
            "Measures the parts of a lot one after another with one sequence. Before each part zweep asks for it"
                + " (through the fixture channel; with --scan its serial is typed or scanned), runs the sequence into"
                + " a run folder NNN-SERIAL inside the lot folder, and shows a large PASS or FAIL line and the lot's"
                + " running yield. Compensation follows the sequence's reuse rule: with 'reuse:' the first part's is"
                + " reused by the next parts while it is young enough.",
            "At the end: lot.csv (one row per part: serial, verdict, each check's value and result, fitted values),"
                + " lot.html (yield, a histogram per checked parameter with its limits, failing parts first); each"
                + " part is indexed in the results database as 'zweep run' does. Ctrl-C stops after the point in"
                + " progress; 'zweep lot --resume DIR' finishes the part in progress, then goes on with the next."
        },
        footer = "%nExit codes:%n"
            + "  0  every part passed%n"
            + "  1  at least one part did not pass (fail, conditional fail or conditional pass)%n"
            + "  2  usage or validation error%n"
            + "  3  meter or connection failure (the lot stops; --resume goes on)%n"
            + "  4  internal error (a bug in zweep: please report it)%n"
            + "  130 stopped by Ctrl-C, a signal or at the fixture (resumable with --resume)%n")
public final class LotCommand implements Callable<Integer> {
    private static final DateTimeFormatter STAMP = DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss");

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", arity = "0..1", paramLabel = "SEQUENCE", description = "the sequence file (YAML)")
    Path file;

    @Option(names = "--lot", paramLabel = "LOT", description = "the lot's name (recorded in every part's run.json)")
    String lot;

    static final class Source {
        @Option(names = "--count", paramLabel = "N", description = "N parts, serials LOT-001, LOT-002, …")
        Integer count;

        @Option(names = "--serials", paramLabel = "FILE", description = "the serials, one a line (# comments)")
        Path serials;

        @Option(names = "--scan", description = "ask for each part's serial (typed or scanned); an empty line or"
                + " 'end' ends the lot")
        boolean scan;
    }

    @ArgGroup(exclusive = true, multiplicity = "0..1")
    Source source;

    @Option(names = "--resume", paramLabel = "DIR", description = "finish the part in progress in lot folder DIR, then"
            + " go on with the next")
    Path resume;

    @Option(names = "--out", paramLabel = "DIR", description = "the lot folder to create (default: results/LOT-yyyyMMdd-HHmmss)")
    Path out;

    @Option(names = "--meter", paramLabel = "ADDRESS", description = "use this meter instead of the sequence's (a sim:"
            + " bench's 'parts' section gives each serial its own part)")
    String meter;

    @picocli.CommandLine.Mixin
    DialectOption dialect;

    @Option(names = "--seed", paramLabel = "N", description = "a sim: meter's noise seed for the first part; part k"
            + " gets N + k − 1 (default: the bench's)")
    Long seed;

    @Option(names = "--operator", paramLabel = "NAME", description = "who measures (recorded in run.json)")
    String operator;

    @Option(names = "--station", paramLabel = "NAME", description = "this test station's name (default: the station file's)")
    String station;

    @picocli.CommandLine.Mixin
    FixtureOptions fixture;

    @picocli.CommandLine.Mixin
    StoreOptions store;

    @Option(names = "--no-index", description = "do not add the parts to the results index (recorded in lot.json:"
            + " a resume keeps to it)")
    boolean noIndex;

    @Option(names = "--index", description = "with --resume: add the parts to the results index even when the lot"
            + " was started with --no-index")
    boolean index;

    @picocli.CommandLine.Mixin
    TimeoutOption timeout;

    @Option(names = "--reconnect-budget", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "give up reconnecting after this much waiting, e.g. 30s, 2min or a number of seconds"
                    + " (default: ${DEFAULT-VALUE})")
    java.time.Duration reconnectBudget;

    @Option(names = "--quiet", description = "no progress line during each part")
    boolean quiet;

    private PrintWriter stdout;

    @Override
    public Integer call() {
        stdout = spec.commandLine().getOut();
        fixture.check();
        Path dir;
        LotManifest m;
        if (resume != null) {
            if (file != null || lot != null || source != null || out != null || meter != null || dialect.orNull() != null
                    || seed != null || operator != null || station != null) {
                throw new InvalidInputException("--resume takes only the lot folder (and the fixture, index and"
                        + " timeout options): the lot goes on as it started");
            }
            dir = resume;
            m = LotManifest.read(dir);
            String sha = RunFolder.sha256(Path.of(m.sequenceFile()));
            if (!sha.equalsIgnoreCase(m.sequenceSha256())) {
                throw new InvalidInputException(m.sequenceFile() + ": changed since the lot started (SHA-256 " + sha
                        + ", lot.json records " + m.sequenceSha256() + "); every part of a lot runs the same plan");
            }
            stdout.println("resuming lot folder: " + dir);
        } else {
            m = start();
            dir = out != null ? out : Path.of("results", safe(m.lot()) + "-"
                    + STAMP.format(java.time.ZonedDateTime.now(ZoneId.systemDefault())));
            create(dir);
            m.write(dir);
            stdout.println("lot folder: " + dir);
        }
        stdout.flush();
        return measure(dir, m);
    }

    /** Checks the options of a new lot and makes its manifest (nothing is written yet). */
    private LotManifest start() {
        if (file == null) {
            throw new InvalidInputException("give a SEQUENCE file (or --resume DIR)");
        }
        if (lot == null) {
            throw new InvalidInputException("--lot LOT is needed: the lot's name");
        }
        String lotName = RunCommand.text(lot, "--lot");
        if (source == null) {
            throw new InvalidInputException("say which parts: --count N, --serials FILE or --scan");
        }
        Plan plan = SequenceLoader.loadForMeter(file, dialect.orNull());
        String address = meter != null ? meter : plan.meter().requireUsable().address();
        MeterLinks.seeded(address, seed); // a seed for a meter that has none: refused now
        Long base = seed != null ? seed : MeterLinks.seedOf(address);
        String kind;
        Integer count = null;
        List<String> serials = null;
        if (source.count != null) {
            if (source.count < 1 || source.count > 9999) {
                throw new InvalidInputException("--count " + source.count + ": give 1 to 9999 parts");
            }
            kind = "count";
            count = source.count;
        } else if (source.serials != null) {
            kind = "serials";
            serials = readSerials(source.serials);
        } else {
            kind = "scan";
            fixture.serialReader(stdout); // refused now when nobody can scan
        }
        StationFile sf = StationFile.load();
        return new LotManifest(LotManifest.FORMAT, lotName, file.toAbsolutePath().normalize().toString(),
                RunFolder.sha256(file), meter, dialect.orNull(), base, kind, count, serials,
                operator == null ? null : RunCommand.text(operator, "--operator"),
                station != null ? RunCommand.text(station, "--station") : sf.station(),
                Clock.systemUTC().instant().toString(), !noIndex);
    }

    /** The serials of a file: one a line, blank lines and {@code #} comments skipped, no repeats. */
    static List<String> readSerials(Path f) {
        List<String> lines;
        try {
            lines = Files.readAllLines(f, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new InvalidInputException("--serials " + f + ": cannot read: " + e.getMessage());
        }
        List<String> serials = new ArrayList<>();
        Map<String, Integer> seen = new HashMap<>();
        for (int i = 0; i < lines.size(); i++) {
            String s = lines.get(i).strip();
            if (s.isEmpty() || s.startsWith("#")) {
                continue;
            }
            if (s.chars().anyMatch(Character::isISOControl)) {
                throw new InvalidInputException(f + ":" + (i + 1) + ":1: a serial must be text on one line");
            }
            Integer before = seen.put(s, i + 1);
            if (before != null) {
                throw new InvalidInputException(f + ":" + (i + 1) + ":1: serial '" + s + "' is given twice (first on line "
                        + before + ")");
            }
            serials.add(s);
        }
        if (serials.isEmpty()) {
            throw new InvalidInputException(f + ": no serial in the file");
        }
        return serials;
    }

    private static void create(Path dir) {
        try {
            if (Files.isDirectory(dir)) {
                try (var s = Files.list(dir)) {
                    if (s.findAny().isPresent()) {
                        throw new InvalidInputException(dir + ": the folder exists and is not empty; choose another"
                                + " --out, or continue a lot with --resume " + dir);
                    }
                }
            }
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new InvalidInputException("cannot create the lot folder " + dir + ": " + e.getMessage());
        }
    }

    /** A part's run options: these command options, the rest at the run defaults. */
    private RunLauncher.Options.Builder options() {
        return RunLauncher.Options.builder().fixture(fixture).quiet(quiet).timeout(timeout.get())
                .reconnectBudget(reconnectBudget);
    }

    private static String safe(String s) {
        return s.replaceAll("[^A-Za-z0-9._-]", "_");
    }

    /** Resumes what is unfinished, measures the remaining parts, then writes lot.csv and lot.html. */
    private int measure(Path dir, LotManifest m) {
        RunLauncher.Options base = options().dialect(m.dialect()).resultsDir(dir).build();
        if (noIndex && index) {
            throw new InvalidInputException("give --index or --no-index, not both");
        }
        boolean indexed = !noIndex && (index || !Boolean.FALSE.equals(m.index()));
        if (!indexed && !noIndex) {
            // a resume that keeps the choice the lot was started with says so, as a resumed run does
            stdout.println("not indexed: the lot was started with --no-index ('zweep index " + dir + "' adds its"
                    + " parts)");
            stdout.flush();
        }
        org.zweep.runner.store.Database db = indexed ? store.database() : null;
        for (Path part : LotTable.partFolders(dir)) {
            RunManifest rm = RunManifest.read(part.resolve(RunManifest.FILE));
            if ("completed".equals(rm.outcome())) {
                continue;
            }
            String serial = rm.identityOrNone().serial();
            stdout.println("part " + LotTable.index(part) + " (" + serial + "): finishing the run in " + part);
            stdout.flush();
            RunLauncher l = launcher(db);
            int code = l.resume(part, base);
            Integer stop = afterPart(dir, m, LotTable.index(part), serial, code);
            if (stop != null) {
                return stop;
            }
        }
        IntFunction<String> scan = "scan".equals(m.source()) ? fixture.serialReader(stdout) : null;
        FixturePort ask = fixture.partPort(stdout);
        java.util.Set<String> done = new java.util.HashSet<>();
        List<Path> parts = LotTable.partFolders(dir);
        for (Path p : parts) {
            done.add(RunManifest.read(p.resolve(RunManifest.FILE)).identityOrNone().serial());
        }
        int k = parts.isEmpty() ? 1 : LotTable.index(parts.get(parts.size() - 1)) + 1;
        while (true) {
            String serial = next(m, k, scan, done);
            if (serial == null) {
                break;
            }
            String of = m.count() != null ? " of " + m.count() : m.serials() != null ? " of " + m.serials().size() : "";
            stdout.println("part " + k + of + ": " + serial);
            stdout.flush();
            if (scan == null) {
                ask.hold(FixtureState.PART, "part " + k + of + ": " + serial + ": put it in the fixture");
            }
            Path partDir = dir.resolve(LotTable.folderName(k, serial));
            Plan plan = SequenceLoader.loadForMeter(Path.of(m.sequenceFile()), m.dialect());
            String address = MeterLinks.forPart(m.meter() != null ? m.meter()
                    : plan.meter().requireUsable().address(), serial);
            RunLauncher.Options o = options().meter(address).dialect(m.dialect()).out(partDir).resultsDir(dir)
                    .seed(m.seed() == null ? null : m.seed() + k - 1).build();
            RunLauncher l = launcher(db);
            l.identity(new RunManifest.Identity(serial, m.lot(), m.operator(), m.station()));
            int code = l.start(Path.of(m.sequenceFile()), o);
            done.add(serial);
            Integer stop = afterPart(dir, m, k, serial, code);
            if (stop != null) {
                return stop;
            }
            k++;
        }
        return finish(dir);
    }

    private RunLauncher launcher(org.zweep.runner.store.Database db) {
        RunLauncher l = new RunLauncher(stdout, spec.commandLine().getErr());
        if (db != null) {
            l.indexInto(db, index);
        }
        return l;
    }

    /** The serial of part {@code k}, or null when the lot is complete. */
    private String next(LotManifest m, int k, IntFunction<String> scan, java.util.Set<String> done) {
        switch (m.source()) {
            case "count":
                return k <= m.count() ? m.lot() + "-" + String.format(Locale.ROOT, "%03d", k) : null;
            case "serials":
                return k <= m.serials().size() ? m.serials().get(k - 1) : null;
            default:
                while (true) {
                    String s = scan.apply(k);
                    if (s == null) {
                        return null;
                    }
                    if (s.chars().anyMatch(Character::isISOControl)) {
                        stdout.println("zweep: a serial is text on one line; scan again");
                    } else if (done.contains(s)) {
                        stdout.println("zweep: " + s + " is already measured in this lot; scan the next part");
                    } else {
                        return s;
                    }
                    stdout.flush();
                }
        }
    }

    /** The large line after a part and the running yield; an exit code when the lot must stop here. */
    private Integer afterPart(Path dir, LotManifest m, int k, String serial, int code) {
        if (code == BiasOffHook.EXIT_INTERRUPTED || code == ExitCode.METER || code == ExitCode.INTERNAL) {
            spec.commandLine().getErr().println("zweep: the lot stopped at part " + k + " (" + serial + "); go on with:"
                    + " zweep lot --resume " + dir);
            spec.commandLine().getErr().flush();
            return code;
        }
        String word = code == ExitCode.OK ? "PASS" : "FAIL";
        String bar = "#".repeat(12);
        stdout.println();
        stdout.println(bar + "  " + word + "  " + bar + "   part " + k + ": " + serial);
        long passed = 0;
        long completed = 0;
        for (Path p : LotTable.partFolders(dir)) {
            RunManifest rm = RunManifest.read(p.resolve(RunManifest.FILE));
            if ("completed".equals(rm.outcome())) {
                completed++;
                passed += CheckOutcome.failed(rm.verdict()) ? 0 : 1;
            }
        }
        stdout.printf(Locale.ROOT, "lot %s: %d passed, %d failed, yield %.1f %%%n%n", m.lot(), passed,
                completed - passed, completed == 0 ? 0.0 : 100.0 * passed / completed);
        stdout.flush();
        return null;
    }

    /** lot.csv, lot.html and the summary; 1 when a part did not pass. */
    private int finish(Path dir) {
        LotTable t = LotTable.read(dir);
        Path csv = t.writeCsv(dir);
        Path html = LotReport.write(t, dir);
        stdout.printf(Locale.ROOT, "lot %s complete: %d parts, %d passed, %d failed, yield %s%n", t.lot(),
                t.parts().size(), t.passed(), t.failed(), Double.isFinite(t.yield())
                        ? String.format(Locale.ROOT, "%.1f %%", 100 * t.yield()) : "—");
        for (LotTable.Part p : t.parts()) {
            if (p.failed()) {
                stdout.println("failed: part " + p.index() + " " + p.serial() + " (" + p.verdict() + ")");
            }
        }
        stdout.println("lot table: " + csv);
        stdout.println("lot report: " + html);
        stdout.flush();
        return t.failed() > 0 ? ExitCode.CHECK_FAILED : ExitCode.OK;
    }
}
