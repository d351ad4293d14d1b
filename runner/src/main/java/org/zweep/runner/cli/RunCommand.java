package org.zweep.runner.cli;

import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.Callable;
import org.zweep.driver.InvalidInputException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
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
        defaultValueProvider = OptionDefaults.class,
        footer = ExitCode.HELP_LIST + "  130 stopped by Ctrl-C, a signal or at the fixture (resumable)%n")
public final class RunCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", arity = "0..1", paramLabel = "FILE", description = "the sequence file (YAML)")
    Path file;

    @Option(names = "--meter", paramLabel = "ADDRESS", description = "use this meter instead of the sequence's: "
            + MeterAddress.FORMS)
    String meter;

    @Mixin
    DialectOption dialect;

    @Option(names = "--resume", paramLabel = "DIR", description = "continue the run in this folder (needs only the folder)")
    Path resume;

    @Mixin
    RunOptions run;

    @Mixin
    TraceOption trace;

    @Mixin
    TimeoutOption timeout;

    @Option(names = "--reconnect-budget", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "give up reconnecting after this much waiting, e.g. 30s, 2min or a number of seconds"
                    + " (default: ${DEFAULT-VALUE})")
    Duration reconnectBudget;

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

    @Mixin
    StoreOptions store;

    @Option(names = "--no-index", description = "do not add the run to the results index at its end (recorded in"
            + " run.json: a resume keeps to it)")
    boolean noIndex;

    @Option(names = "--index", description = "with --resume: add the run to the results index at its end even"
            + " when it was started with --no-index")
    boolean index;

    @Override
    public Integer call() {
        if ((file == null) == (resume == null)) {
            throw new InvalidInputException("give either a sequence FILE or --resume DIR");
        }
        if (resume != null && run.out != null) {
            throw new InvalidInputException("--out cannot be used with --resume (the run continues in its folder)");
        }
        RunLauncher.Options o = run.builder().meter(meter).dialect(dialect.orNull()).trace(trace.get())
                .timeout(timeout.get()).reconnectBudget(reconnectBudget).build();
        RunLauncher l = new RunLauncher(spec.commandLine().getOut(), spec.commandLine().getErr());
        if (resume != null && (serial != null || lot != null || operator != null || station != null)) {
            throw new InvalidInputException("--serial, --lot, --operator and --station cannot be used with --resume"
                    + " (the run keeps the identity it started with)");
        }
        if (noIndex && index) {
            throw new InvalidInputException("give --index or --no-index, not both");
        }
        if (!noIndex) {
            l.indexInto(store.database(), index);
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
