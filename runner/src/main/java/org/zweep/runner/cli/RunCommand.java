package org.zweep.runner.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.zweep.driver.InvalidInputException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep run FILE} and {@code zweep run --resume DIR}: runs a sequence into a run folder. */
@Command(
        name = "run",
        mixinStandardHelpOptions = true,
        description = {
            "Runs a sequence into a run folder (points.csv, run.json, sequence.yaml), or resumes one.",
            "Every point is written and synced as it is measured. Ctrl-C stops after the point in "
                + "progress, turns DC bias off and leaves a resumable folder; a second Ctrl-C stops at once "
                + "(bias off first). A lost link is reconnected with back-off and the point measured again."
        },
        footer = ExitCode.HELP_LIST + "  130 stopped by Ctrl-C, a signal or at the fixture (resumable)%n")
public final class RunCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", arity = "0..1", paramLabel = "FILE", description = "the sequence file (YAML)")
    Path file;

    @Option(names = "--meter", paramLabel = "ADDRESS", description = "use this meter instead of the sequence's "
            + "(tcp://HOST[:PORT], serial:DEVICE, sim:BENCH_FILE[?timing=real|none][&seed=N], sim:tcp://HOST:PORT)")
    String meter;

    @Option(names = "--dialect", paramLabel = "DIALECT", description = "the meter's dialect (name or file) instead of the sequence's")
    String dialect;

    @Option(names = "--out", paramLabel = "DIR", description = "the run folder to create (default: results/NAME-yyyyMMdd-HHmmss)")
    Path out;

    @Option(names = "--resume", paramLabel = "DIR", description = "continue the run in this folder (needs only the folder)")
    Path resume;

    @picocli.CommandLine.Mixin
    FixtureOptions fixture;

    @Option(names = "--seed", paramLabel = "N", description = "the noise seed of a sim: meter's bench, as sim:...?seed=N (default: the bench's; on resume: the run's)")
    Long seed;

    @Option(names = "--quiet", description = "no progress output")
    boolean quiet;

    @Option(names = "--trace", paramLabel = "FILE", description = "append the SCPI traffic to FILE")
    Path trace;

    @Option(names = "--timeout", paramLabel = "SECONDS", defaultValue = "10",
            description = "the longest wait for a reply (default: ${DEFAULT-VALUE} s)")
    double timeoutS;

    @Option(names = "--reconnect-budget", paramLabel = "SECONDS", defaultValue = "60",
            description = "give up reconnecting after this many seconds of waiting (default: ${DEFAULT-VALUE} s)")
    double reconnectBudgetS;

    @Option(names = "--live", arity = "0..1", fallbackValue = "0", paramLabel = "PORT",
            description = "serve the live page of the run (plots as points arrive, progress, prompts to answer) on"
                    + " PORT (default: a free one), on the loopback address unless --live-bind says otherwise")
    Integer live;

    @Option(names = "--live-bind", paramLabel = "HOST", defaultValue = "127.0.0.1",
            description = "the address the live page is served on (default: ${DEFAULT-VALUE})")
    String liveBind;

    @Option(names = "--serial", paramLabel = "SERIAL", description = "the part's serial number (recorded in run.json)")
    String serial;

    @Option(names = "--lot", paramLabel = "LOT", description = "the lot the part belongs to (recorded in run.json)")
    String lot;

    @Option(names = "--operator", paramLabel = "NAME", description = "who measures (recorded in run.json)")
    String operator;

    @Option(names = "--station", paramLabel = "NAME",
            description = "this test station's name (default: station: in the station file, ~/.zweep/station.yaml)")
    String station;

    @picocli.CommandLine.Mixin
    StoreOptions store;

    @Option(names = "--no-index", description = "do not add the run to the results index at its end")
    boolean noIndex;

    @Override
    public Integer call() {
        if ((file == null) == (resume == null)) {
            throw new InvalidInputException("give either a sequence FILE or --resume DIR");
        }
        if (resume != null && out != null) {
            throw new InvalidInputException("--out cannot be used with --resume (the run continues in its folder)");
        }
        if (!(timeoutS > 0) || !(reconnectBudgetS >= 0)) {
            throw new InvalidInputException("--timeout must be positive and --reconnect-budget not negative");
        }
        RunLauncher.Options o = new RunLauncher.Options(meter, dialect, out, Path.of("results"), fixture, seed, quiet,
                trace, timeoutS, reconnectBudgetS);
        RunLauncher l = new RunLauncher(spec.commandLine().getOut(), spec.commandLine().getErr());
        if (resume != null && (serial != null || lot != null || operator != null || station != null)) {
            throw new InvalidInputException("--serial, --lot, --operator and --station cannot be used with --resume"
                    + " (the run keeps the identity it started with)");
        }
        if (!noIndex) {
            l.indexInto(store.database());
        }
        if (resume == null) {
            org.zweep.runner.store.StationFile sf = org.zweep.runner.store.StationFile.load();
            l.identity(new org.zweep.runner.results.RunManifest.Identity(text(serial, "--serial"),
                    text(lot, "--lot"), text(operator, "--operator"),
                    station != null ? text(station, "--station") : sf.station()));
        }
        if (live != null) {
            l.live(new java.net.InetSocketAddress(liveBind, live));
        }
        return resume != null ? l.resume(resume, o) : l.start(file, o);
    }

    static String text(String v, String option) {
        if (v == null) {
            return null;
        }
        if (v.isBlank() || v.chars().anyMatch(Character::isISOControl)) {
            throw new InvalidInputException(option + " must be a non-empty text on one line");
        }
        return v.strip();
    }
}
