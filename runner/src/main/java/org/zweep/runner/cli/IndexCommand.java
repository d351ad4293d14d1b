package org.zweep.runner.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import java.util.stream.Stream;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.store.ResultsStore;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep index DIR...}: adds run folders to the results index, or brings them up to date. */
@Command(name = "index", mixinStandardHelpOptions = true,
        description = {"Adds run folders to the results index (or updates them there): each DIR is a run folder,"
                + " or a folder searched for run folders (e.g. results/).",
            "The folders are the source of truth: indexing a run again replaces what the index held for it,"
                + " so the index can always be rebuilt from them."},
        footer = ExitCode.HELP_LIST)
public final class IndexCommand implements Callable<Integer> {
    /** How deep below a DIR run folders are looked for. */
    static final int DEPTH = 4;

    @Spec
    CommandSpec spec;

    @Mixin
    StoreOptions store;

    @Parameters(arity = "1..*", paramLabel = "DIR", description = "run folders, or folders holding run folders")
    List<Path> dirs;

    @Option(names = "--quiet", description = "print only the total")
    boolean quiet;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        List<Path> runs = new ArrayList<>();
        for (Path d : dirs) {
            runs.addAll(runFolders(d));
        }
        int skipped = 0;
        long points = 0;
        int indexed = 0;
        long t0 = System.nanoTime();
        try (ResultsStore s = store.open()) {
            for (Path r : runs) {
                try {
                    ResultsStore.Indexed i = s.index(r);
                    indexed++;
                    points += i.points();
                    if (!quiet) {
                        out.println("indexed " + i.runId() + " " + i.folder() + " (" + i.points() + " points)");
                    }
                } catch (InvalidInputException | UncheckedIOException e) {
                    skipped++;
                    err.println("zweep: skipped " + r + ": " + e.getMessage());
                }
            }
            out.printf(Locale.ROOT, "%d run%s (%d points) indexed in %s in %.1f s%s%n", indexed,
                    indexed == 1 ? "" : "s", points, s.database().describe(), (System.nanoTime() - t0) / 1e9,
                    skipped > 0 ? "; " + skipped + " skipped" : "");
        }
        return skipped > 0 ? ExitCode.USAGE : ExitCode.OK;
    }

    /** {@code dir} when it is a run folder, else the run folders below it (sorted). */
    static List<Path> runFolders(Path dir) {
        if (!Files.isDirectory(dir)) {
            throw new InvalidInputException(dir + ": no such folder");
        }
        if (Files.isRegularFile(dir.resolve(RunManifest.FILE))) {
            return List.of(dir);
        }
        try (Stream<Path> s = Files.walk(dir, DEPTH)) {
            return s.filter(p -> p.getFileName().toString().equals(RunManifest.FILE) && Files.isRegularFile(p))
                    .map(Path::getParent).sorted().toList();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot search " + dir + ": " + e.getMessage(), e);
        }
    }
}
