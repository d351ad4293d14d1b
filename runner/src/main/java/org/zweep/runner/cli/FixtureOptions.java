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

    /** One reader of standard input for every port these options make (a lot makes one per part). */
    private BufferedReader stdin;

    private BufferedReader stdin() {
        if (stdin == null) {
            stdin = new BufferedReader(new InputStreamReader(System.in, StandardCharsets.UTF_8));
        }
        return stdin;
    }

    /**
     * The port a lot asks for the next part through, before its run starts: the terminal, the line
     * channels and the command hook as for a run; with the meter's own fixture or {@code --yes}
     * (nobody to ask) the instruction is only shown.
     */
    FixturePort partPort(PrintWriter out) {
        check();
        boolean terminal = System.console() != null;
        if (command != null) {
            return FixturePort.command(command);
        }
        if ("stdin".equals(channel)) {
            return FixturePort.lines("stdin", stdin(), out);
        }
        if (channel != null && channel.startsWith("pipe:")) {
            return FixturePort.pipe(Path.of(channel.substring("pipe:".length())));
        }
        if ("terminal".equals(channel) || (channel == null && !yes && terminal)) {
            if (!terminal) {
                throw new InvalidInputException("--fixture terminal: there is no terminal; " + CHANNELS);
            }
            return FixturePort.operator(Prompter.terminal(stdin(), out));
        }
        return (state, instruction) -> {
            out.println(">> " + instruction);
            out.flush();
        };
    }

    /**
     * {@code --scan}: asks for the next part's serial (typed or scanned) on the terminal or a line
     * channel ({@code serial N TEXT}, answered by the serial, {@code end} or {@code abort}).
     * Returns the serial, or {@code null} when the lot is complete (an empty line or {@code end}).
     *
     * @throws InvalidInputException when nobody can answer (the meter's fixture, a command hook, no terminal)
     * @throws org.zweep.runner.engine.RunInterruptedException on {@code abort} or the end of input
     */
    java.util.function.IntFunction<String> serialReader(PrintWriter out) {
        check();
        boolean terminal = System.console() != null;
        boolean lines = "stdin".equals(channel) || (channel != null && channel.startsWith("pipe:"));
        if (!lines && !(terminal && command == null && !"meter".equals(channel))) {
            throw new InvalidInputException("--scan needs someone to type or scan each serial: a terminal,"
                    + " --fixture stdin or --fixture pipe:PATH");
        }
        if (!lines) {
            return k -> {
                out.print(">> part " + k + ": scan or type its serial (an empty line ends the lot): ");
                out.flush();
                String line;
                try {
                    line = stdin().readLine(); // the end of input (Ctrl-D) ends the lot like an empty line
                } catch (java.io.IOException e) {
                    throw new java.io.UncheckedIOException("the terminal: " + e.getMessage(), e);
                }
                return line == null || line.isBlank() ? null : line.strip();
            };
        }
        boolean pipe = !"stdin".equals(channel);
        Path path = pipe ? Path.of(channel.substring("pipe:".length())) : null;
        return k -> {
            String request = "serial " + k + " scan or type the serial of part " + k + " (end: the lot is complete)";
            String answer;
            if (pipe) {
                try (PrintWriter w = new PrintWriter(java.nio.file.Files.newBufferedWriter(path, StandardCharsets.UTF_8))) {
                    w.println(request);
                } catch (java.io.IOException e) {
                    throw new InvalidInputException("--fixture " + channel + ": cannot write requests: " + e.getMessage());
                }
                try (BufferedReader r = java.nio.file.Files.newBufferedReader(Path.of(path + ".reply"),
                        StandardCharsets.UTF_8)) {
                    answer = readLine(r, channel);
                } catch (java.io.IOException e) {
                    throw new InvalidInputException("--fixture " + channel + ": cannot read answers: " + e.getMessage());
                }
            } else {
                out.println(request);
                out.flush();
                answer = readLine(stdin(), "stdin");
            }
            String a = answer.strip();
            if (a.equalsIgnoreCase("abort")) {
                throw new org.zweep.runner.engine.RunInterruptedException("abort answered on " + channel
                        + " at the request for the serial of part " + k);
            }
            return a.isEmpty() || a.equalsIgnoreCase("end") ? null : a;
        };
    }

    private static String readLine(BufferedReader r, String name) {
        try {
            String line = r.readLine();
            if (line == null) {
                throw new org.zweep.runner.engine.RunInterruptedException("input ended on " + name
                        + " at the request for a serial");
            }
            return line;
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(name + ": " + e.getMessage(), e);
        }
    }
}
