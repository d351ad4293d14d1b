package org.zweep.runner.testsupport;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * The second, independent meter of the tests: {@code src/test/python/quillfen_meter.py} (the
 * made-up Quillfen TQ-7, Python standard library only, sharing no code with zweep) started as a
 * child process on a free loopback port. Its device is series R 0.1 ohm, L 2 nH, C 10 nF behind a
 * fixture of 30 mohm + 15 nH in series and 3 pF across.
 */
public final class QuillfenMeter implements AutoCloseable {
    /** The device the meter holds (the script's R_DUT, L_DUT, C_DUT). */
    public static final double R_OHM = 0.1;
    public static final double L_H = 2e-9;
    public static final double C_F = 10e-9;

    private final Process process;
    private final int port;

    private QuillfenMeter(Process process, int port) {
        this.process = process;
        this.port = port;
    }

    /**
     * Starts the meter.
     *
     * @param seed its noise seed
     * @param pointMs its measuring time per point, in milliseconds
     */
    public static QuillfenMeter start(long seed, double pointMs) {
        Path script = Path.of("src", "test", "python", "quillfen_meter.py").toAbsolutePath();
        if (!Files.isRegularFile(script)) {
            throw new IllegalStateException("no test meter at " + script);
        }
        List<String> cmd = new ArrayList<>(List.of("python3", script.toString(), "--port", "0", "--seed",
                Long.toString(seed), "--point-ms", Double.toString(pointMs)));
        try {
            Process p = new ProcessBuilder(cmd).redirectError(ProcessBuilder.Redirect.INHERIT).start();
            BufferedReader r = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.US_ASCII));
            String first = r.readLine();
            if (first == null || !first.startsWith("port ")) {
                p.destroyForcibly();
                throw new IllegalStateException("the test meter did not say its port: " + first);
            }
            return new QuillfenMeter(p, Integer.parseInt(first.substring(5).strip()));
        } catch (IOException e) {
            throw new UncheckedIOException("cannot start python3 " + script, e);
        }
    }

    /** Its TCP port on 127.0.0.1. */
    public int port() {
        return port;
    }

    /** Its address as zweep takes it. */
    public String address() {
        return "tcp://127.0.0.1:" + port;
    }

    /** The shipped dialect file that describes it. */
    public static Path dialect() {
        return repository().resolve("sequences/quillfen/quillfen-tq7.dialect.yaml");
    }

    /** The folder of the shipped files written for it. */
    public static Path folder() {
        return repository().resolve("sequences/quillfen");
    }

    private static Path repository() {
        return Path.of("..").toAbsolutePath().normalize();
    }

    @Override
    public void close() {
        process.destroy();
        try {
            if (!process.waitFor(5, TimeUnit.SECONDS)) {
                process.destroyForcibly();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            process.destroyForcibly();
        }
    }
}
