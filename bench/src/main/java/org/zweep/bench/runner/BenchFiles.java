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

    /** A one-step frequency sweep of {@code points} linear points, 100 Hz to 1 MHz, on the simulator bench. */
    static Path sweep(Path dir, Path bench, int points, String integration) {
        return write(dir.resolve("sweep-" + points + ".yaml"),
                sweepYaml("sim:" + bench, dialect(dir, 201), "100 Hz", "1 MHz", points, integration));
    }

    /**
     * A one-step sweep of {@code points} linear frequencies from {@code start} to {@code stop}
     * (both included) of a 100 nF capacitor at 0.5 V, no bias, on the meter at {@code address}.
     */
    static String sweepYaml(String address, String dialect, String start, String stop, int points,
            String integration) {
        return """
                format: zweep-sequence/1
                name: bench-sweep
                meter:
                  address: "%s"
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
                    frequency: {start: %s, stop: %s, points: %d}
                    level: 0.5 V
                    integration: %s
                """.formatted(address, dialect, start, stop, points, integration);
    }

    /** The standard dialect with the simulated bench's ranges and {@code listPoints} list points (0: none). */
    static String dialect(Path dir, int listPoints) {
        Path p = dir.resolve("bench-" + listPoints + ".yaml");
        if (!Files.exists(p)) {
            String std;
            try (var in = BenchFiles.class.getResourceAsStream("/org/zweep/driver/dialect/standard.yaml")) {
                std = new String(in.readAllBytes(), java.nio.charset.StandardCharsets.UTF_8);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
            std = std.replaceFirst("(?m)^  name:.*$", "  name: bench" + listPoints)
                    .replaceFirst("(?m)^  frequency: .* Hz$", "  frequency: 10 .. 20e6 Hz")
                    .replaceFirst("(?m)^  list-points:.*$", "  list-points: " + listPoints);
            if (listPoints == 0) {
                std = std.replaceAll("(?m)^  list-points:.*\n", "").replaceAll("(?m)^  list-[a-z-]+:.*\n", "");
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
