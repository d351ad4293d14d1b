package org.zweep.runner.cli;

import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Spec;

/**
 * {@code --dialect NAME|FILE}: the meter's dialect, a built-in name or a {@code .yaml} file. In
 * {@code run} and {@code check} it replaces the sequence's; {@code measure} defaults to
 * {@code standard} ({@link OptionDefaults}); {@code probe} needs it.
 */
final class DialectOption {
    @Spec(Spec.Target.MIXEE)
    CommandSpec command;

    @Option(names = "--dialect", paramLabel = "NAME|FILE",
            description = "the meter's dialect: a built-in name (standard, mz300) or a .yaml file (run, check: instead"
                    + " of the sequence's; measure: default standard; probe: required)")
    String dialect;

    /** The dialect given (or the command's default), or null when none was. */
    String orNull() {
        return dialect;
    }

    /** The dialect given; refuses the command line (exit 2) when none was. */
    String required() {
        if (dialect == null) {
            throw new ParameterException(command.commandLine(), "Missing required option: '--dialect=NAME|FILE'");
        }
        return dialect;
    }
}
