package org.zweep.runner.engine;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.function.Consumer;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.FixtureControl;
import org.zweep.driver.meter.FixtureState;

/**
 * The one way to change what is in the fixture (the part, a correction standard, a transformer's
 * second winding open or shorted): an operator at a terminal, an operator or script on a line
 * channel, the meter's own fixture, or a command hook. {@link #hold} returns when the fixture is
 * in the state asked for.
 *
 * <p>The line protocol of {@link #lines}: zweep writes one line {@code fixture STATE TEXT}, with
 * STATE one of {@code PART OPEN SHORT LOAD SECONDARY_OPEN SECONDARY_SHORTED} and TEXT the
 * instruction for people (possibly empty), and waits for one line: {@code ok} when the fixture is
 * there, {@code abort} to stop the run (DC bias ramped down, the run folder resumable). End of
 * input counts as {@code abort}; any other line is answered with {@code fixture? ok or abort} and
 * read again.
 */
@FunctionalInterface
public interface FixturePort {

    /**
     * Brings the fixture to {@code state} and returns when it is there.
     *
     * @param instruction what to do, for people; empty when the sequence says nothing (an operator
     *     is then not asked: the part stays as it is)
     * @throws RunInterruptedException when the operator or the hook stops the run instead
     * @throws InvalidInputException when this port cannot bring the fixture to {@code state}
     */
    void hold(FixtureState state, String instruction);

    /** The first word of a request line of the {@link #lines} protocol. */
    String REQUEST = "fixture";

    /** An operator at a terminal, asked through {@code prompter} (nothing asked without an instruction). */
    static FixturePort operator(Prompter prompter) {
        return (state, instruction) -> {
            if (!instruction.isEmpty()) {
                prompter.prompt(instruction);
            }
        };
    }

    /**
     * {@code --yes}: confirms at once that the part is in the fixture (the instruction shown on
     * {@code out}), and refuses every other state, which someone must bring about.
     */
    static FixturePort confirmingPart(PrintWriter out, String channels) {
        return (state, instruction) -> {
            if (state != FixtureState.PART) {
                throw new InvalidInputException("the sequence needs the fixture changed to " + state
                        + (instruction.isEmpty() ? "" : " (\"" + instruction + "\")") + " and --yes confirms only"
                        + " that the part is in the fixture; let someone or something change it: " + channels);
            }
            if (!instruction.isEmpty()) {
                out.println(">> " + instruction + " (--yes: going on)");
                out.flush();
            }
        };
    }

    /**
     * Refuses every change that needs someone (an instruction): nobody can change the fixture (no
     * terminal, no channel). {@code channels} says what would.
     */
    static FixturePort refusing(String channels) {
        return (state, instruction) -> {
            if (instruction.isEmpty()) {
                return;
            }
            throw new InvalidInputException("the sequence needs the fixture changed to " + state
                    + (instruction.isEmpty() ? "" : " (\"" + instruction + "\")") + " but there is no terminal; "
                    + channels);
        };
    }

    /**
     * An operator or a script on a line channel ({@link #lines protocol} above): each request is
     * written to {@code requests}, each answer read from {@code answers}.
     *
     * @param name the channel's name, for messages
     */
    static FixturePort lines(String name, java.util.function.Supplier<PrintWriter> requests,
            java.util.function.Supplier<BufferedReader> answers) {
        return new LineFixture(name, requests, answers);
    }

    /** Lines on {@code in} and {@code out} (stdin and stdout). */
    static FixturePort lines(String name, BufferedReader in, PrintWriter out) {
        return lines(name, () -> out, () -> in);
    }

    /**
     * Lines through two named pipes: requests written to {@code path}, answers read from
     * {@code path.reply}, each opened for one request (so a shell loop can serve them).
     */
    static FixturePort pipe(Path path) {
        Path reply = Path.of(path + ".reply");
        return new LineFixture("pipe:" + path, () -> {
            try {
                return new PrintWriter(Files.newBufferedWriter(path, StandardCharsets.UTF_8), true);
            } catch (IOException e) {
                throw new InvalidInputException("--fixture pipe:" + path + ": cannot write requests: " + e.getMessage());
            }
        }, () -> {
            try {
                return Files.newBufferedReader(reply, StandardCharsets.UTF_8);
            } catch (IOException e) {
                throw new InvalidInputException("--fixture pipe:" + path + ": cannot read answers from " + reply + ": "
                        + e.getMessage());
            }
        }) {
            @Override
            boolean closeEach() {
                return true;
            }
        };
    }

