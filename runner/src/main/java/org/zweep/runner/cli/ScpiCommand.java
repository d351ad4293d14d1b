package org.zweep.runner.cli;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.concurrent.Callable;
import org.jline.reader.EndOfFileException;
import org.jline.reader.LineReader;
import org.jline.reader.LineReaderBuilder;
import org.jline.reader.UserInterruptException;
import org.jline.terminal.Terminal;
import org.jline.terminal.TerminalBuilder;
import org.zweep.driver.MeterException;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.driver.scpi.ScpiValues;
import org.zweep.driver.transport.ConnectionLostException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep scpi}: sends SCPI messages to a meter and prints the replies, or runs a console. */
@Command(
        name = "scpi",
        mixinStandardHelpOptions = true,
        description = {
            "Sends each COMMAND to the meter at ADDRESS in order and prints each query's reply on its own line.",
            "Without COMMAND: an interactive console with history (or, when standard input is not a terminal,"
                    + " one command per input line). A message containing '?' is a query."
        },
        defaultValueProvider = OptionDefaults.class,
        footer = ExitCode.HELP_LIST)
final class ScpiCommand implements Callable<Integer> {

    @Mixin
    MeterAddress address;

    @Parameters(index = "1..*", paramLabel = "COMMAND", description = "SCPI program messages, sent in order.")
    List<String> commands = List.of();

    @Mixin
    TimeoutOption timeout;

    @Mixin
    TraceOption trace;

    @Spec
    CommandSpec spec;

    private final InputStream stdin;

    ScpiCommand() {
        this(System.in);
    }

    /** @param stdin where console lines come from when no command is given (tests pass their own) */
    ScpiCommand(InputStream stdin) {
        this.stdin = stdin;
    }

    @Override
    public Integer call() throws IOException {
        PrintWriter out = spec.commandLine().getOut();
        ScpiSettings settings = ScpiSettings.builder().readTimeout(timeout.get()).tracePath(trace.get()).build();
        PrintWriter err = spec.commandLine().getErr();
        int failed = 0;
        try (ScpiClient client = ScpiClient.open(address.get(), settings)) {
            if (!commands.isEmpty()) {
                int n = 0;
                for (String c : commands) {
                    failed += keepGoing(client, c, "command " + (++n), out, err);
                }
            } else if (stdin == System.in && System.console() != null) {
                console(client, out);
            } else {
                failed = lines(client, out, err);
            }
        }
        return failed > 0 ? ExitCode.METER : ExitCode.OK;
    }

    /**
     * Sends one message; when the meter does not answer a query in time or reports an error, says
     * so on {@code err} with what its error queue holds (when it can be read) and returns 1, so
     * that the caller goes on with the next message; 0 when all went well. A lost connection ends
     * the session (thrown).
     */
    static int keepGoing(ScpiClient client, String message, String where, PrintWriter out, PrintWriter err) {
        try {
            exchange(client, message, out, err);
            return 0;
        } catch (ConnectionLostException e) {
            throw e;
        } catch (MeterException e) {
            String problem = e instanceof org.zweep.driver.transport.MeterTimeoutException
                    ? "no reply to '" + message + "' within "
                            + org.zweep.runner.text.Figures.format(client.settings().readTimeout().toMillis() / 1000.0,
                                    org.zweep.driver.impedance.Unit.SECOND)
                    : e.getMessage();
            String queue;
            try {
                List<org.zweep.driver.scpi.ScpiError> errors = client.drainErrors();
                queue = errors.isEmpty() ? "the meter's error queue is empty"
                        : "the meter's error queue: " + String.join("; ", errors.stream().map(Object::toString).toList());
            } catch (ConnectionLostException lost) {
                throw lost;
            } catch (MeterException unreadable) {
                queue = "the meter's error queue could not be read (" + unreadable.getMessage() + ")";
            }
            err.println("zweep: " + where + ": " + problem + "; " + queue + "; going on");
            err.flush();
            return 1;
        }
    }

    /** How long the link must stay silent before a query for nothing unasked to be waiting. */
    static final Duration UNASKED_QUIET = Duration.ofMillis(20);

    /**
     * Sends one message; prints the reply if it is a query. Before a query, bytes that answer no
     * query (a reply the meter sent twice, or a late one) are discarded with a note on {@code err}
     * and the client resynchronises, so one stray reply never shifts every later answer.
     */
    static void exchange(ScpiClient client, String message, PrintWriter out, PrintWriter err) {
        if (isQuery(message)) {
            client.discardUnasked(UNASKED_QUIET).ifPresent(stray -> {
                err.println("zweep: discarded a reply no query asked for ('" + stray + "') before '" + message
                        + "'; resynchronised with the meter");
                err.flush();
            });
            out.println(printable(client.queryBytes(message)));
            out.flush();
        } else {
            client.write(message);
        }
    }

    /** A message with a '?' outside quoted strings expects a reply (IEEE 488.2 §6.2.3 query headers). */
    static boolean isQuery(String message) {
        char quote = 0;
        for (int i = 0; i < message.length(); i++) {
            char c = message.charAt(i);
            if (quote != 0) {
                quote = c == quote ? 0 : quote;
            } else if (c == '"' || c == '\'') {
                quote = c;
            } else if (c == '?') {
                return true;
            }
        }
        return false;
    }

    /** The reply as text, with control and non-ASCII bytes escaped (binary blocks stay one line). */
    static String printable(byte[] reply) {
        for (byte b : reply) {
            if (b < 0x20 || b > 0x7e) {
                return ScpiValues.escape(reply, 0, reply.length, Integer.MAX_VALUE);
            }
        }
        return new String(reply, StandardCharsets.US_ASCII);
    }

    /** One message per input line, going on past failures; returns how many failed. */
    private int lines(ScpiClient client, PrintWriter out, PrintWriter err) throws IOException {
        BufferedReader in = new BufferedReader(new InputStreamReader(stdin, StandardCharsets.UTF_8));
        String line;
        int n = 0;
        int failed = 0;
        while ((line = in.readLine()) != null) {
            n++;
            if (!line.isBlank()) {
                failed += keepGoing(client, line.strip(), "line " + n, out, err);
            }
        }
        return failed;
    }

    private void console(ScpiClient client, PrintWriter out) throws IOException {
        PrintWriter err = spec.commandLine().getErr();
        try (Terminal terminal = TerminalBuilder.builder().system(true).build()) {
            LineReader reader = LineReaderBuilder.builder().terminal(terminal).appName("zweep scpi")
                    .variable(LineReader.HISTORY_FILE, Path.of(System.getProperty("user.home"), ".zweep",
                            "scpi_history"))
                    .build();
            out.println("Connected to " + client.address() + ". Type SCPI messages; 'exit' or Ctrl-D ends.");
            out.flush();
            while (true) {
                String line;
                try {
                    line = reader.readLine("scpi> ");
                } catch (UserInterruptException e) {
                    continue;
                } catch (EndOfFileException e) {
                    return;
                }
                String m = line.strip();
                if (m.isEmpty()) {
                    continue;
                }
                if (m.equalsIgnoreCase("exit") || m.equalsIgnoreCase("quit")) {
                    return;
                }
                keepGoing(client, m, "console", out, err);
            }
        } catch (UncheckedIOException e) {
            throw e.getCause();
        }
    }
}
