package org.zweep.runner.cli;

import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.time.Instant;
import java.util.Locale;
import java.util.Set;
import org.zweep.driver.dialect.Dialect;
import org.zweep.runner.results.Json;
import org.zweep.runner.results.RunId;
import org.zweep.runner.results.RunManifest;

/**
 * Start-up work done ahead, on a background daemon thread, for the subcommands that run a
 * sequence: while the main thread builds the command line, the second core loads and first runs
 * what a run needs next (the YAML reader and a dialect's, Jackson's serializers of the run
 * manifest, the secure random source of run ids, SHA-256 for the sequence copy, locale data for
 * number formatting). Nothing it makes is kept or shared: it only loads classes and fills the
 * libraries' own caches, so a run is the same with or without it; any failure is ignored (the
 * run meets it again, and reports it, where it really happens).
 */
final class StartUp {
    /** The subcommands that read a sequence and write a run folder. */
    private static final Set<String> RUNNING = Set.of("run", "lot", "demo");

    private StartUp() {
    }

    /** Begins the warm-up when {@code args} name a subcommand that runs a sequence; returns at once. */
    static void aheadOf(String[] args) {
        if (args.length == 0 || !RUNNING.contains(args[0]) || java.util.Arrays.asList(args).contains("--help")) {
            return;
        }
        Thread t = new Thread(StartUp::warmUp, "zweep-start-up");
        t.setDaemon(true);
        t.setPriority(Thread.MIN_PRIORITY);
        t.start();
    }

    private static void warmUp() {
        try {
            Dialect.load("standard");
            Json.prepare(RunManifest.class, java.util.Map.class);
            RunId.next(Instant.now());
            MessageDigest.getInstance("SHA-256").digest(new byte[1]);
            String.format(Locale.ROOT, "%.6g %s", 1.0, Instant.EPOCH);
        } catch (RuntimeException | LinkageError | NoSuchAlgorithmException e) {
            // only a warm-up: the run meets the same failure where it matters, and reports it
        }
    }
}
