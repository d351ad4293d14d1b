package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;

/** The {@code zweep} entry point: the only place that calls {@code System.exit}. */
public final class Main {
    private Main() {
    }

    /** Runs {@code zweep} with {@code args} and exits with its exit code. */
    public static void main(String[] args) {
        PrintWriter out = new PrintWriter(new java.io.OutputStreamWriter(System.out, StandardCharsets.UTF_8), true);
        if (args.length == 1 && (args[0].equals("--version") || args[0].equals("-V"))) {
            // what picocli would print, without building the whole command line first (start-up);
            // two prints, not a string concatenation, whose first use spins up invokedynamic
            out.print("zweep ");
            out.println(ZweepVersion.current());
            out.flush();
            System.exit(ExitCode.OK);
        }
        StartUp.aheadOf(args);
        PrintWriter err = new PrintWriter(new java.io.OutputStreamWriter(System.err, StandardCharsets.UTF_8), true);
        boolean debug = java.util.Arrays.asList(args).contains("--debug");
        // a failure on another thread (a background sync, the live page) is one line too, never a trace
        Thread.setDefaultUncaughtExceptionHandler((t, e) -> Cli.internalError(err, e, debug));
        System.exit(Cli.run(args, out, err));
    }
}
