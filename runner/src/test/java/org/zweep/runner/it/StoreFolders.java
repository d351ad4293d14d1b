package org.zweep.runner.it;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.stream.Stream;
import org.zweep.runner.results.RunId;
import org.zweep.runner.results.RunManifest;

/**
 * Run folders for the results-store tests: real runs of the shipped capacitor sequence on the
 * simulator at {@code timing=none}, and copies of them as other parts (a copy with its own run
 * id, serial, lot, station and start is another run to the index).
 */
final class StoreFolders {
    private StoreFolders() {
    }

    /** Runs the shipped incoming-inspection sequence once into {@code out} (seeded), indexing it in {@code db}. */
    static Sims.Result measure(Path out, long seed, String serial, String lot, String db) {
        Path seq = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");
        List<String> args = new ArrayList<>(List.of("run", seq.toString(), "--meter",
                "sim:" + Sims.benchOf(seq) + "?timing=none", "--out", out.toString(), "--quiet", "--seed",
                Long.toString(seed), "--serial", serial, "--lot", lot, "--station", "bench-1"));
        if (db == null) {
            args.add("--no-index");
        } else {
            args.addAll(List.of("--db", db));
        }
        return Sims.zweep(args.toArray(String[]::new));
    }

    /**
     * Copies the run folder {@code source} to {@code target} as the run of another part: new id
     * (started {@code minutes} after 2026-11-02T08:00Z), serial, lot, station and verdict.
     */
    static void copyAs(Path source, Path target, int minutes, String serial, String lot, String station,
            String verdict) {
        try (Stream<Path> s = Files.walk(source)) {
            for (Path p : s.sorted(Comparator.naturalOrder()).toList()) {
                Path t = target.resolve(source.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(t);
                } else if (!p.getFileName().toString().equals("run.lock")) {
                    Files.copy(p, t);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        Instant started = Instant.parse("2026-11-02T08:00:00Z").plusSeconds(60L * minutes);
        RunManifest m = RunManifest.read(target.resolve("run.json"));
        RunManifest copy = m.toBuilder().started(started.toString()).ended(started.plusSeconds(30).toString())
                .verdict(verdict).id(RunId.next(started)).identity(new RunManifest.Identity(serial, lot, "ana", station))
                .build();
        copy.write(target.resolve("run.json"));
    }

    /** The data lines of {@code points.csv} in {@code folder}. */
    static int points(Path folder) {
        try (Stream<String> lines = Files.lines(folder.resolve("points.csv"))) {
            return (int) lines.skip(1).filter(l -> !l.isEmpty()).count();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
