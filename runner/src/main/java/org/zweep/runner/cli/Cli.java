package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.IntSupplier;
import java.util.function.Supplier;
import org.zweep.config.Suggest;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.MeterException;
import org.zweep.runner.engine.RunInterruptedException;
import org.zweep.runner.safety.BiasOffHook;
import picocli.CommandLine;

/**
 * Builds the {@code zweep} command line on given writers and runs it, mapping failures to exit
 * codes and one-line messages. Tests call {@link #run} directly, without a terminal.
 */
public final class Cli {
    /**
     * The subcommands, in the order {@code zweep --help} lists them. Each is built only when the
     * command line needs it: picocli reads a command's annotations (and loads what its options
     * use) when it is added, and a JVM that runs one subcommand should not pay for the others.
     */
    static final Map<String, Supplier<Object>> SUBCOMMANDS = subcommands();

    private Cli() {
    }

    private static Map<String, Supplier<Object>> subcommands() {
        Map<String, Supplier<Object>> m = new LinkedHashMap<>();
        m.put("help", () -> new CommandLine.HelpCommand());
        m.put("convert", () -> new ConvertCommand());
        m.put("check", () -> new CheckCommand());
        m.put("demo", () -> new DemoCommand());
        m.put("run", () -> new RunCommand());
        m.put("lot", () -> new LotCommand());
        m.put("measure", () -> new MeasureCommand());
        m.put("analyze", () -> new AnalyzeCommand());
        m.put("export", () -> new ExportCommand());
        m.put("report", () -> new ReportCommand());
        m.put("index", () -> new IndexCommand());
        m.put("runs", () -> new RunsCommand());
        m.put("trend", () -> new TrendCommand());
        m.put("compare", () -> new CompareCommand());
        m.put("scpi", () -> new ScpiCommand());
        m.put("ping", () -> new PingCommand());
        m.put("probe", () -> new ProbeCommand());
        m.put("sim", () -> new SimCommand());
        m.put("watch", () -> new WatchCommand());
        return m;
    }

