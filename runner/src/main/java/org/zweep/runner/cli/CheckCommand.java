package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.zweep.driver.address.Address;
import org.zweep.driver.dialect.Dialect;
import org.zweep.runner.engine.RunEstimate;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.sequence.SequenceLoader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep check FILE}: validates a sequence file without touching any instrument. */
@Command(
        name = "check",
        mixinStandardHelpOptions = true,
        description = {
            "Validates a sequence file without touching any instrument.",
            "Checks every point against the meter's declared capabilities (the sequence's dialect, or "
                + "--dialect) and prints the number of steps, points and checks, then the estimated time of "
                + "compensation and of each step (the dialect's timing model, bias ramps, settling) and in "
                + "total; or the first error as file:line:column: what was expected."
        },
        footer = ExitCode.HELP_LIST)
public final class CheckCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "FILE", description = "the sequence file (YAML)")
    Path file;

    @Mixin
    DialectOption dialect;

    @Option(names = "--meter", paramLabel = "ADDRESS", description = "the meter the run will use instead of the "
            + "sequence's (its address is checked; the sequence's own is then not looked at)")
    String meter;

    @Override
    public Integer call() {
        Plan plan = SequenceLoader.loadForMeter(file, dialect.orNull());
        if (meter == null) {
            plan.meter().requireUsable();
        } else {
            Address.parse(meter);
        }
        Dialect d = Dialect.load(dialect.orNull() != null ? dialect.orNull() : plan.meter().dialect());
        RunEstimate e = RunEstimate.of(plan, d);
        int points = plan.points().size();
        PrintWriter out = spec.commandLine().getOut();
        out.printf("%s: ok, sequence '%s': %d %s, %d %s, %d %s, about %s%n", file,
                plan.name(), plan.steps().size(), plural(plan.steps().size(), "step"), points,
                plural(points, "point"), plan.checks().size(), plural(plan.checks().size(), "check"),
                RunEstimate.format(e.totalS()));
        out.printf(Locale.ROOT, "  %-34s %10s%n", "start (connect, identify, reset)", RunEstimate.format(e.startS()));
        if (e.compensationS() > 0) {
            CompensationMode mode = plan.fixture().compensation();
            out.printf(Locale.ROOT, "  %-34s %10s%n", "compensation (" + mode.name().toLowerCase(Locale.ROOT) + ", "
                    + e.compensationStandardS().size() + " " + plural(e.compensationStandardS().size(), "standard")
                    + ")", RunEstimate.format(e.compensationS()));
        }
        for (RunEstimate.StepTime s : e.steps()) {
            out.printf(Locale.ROOT, "  %-34s %10s  (meter %s, host waits and commands %s)%n",
                    "step " + s.name() + ", " + s.points() + " " + plural(s.points(), "point"),
                    RunEstimate.format(s.totalS()), RunEstimate.format(s.meterS()), RunEstimate.format(s.waitS()));
        }
        out.printf(Locale.ROOT, "  %-34s %10s  (dialect %s; operator prompts not counted)%n", "total",
                RunEstimate.format(e.totalS()), d.name());
        return ExitCode.OK;
    }

    private static String plural(int n, String word) {
        return n == 1 ? word : word + "s";
    }
}
