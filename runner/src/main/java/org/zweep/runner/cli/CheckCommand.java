package org.zweep.runner.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.sequence.PlanEstimate;
import org.zweep.runner.sequence.SequenceLoader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep check FILE}: validates a sequence file without touching any instrument. */
@Command(
        name = "check",
        mixinStandardHelpOptions = true,
        description = {
            "Validates a sequence file without touching any instrument.",
            "Prints one line: the number of steps, points and checks and a rough run time, "
                + "or the first error as file:line:column: what was expected."
        },
        footer = ExitCode.HELP_LIST)
public final class CheckCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "FILE", description = "the sequence file (YAML)")
    Path file;

    @Override
    public Integer call() {
        Plan plan = SequenceLoader.load(file);
        int points = plan.points().size();
        spec.commandLine().getOut().printf("%s: ok, sequence '%s': %d %s, %d %s, %d %s, about %s%n", file,
                plan.name(), plan.steps().size(), plural(plan.steps().size(), "step"), points,
                plural(points, "point"), plan.checks().size(), plural(plan.checks().size(), "check"),
                PlanEstimate.format(PlanEstimate.seconds(plan)));
        return ExitCode.OK;
    }

    private static String plural(int n, String word) {
        return n == 1 ? word : word + "s";
    }
}
