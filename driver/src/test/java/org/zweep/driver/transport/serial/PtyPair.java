package org.zweep.driver.transport.serial;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Assumptions;

/**
 * A pseudo-terminal pair made by {@code socat}, linked at {@code dir/meter} and {@code dir/host}.
 * Without socat the test fails when {@code CI=true} (CI must run the serial tests) and is aborted,
 * visibly, elsewhere.
 */
final class PtyPair implements AutoCloseable {
    final Path meter;
    final Path host;
    private final Process socat;

    private PtyPair(Path meter, Path host, Process socat) {
        this.meter = meter;
        this.host = host;
        this.socat = socat;
    }

    static PtyPair start(Path dir) throws IOException, InterruptedException {
        if (!onPath("socat")) {
            String why = "socat is not installed (Debian package socat; .ci/run installs it)";
            if ("true".equals(System.getenv("CI"))) {
                fail(why + ": the serial transport tests must run in CI");
            }
            Assumptions.abort(why);
        }
        Path meter = dir.resolve("meter");
        Path host = dir.resolve("host");
        Process p = new ProcessBuilder("socat", "-d", "-d", "pty,raw,echo=0,link=" + meter,
                "pty,raw,echo=0,link=" + host).redirectErrorStream(true)
                .redirectOutput(dir.resolve("socat.log").toFile()).start();
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (!(Files.exists(meter) && Files.exists(host))) {
            if (!p.isAlive() || System.nanoTime() > deadline) {
                p.destroyForcibly();
                fail("socat did not create the pty pair: " + Files.readString(dir.resolve("socat.log")));
            }
            Thread.sleep(20);
        }
        return new PtyPair(meter, host, p);
    }

    private static boolean onPath(String tool) {
        String path = System.getenv("PATH");
        if (path == null) {
            return false;
        }
        for (String d : path.split(java.io.File.pathSeparator)) {
            if (Files.isExecutable(Path.of(d, tool))) {
                return true;
            }
        }
        return false;
    }

    /** Ends socat, which hangs up both ends of the pair. */
    @Override
    public void close() throws InterruptedException {
        socat.destroy();
        if (!socat.waitFor(5, TimeUnit.SECONDS)) {
            socat.destroyForcibly();
        }
    }
}
