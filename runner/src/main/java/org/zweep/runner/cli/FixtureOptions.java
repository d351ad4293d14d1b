package org.zweep.runner.cli;

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.function.Consumer;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.engine.FixturePort;
import org.zweep.runner.engine.MeterLink;
import org.zweep.runner.engine.Prompter;
import picocli.CommandLine.Option;

/**
 * Who changes what is in the fixture ({@code --fixture}, {@code --fixture-command}, {@code --yes}),
 * shared by {@code run}, {@code measure} and {@code demo}.
 */
public final class FixtureOptions {
    /** The channels that work without a terminal, for refusals. */
    static final String CHANNELS = "answer on another channel with --fixture stdin or --fixture pipe:PATH, or run a"
            + " hook with --fixture-command CMD";

    @Option(names = "--fixture", paramLabel = "CHANNEL",
            description = "who changes the fixture: terminal (an operator presses Enter), stdin (lines: zweep writes"
                    + " 'fixture STATE TEXT' on stdout, waits for 'ok' or 'abort' on stdin), pipe:PATH (the same"
                    + " lines through the named pipes PATH and PATH.reply) or meter (the meter's own fixture)."
                    + " Default: the meter's own fixture when its dialect declares one, else the terminal")
    String channel;

    @Option(names = "--fixture-command", paramLabel = "CMD",
            description = "run CMD STATE (STATE also in $ZWEEP_FIXTURE, the instruction in $ZWEEP_FIXTURE_TEXT) to"
                    + " change the fixture; a non-zero exit stops the run with DC bias ramped down")
    String command;

    @Option(names = "--yes", description = "confirm at once that the part is in the fixture (never a correction"
            + " standard nor a change of the second winding: those need a channel or the meter's fixture)")
    boolean yes;

    /** No options given: the default channel. */
    static FixtureOptions defaults() {
        return new FixtureOptions();
    }

    /** Refuses options that cannot go together; call before anything is sent. */
    void check() {
        int given = (channel != null ? 1 : 0) + (command != null ? 1 : 0) + (yes ? 1 : 0);
        if (given > 1) {
            throw new InvalidInputException("give only one of --fixture, --fixture-command and --yes");
        }
        if (channel != null && !(channel.equals("terminal") || channel.equals("stdin") || channel.equals("meter")
                || (channel.startsWith("pipe:") && channel.length() > 5))) {
            throw new InvalidInputException("--fixture '" + channel + "': expected terminal, stdin, pipe:PATH or meter");
        }
        if (command != null && command.isBlank()) {
            throw new InvalidInputException("--fixture-command: the command is empty");
        }
    }

    /**
     * The fixture port these options ask for.
     *
     * @param link the meter (its own fixture, when it has one)
     * @param live the live page's operator, or null
     * @param out where prompts and requests on stdout go
     * @param log one-line notes
     */
    FixturePort port(MeterLink link, Prompter live, PrintWriter out, Consumer<String> log) {
        check();
        boolean terminal = System.console() != null;
        FixturePort operator = live != null ? FixturePort.operator(live)
                : terminal ? FixturePort.operator(Prompter.terminal(stdin(), out))
                : FixturePort.refusing(CHANNELS);
        if (command != null) {
            return FixturePort.command(command);
        }
        if (yes) {
            return FixturePort.meter(link, FixturePort.confirmingPart(out, CHANNELS), log);
        }
        if (channel == null) {
            FixturePort own = FixturePort.meter(link, operator, log);
            return live != null && link.fixtureControl().isPresent() ? own.then(operator) : own;
        }
        return switch (channel) {
            case "terminal" -> {
                if (!terminal) {
                    throw new InvalidInputException("--fixture terminal: there is no terminal; " + CHANNELS);
                }
                yield FixturePort.operator(Prompter.terminal(stdin(), out));
            }
            case "stdin" -> FixturePort.lines("stdin", stdin(), out);
            case "meter" -> {
                if (link.fixtureControl().isEmpty()) {
                    throw new InvalidInputException("--fixture meter: the meter's dialect declares no fixture of its own");
                }
                yield FixturePort.meter(link, FixturePort.refusing("the meter's own fixture cannot do it; " + CHANNELS),
                        log);
            }
            default -> FixturePort.pipe(Path.of(channel.substring("pipe:".length())));
        };
    }

    private static BufferedReader stdin() {
        return new BufferedReader(new InputStreamReader(System.in, StandardCharsets.UTF_8));
    }
}
