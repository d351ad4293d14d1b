package org.zweep.bench.runner;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;

/** Generated sequence and dialect files for the runner figures. */
final class BenchFiles {
    private BenchFiles() {
    }

    /** The repository's shipped capacitor bench. */
    static Path capacitorBench(Path repo) {
        return repo.resolve("sequences/benches/kp-c0805-104.bench.yaml").toAbsolutePath();
    }

    /** A one-step frequency sweep of {@code points} linear points on the simulator bench. */
    static Path sweep(Path dir, Path bench, int points, String integration) {
        String yaml = """
                format: zweep-sequence/1
                name: bench-sweep
                meter:
                  address: "sim:%s"
                  dialect: "%s"
                safety:
                  max_bias_voltage: 0 V
                  max_bias_current: 0 A
                  max_level_voltage: 1 V
                  max_level_current: 0 A
                part:
                  kind: capacitor
                  nominal: 100 nF
                  tolerance: K
                steps:
                  - name: sweep
                    frequency: {start: 100 Hz, stop: 1 MHz, points: %d}
                    level: 0.5 V
                    integration: %s
                """.formatted(bench, dialect(dir, 201), points, integration);
        return write(dir.resolve("sweep-" + points + ".yaml"), yaml);
    }

    /** The standard dialect with the simulated bench's ranges and {@code listPoints} list points (0: none). */
    static String dialect(Path dir, int listPoints) {
        Path p = dir.resolve("bench-" + listPoints + ".dialect");
        if (!Files.exists(p)) {
            String std;
            try (var in = BenchFiles.class.getResourceAsStream("/org/zweep/driver/dialect/standard.dialect")) {
                std = new String(in.readAllBytes(), java.nio.charset.StandardCharsets.UTF_8);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
            std = std.replaceFirst("(?m)^name\\s*=.*$", "name        = bench" + listPoints)
                    .replaceFirst("(?m)^frequency\\s+=.*$", "frequency          = 10 .. 20e6 Hz")
                    .replaceFirst("(?m)^list-points\\s*=.*$", "list-points        = " + listPoints);
            if (listPoints == 0) {
                std = std.replaceAll("(?m)^list-[a-z-]+\\s*=.*\n", "");
            }
            write(p, std);
        }
        return p.toString();
    }

    static Path write(Path p, String text) {
        try {
            Files.createDirectories(p.getParent());
            Files.writeString(p, text);
            return p;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