    /**
     * The meter's own fixture ({@link MeterLink#fixtureControl()}, asked on the connection of the moment)
     * for the states it can hold, {@code otherwise} for the rest; the instruction is noted on
     * {@code log}.
     */
    static FixturePort meter(MeterLink link, FixturePort otherwise, Consumer<String> log) {
        return (state, instruction) -> {
            FixtureControl control = link.fixtureControl().orElse(null);
            if (control == null || !control.states().contains(state)) {
                otherwise.hold(state, instruction);
                return;
            }
            control.hold(state);
            if (!instruction.isEmpty()) {
                log.accept(">> " + instruction + " (the meter's fixture holds " + word(state) + ")");
            }
        };
    }

    /** This port, then {@code next} (the meter's fixture switches, then the operator confirms on the live page). */
    default FixturePort then(FixturePort next) {
        return (state, instruction) -> {
            hold(state, instruction);
            next.hold(state, instruction);
        };
    }

    /**
     * A command hook: {@code command STATE} run by {@code /bin/sh} with {@code ZWEEP_FIXTURE=STATE}
     * and {@code ZWEEP_FIXTURE_TEXT=instruction} in its environment, its output on zweep's error
     * output. A non-zero exit (or a command that cannot be started) stops the run.
     */
    static FixturePort command(String command) {
        return (state, instruction) -> {
            ProcessBuilder pb = new ProcessBuilder("/bin/sh", "-c", command + " \"$@\"", "zweep-fixture", state.name());
            pb.environment().put("ZWEEP_FIXTURE", state.name());
            pb.environment().put("ZWEEP_FIXTURE_TEXT", instruction);
            pb.redirectInput(ProcessBuilder.Redirect.from(new java.io.File("/dev/null")));
            pb.redirectOutput(ProcessBuilder.Redirect.INHERIT);
            pb.redirectError(ProcessBuilder.Redirect.INHERIT);
            int code;
            try {
                code = pb.start().waitFor();
            } catch (IOException e) {
                throw new RunInterruptedException("the fixture command could not be started: " + e.getMessage());
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new RunInterruptedException("interrupted while the fixture command ran");
            }
            if (code != 0) {
                throw new RunInterruptedException("the fixture command '" + command + " " + state.name()
                        + "' exited with " + code);
            }
        };
    }

    /** The state in lower case with spaces, for people. */
    static String word(FixtureState s) {
        return s.name().toLowerCase(Locale.ROOT).replace('_', ' ');
    }

    /** The line channel ({@link FixturePort#lines}). */
    class LineFixture implements FixturePort {
        private final String name;
        private final java.util.function.Supplier<PrintWriter> requests;
        private final java.util.function.Supplier<BufferedReader> answers;

        LineFixture(String name, java.util.function.Supplier<PrintWriter> requests,
                java.util.function.Supplier<BufferedReader> answers) {
            this.name = name;
            this.requests = requests;
            this.answers = answers;
        }

        /** Whether both ends are opened and closed for each request. */
        boolean closeEach() {
            return false;
        }

        @Override
        public void hold(FixtureState state, String instruction) {
            String line = (REQUEST + " " + state.name() + " " + instruction.replace('\n', ' ')).strip();
            PrintWriter w = requests.get();
            try {
                w.println(line);
                w.flush();
            } finally {
                if (closeEach()) {
                    w.close();
                }
            }
            while (true) {
                String answer;
                BufferedReader r = answers.get();
                try {
                    answer = r.readLine();
                } catch (IOException e) {
                    throw new UncheckedIOException(name + ": " + e.getMessage(), e);
                } finally {
                    if (closeEach()) {
                        try {
                            r.close();
                        } catch (IOException e) {
                            // the answer is read; closing cannot lose it
                        }
                    }
                }
                if (answer == null || answer.strip().equalsIgnoreCase("abort")) {
                    throw new RunInterruptedException((answer == null ? "input ended" : "abort answered") + " on "
                            + name + " at the request for " + state.name());
                }
                if (answer.strip().equalsIgnoreCase("ok")) {
                    return;
                }
                PrintWriter again = requests.get();
                try {
                    again.println(REQUEST + "? ok or abort");
                    again.flush();
                } finally {
                    if (closeEach()) {
                        again.close();
                    }
                }
            }
        }
    }
}
