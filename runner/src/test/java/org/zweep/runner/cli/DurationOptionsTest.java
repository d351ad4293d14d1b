package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.Model.PositionalParamSpec;

/** Every duration option of every command reads 500ms, 2s, 1min and bare seconds through the one converter. */
class DurationOptionsTest {
    private static final Map<String, Duration> FORMS = Map.of(
            "500ms", Duration.ofMillis(500), "2s", Duration.ofSeconds(2), "1min", Duration.ofMinutes(1),
            "3", Duration.ofSeconds(3));

    private static CommandLine zweep() {
        return zweep(List.copyOf(Cli.SUBCOMMANDS.keySet()));
    }

    /** The command line with only {@code commands} (as {@code zweep COMMAND ...} builds it). */
    private static CommandLine zweep(List<String> commands) {
        return Cli.commandLine(new PrintWriter(new StringWriter()), new PrintWriter(new StringWriter()), false,
                commands);
    }

    /** Each command's options of type Duration, by command name. */
    private static Map<String, List<OptionSpec>> durationOptions(CommandLine zweep) {
        Map<String, List<OptionSpec>> found = new TreeMap<>();
        zweep.getSubcommands().forEach((name, sub) -> {
            for (OptionSpec o : sub.getCommandSpec().options()) {
                if (o.type() == Duration.class) {
                    found.computeIfAbsent(name, k -> new ArrayList<>()).add(o);
                }
            }
        });
        return found;
    }

    @Test
    void theDurationOptionsAreWhereTheHelpPromisesThem() {
        Map<String, List<String>> names = new TreeMap<>();
        durationOptions(zweep()).forEach((c, os) -> names.put(c, os.stream().map(OptionSpec::longestName).sorted().toList()));
        assertEquals(Map.of(
                "lot", List.of("--reconnect-budget", "--timeout"),
                "measure", List.of("--settle", "--timeout"),
                "ping", List.of("--timeout"),
                "probe", List.of("--timeout"),
                "run", List.of("--reconnect-budget", "--timeout"),
                "scpi", List.of("--timeout"),
                "sim", List.of("--delay", "--drop-idle")), names);
    }

    @Test
    void everyDurationOptionOfEveryCommandAcceptsTheFourForms() {
        durationOptions(zweep()).forEach((command, options) -> {
            for (OptionSpec o : options) {
                for (var form : FORMS.entrySet()) {
                    CommandLine fresh = zweep(List.of(command));
                    List<String> args = minimalArgs(fresh.getSubcommands().get(command));
                    args.add(o.longestName());
                    args.add(form.getKey());
                    CommandLine.ParseResult r = fresh.parseArgs(args.toArray(String[]::new));
                    OptionSpec parsed = r.subcommand().matchedOption(o.longestName());
                    assertEquals(form.getValue(), parsed.getValue(), command + " " + o.longestName() + " " + form.getKey());
                }
            }
        });
    }

    @Test
    void runAndScpiBothTakeTwoSecondsAndMeasureHasATimeout() {
        assertEquals(Duration.ofSeconds(2), timeoutAfter("run", "x.yaml", "--timeout", "2s"));
        assertEquals(Duration.ofSeconds(2), timeoutAfter("scpi", "sim:", "--timeout", "2s"));
        assertEquals(Duration.ofSeconds(2), timeoutAfter("measure", "sim:", "--frequency", "1kHz", "--timeout", "2s"));
    }

    @Test
    void defaultsComeFromTheRunOptionsAndTheScpiClient() {
        assertEquals(RunLauncher.Options.DEFAULT_TIMEOUT, timeoutAfter("run", "x.yaml"));
        assertEquals(RunLauncher.Options.DEFAULT_TIMEOUT, timeoutAfter("lot", "x.yaml"));
        assertEquals(org.zweep.driver.scpi.ScpiSettings.DEFAULTS.readTimeout(), timeoutAfter("scpi", "sim:"));
        assertEquals(org.zweep.driver.scpi.ScpiSettings.DEFAULTS.readTimeout(),
                timeoutAfter("measure", "sim:", "--frequency", "1kHz"));
        RunLauncher.Options demo = RunLauncher.Options.builder().build();
        assertEquals(Duration.ofSeconds(10), demo.timeout()); // README, "Deadlines": default 10 s
        assertEquals(Duration.ofSeconds(60), demo.reconnectBudget()); // README, "Lost link": default 60 s
    }

    private static Duration timeoutAfter(String... args) {
        CommandLine.ParseResult r = zweep(List.of(args[0])).parseArgs(args);
        return r.subcommand().commandSpec().findOption("--timeout").getValue();
    }

    @Test
    void anInvalidDurationIsOneLineAndExitTwo() {
        for (String[] args : List.of(new String[] {"run", "x.yaml", "--timeout", "fast"},
                new String[] {"scpi", "sim:", "--timeout", "2h"},
                new String[] {"measure", "sim:", "--frequency", "1kHz", "--settle", "-1s"},
                new String[] {"run", "x.yaml", "--reconnect-budget", "soon"},
                new String[] {"ping", "sim:", "--timeout", "0"})) {
            StringWriter err = new StringWriter();
            int code = Cli.run(args, new PrintWriter(new StringWriter()), new PrintWriter(err));
            String text = err.toString();
            assertEquals(ExitCode.USAGE, code, text);
            assertEquals(1, text.lines().count(), text);
            assertTrue(text.startsWith("zweep: ") && (text.contains("is not a duration")
                    || text.contains("must be longer than zero")), text);
        }
    }

    @Test
    void theHelpShowsEachDefaultAsItIsTyped() {
        for (String command : List.of("run", "lot", "scpi", "ping", "probe", "measure", "demo", "check", "sim")) {
            StringWriter out = new StringWriter();
            Cli.run(new String[] {command, "--help"}, new PrintWriter(out), new PrintWriter(new StringWriter()));
            assertFalse(out.toString().contains("PT"), out.toString());
            assertFalse(out.toString().contains("default: null"), out.toString());
        }
        StringWriter out = new StringWriter();
        Cli.run(new String[] {"run", "--help"}, new PrintWriter(out), new PrintWriter(new StringWriter()));
        assertTrue(out.toString().replaceAll("\\s+", " ").contains("(default: 10s)"), out.toString());
    }

    /** The command's name and a placeholder for each required parameter and option. */
    private static List<String> minimalArgs(CommandLine sub) {
        List<String> args = new ArrayList<>(List.of(sub.getCommandName()));
        for (PositionalParamSpec p : sub.getCommandSpec().positionalParameters()) {
            if (p.arity().min > 0) {
                args.add("x");
            }
        }
        for (OptionSpec o : sub.getCommandSpec().requiredArgs().stream().filter(a -> a instanceof OptionSpec).map(a -> (OptionSpec) a).toList()) {
            args.add(o.longestName());
            args.add("x");
        }
        return args;
    }
}
