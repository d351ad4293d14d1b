package org.zweep.runner.cli;

import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/** The top-level {@code zweep} command: lists the subcommands ({@link Cli} adds them). */
@Command(
        name = "zweep",
        mixinStandardHelpOptions = true,
        versionProvider = VersionProvider.class,
        description = "Automated component-impedance measurement over SCPI.",
        footer = ExitCode.HELP_LIST)
public final class ZweepCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() {
        spec.commandLine().usage(spec.commandLine().getOut());
        return ExitCode.USAGE;
    }
}
