package org.zweep.runner.cli;

import java.time.Duration;
import org.zweep.driver.scpi.ScpiSettings;
import picocli.CommandLine;
import picocli.CommandLine.Model.ArgSpec;
import picocli.CommandLine.Model.OptionSpec;

/**
 * The defaults of the shared options, per command, in one place (so the help, {@code run} and
 * {@code demo} agree): {@code --timeout} is a run's reply slack ({@link RunLauncher.Options}) in
 * {@code run} and {@code lot}, the SCPI client's read timeout ({@link ScpiSettings#DEFAULTS}) elsewhere;
 * {@code --reconnect-budget} is a run's; {@code measure}'s {@code --dialect} is {@code standard}.
 * Every other option keeps the default its annotation gives.
 */
final class OptionDefaults implements CommandLine.IDefaultValueProvider {
    /** The dialect {@code measure} assumes when none is given. */
    static final String MEASURE_DIALECT = "standard";

    @Override
    public String defaultValue(ArgSpec arg) {
        if (!(arg instanceof OptionSpec option)) {
            return null;
        }
        String command = arg.command().name();
        return switch (option.longestName()) {
            case "--timeout" -> DurationConverter.text(timeout(command));
            case "--reconnect-budget" -> DurationConverter.text(RunLauncher.Options.DEFAULT_RECONNECT_BUDGET);
            case "--dialect" -> command.equals("measure") ? MEASURE_DIALECT : null;
            default -> null;
        };
    }

    /** The reply slack {@code command} waits when {@code --timeout} is not given. */
    static Duration timeout(String command) {
        return command.equals("run") || command.equals("lot") ? RunLauncher.Options.DEFAULT_TIMEOUT
                : ScpiSettings.DEFAULTS.readTimeout();
    }
}