    /**
     * Runs {@code zweep args} writing to {@code out} and {@code err}.
     *
     * @return the exit code (see {@link ExitCode})
     */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        boolean debug = Arrays.asList(args).contains("--debug");
        String[] rest = Arrays.stream(args).filter(a -> !a.equals("--debug")).toArray(String[]::new);
        int code = guarded(() -> commandLine(out, err, debug, needed(rest)).execute(rest), err, debug);
        out.flush();
        err.flush();
        return code;
    }

    /**
     * The subcommands {@code args} can reach: the one named first, none for a bare
     * {@code --version}, otherwise all (for the help, and for the suggestion after a typo).
     */
    static List<String> needed(String[] args) {
        if (args.length > 0 && !args[0].startsWith("-") && SUBCOMMANDS.containsKey(args[0])
                && !args[0].equals("help")) {
            return List.of(args[0]);
        }
        if (args.length == 1 && (args[0].equals("--version") || args[0].equals("-V"))) {
            return List.of();
        }
        return List.copyOf(SUBCOMMANDS.keySet());
    }

    /** The configured picocli command line with the {@code subcommands} named (tests use all of them). */
    static CommandLine commandLine(PrintWriter out, PrintWriter err, boolean debug, List<String> subcommands) {
        CommandLine cl = new CommandLine(new ZweepCommand());
        for (String name : subcommands) {
            cl.addSubcommand(name, SUBCOMMANDS.get(name).get());
        }
        cl.setOut(out);
        cl.setErr(err);
        cl.setCaseInsensitiveEnumValuesAllowed(true);
        cl.setExitCodeExceptionMapper(Cli::exitCodeOf);
        cl.setParameterExceptionHandler((ex, a) -> {
            err.println(usageLine(ex));
            return ExitCode.USAGE;
        });
        cl.setExecutionExceptionHandler((ex, c, parseResult) -> {
            if (ex instanceof RunInterruptedException) {
                // a stop request (Ctrl-C, a termination signal) before the run had anything to keep
                err.println("zweep: stopped: " + oneLine(ex) + "; DC bias is off");
                return BiasOffHook.EXIT_INTERRUPTED;
            }
            if (exitCodeOf(ex) == ExitCode.INTERNAL) {
                return internalError(err, ex, debug);
            }
            err.println("zweep: " + oneLine(ex));
            if (debug) {
                ex.printStackTrace(err);
            }
            return exitCodeOf(ex);
        });
        return cl;
    }

    /**
     * Runs {@code command}; an {@link Error} (out of memory, a stack overflow), which passes
     * picocli's exception handler, or anything else thrown out of it, ends as
     * {@link #internalError}.
     */
    static int guarded(IntSupplier command, PrintWriter err, boolean debug) {
        try {
            return command.getAsInt();
        } catch (Throwable ex) {
            return internalError(err, ex, debug);
        }
    }

    /**
     * Says in one line that zweep itself failed and asks for a report (the trace only with
     * {@code --debug}); returns {@link ExitCode#INTERNAL}.
     */
    static int internalError(PrintWriter err, Throwable ex, boolean debug) {
        String what = ex instanceof OutOfMemoryError ? "out of memory (" + oneLine(ex) + ")"
                : ex instanceof StackOverflowError ? "stack overflow" : oneLine(ex);
        err.println("zweep: internal error: " + what
                + (debug ? "; this is a bug in zweep, please report it with the trace below"
                        : "; this is a bug in zweep, please report it with the output of the same command"
                                + " run with --debug"));
        if (debug) {
            ex.printStackTrace(err);
        }
        err.flush();
        return ExitCode.INTERNAL;
    }

    /**
     * One line for a command-line mistake: what was wrong, a suggestion for a near typo, and where
     * the help is, e.g. {@code zweep: unknown option '--frequncy' (did you mean --frequency?); see
     * 'zweep convert --help'}.
     */
    static String usageLine(CommandLine.ParameterException ex) {
        CommandLine cl = ex.getCommandLine();
        if (ex instanceof CommandLine.MissingParameterException && !cl.getUnmatchedArguments().isEmpty()) {
            // picocli checks the required options before the unknown ones: a mistyped required
            // option (--frequncy) is then reported as the missing one, without the typo
            ex = new CommandLine.UnmatchedArgumentException(cl, cl.getUnmatchedArguments());
        }
        String what;
        if (ex instanceof CommandLine.UnmatchedArgumentException u && !u.getUnmatched().isEmpty()) {
            String first = u.getUnmatched().get(0);
            boolean command = !first.startsWith("-") && !cl.getSubcommands().isEmpty();
            boolean option = first.startsWith("-");
            if (option && first.startsWith("--") && first.indexOf('=') > 0) {
                first = first.substring(0, first.indexOf('=')); // --tmeout=3s: the option is --tmeout
            }
            what = (option ? "unknown option '" : command ? "unknown command '" : "unexpected argument '")
                    + first + "'";
            List<String> near = option ? nearOption(first, cl.getCommandSpec()) : List.of();
            if (near.isEmpty()) {
                near = u.getSuggestions().stream().filter(x -> !x.isBlank()).limit(3).toList();
            }
            if (!near.isEmpty()) {
                what += " (did you mean " + String.join(" or ", near) + "?)";
            }
        } else {
            what = oneLine(ex).replaceFirst("^Error: ", "")
                    .replace("' is not a long", "' is not a whole number")
                    .replace("' is not an int", "' is not a whole number")
                    .replace("' is not a double", "' is not a number");
            what = Character.toLowerCase(what.charAt(0)) + what.substring(1);
        }
        return "zweep: " + what + "; see '" + cl.getCommandSpec().qualifiedName() + " --help'";
    }

    /**
     * The visible option of {@code spec} nearest to {@code typed} by edit distance (a dropped,
     * added, changed or swapped letter), when it is near enough to be a typo: picocli's own
     * suggestions only list options that start with the same two letters, so {@code --tmeout}
     * found nothing.
     */
    static List<String> nearOption(String typed, CommandLine.Model.CommandSpec spec) {
        List<String> longNames = spec.options().stream().filter(o -> !o.hidden())
                .flatMap(o -> Arrays.stream(o.names())).filter(n -> n.startsWith("--")).map(n -> n.substring(2))
                .toList();
        return Suggest.nearest(typed.replaceFirst("^-+", ""), longNames).map(n -> List.of("--" + n))
                .orElse(List.of());
    }

    static int exitCodeOf(Throwable ex) {
        if (ex instanceof RunInterruptedException) {
            return BiasOffHook.EXIT_INTERRUPTED;
        }
        if (ex instanceof InvalidInputException || ex instanceof CommandLine.ParameterException) {
            return ExitCode.USAGE;
        }
        if (ex instanceof MeterException || ex instanceof org.zweep.runner.store.StoreException
                || ex instanceof java.io.UncheckedIOException
                || ex instanceof java.io.IOException) {
            return ExitCode.METER;
        }
        // Anything else is zweep's own fault, never to be read as a wiring problem.
        return ExitCode.INTERNAL;
    }

    private static String oneLine(Throwable ex) {
        String m = ex.getMessage();
        if (m == null || m.isBlank()) {
            m = ex.getClass().getSimpleName();
        }
        return m.replace('\n', ' ').strip();
    }
}
