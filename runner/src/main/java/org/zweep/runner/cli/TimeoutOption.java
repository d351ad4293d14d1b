package org.zweep.runner.cli;

import java.time.Duration;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Spec;

/**
 * {@code --timeout DURATION}: how long beyond the work the meter is expected to do (its dialect's
 * timing) zweep waits for each reply; shared by every command that talks to a meter. The default
 * is the command's ({@link OptionDefaults}).
 */
final class TimeoutOption {
    @Spec(Spec.Target.MIXEE)
    CommandSpec command;

    private Duration timeout;

    @Option(names = "--timeout", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "the longest wait for each reply beyond the work the meter is expected to do, e.g. 500ms,"
                    + " 2s, 1min or a number of seconds (default: ${DEFAULT-VALUE})")
    void timeout(Duration value) {
        if (value.isZero()) {
            throw new ParameterException(command.commandLine(), "--timeout must be longer than zero");
        }
        timeout = value;
    }

    /** The timeout given, or the command's default. */
    Duration get() {
        if (timeout == null) {
            throw new IllegalStateException(command.name() + " has no default --timeout (OptionDefaults)");
        }
        return timeout;
    }
}
