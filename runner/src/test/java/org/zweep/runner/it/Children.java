package org.zweep.runner.it;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Child JVMs running {@code zweep}, started as a shell starts a foreground command: SIGINT and
 * SIGTERM at their default disposition ({@code env --default-signal=INT,TERM}, GNU coreutils
 * 8.31 or later), whatever disposition this JVM inherited (a job started in the background by a
 * non-interactive shell ignores SIGINT, and its children would too).
 */
final class Children {
    private Children() {
    }

    /** Starts {@code zweep args} with its output (both streams) going to {@code log}. */
    static Process zweep(Path log, String... args) {
        return zweep(log, java.util.Map.of(), args);
    }

    /** Starts {@code zweep args} with {@code env} added to its environment, its output going to {@code log}. */
    static Process zweep(Path log, java.util.Map<String, String> env, String... args) {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> cmd = new ArrayList<>(List.of("env", "--default-signal=INT,TERM", java, "-cp",
                System.getProperty("java.class.path"), "org.zweep.runner.cli.Main"));
        cmd.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(cmd);
        pb.environment().putAll(env);
        pb.redirectErrorStream(true);
        pb.redirectOutput(log.toFile());
        try {
            return pb.start();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * Starts {@code zweep args} with its standard input and output piped to this JVM (to answer a
     * fixture channel) and its error output going to {@code log}.
     */
    static Process zweepPiped(Path log, String... args) {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> cmd = new ArrayList<>(List.of("env", "--default-signal=INT,TERM", java, "-cp",
                System.getProperty("java.class.path"), "org.zweep.runner.cli.Main"));
        cmd.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(cmd);
        pb.redirectError(log.toFile());
        try {
            return pb.start();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Sends {@code signal} (e.g. {@code INT}, {@code TERM}, {@code KILL}) to {@code p} alone. */
    static void signal(Process p, String signal) {
        try {
            int rc = new ProcessBuilder("kill", "-" + signal, Long.toString(p.pid())).inheritIO().start().waitFor();
            if (rc != 0) {
                throw new AssertionError("kill -" + signal + " " + p.pid() + " gave " + rc);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new AssertionError(e);
        }
    }
}
