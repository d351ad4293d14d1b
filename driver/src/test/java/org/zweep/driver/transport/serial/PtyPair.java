package org.zweep.driver.transport.serial;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Assumptions;

/**
 * A pseudo-terminal pair made by {@code socat}, linked at {@code dir/meter} and {@code dir/host};
 * or ({@link #bridgeToTcp}) one pseudo-terminal at {@code dir/host} whose other side is a TCP
 * connection. Without socat the test fails when {@code CI=true} (CI must run the serial tests)
 * and is aborted, visibly, elsewhere. The USBTMC tests use a bridge as their stand-in device node.
 */
public final class PtyPair implements AutoCloseable {
    /** The meter's end; {@code null} for a bridge, where the meter is the TCP server. */
    final Path meter;
    public final Path host;
    private final Process socat;

    private PtyPair(Path meter, Path host, Process socat) {
        this.meter = meter;
        this.host = host;
        this.socat = socat;
    }

    static PtyPair start(Path dir) throws IOException, InterruptedException {
        Path meter = dir.resolve("meter");
        Path host = dir.resolve("host");
        return new PtyPair(meter, host, socat(dir, List.of(meter, host), "pty,raw,echo=0,link=" + meter,
                "pty,raw,echo=0,link=" + host));
    }

    /** A pseudo-terminal at {@code dir/host} bridged to {@code 127.0.0.1:port}, as a serial-to-LAN adapter does. */
    public static PtyPair bridgeToTcp(Path dir, int port) throws IOException, InterruptedException {
        Path host = dir.resolve("host");
        return new PtyPair(null, host, socat(dir, List.of(host), "pty,raw,echo=0,link=" + host,
                "tcp:127.0.0.1:" + port));
    }

    /** Starts socat on two addresses and waits until every link in {@code links} exists. */
    private static Process socat(Path dir, List<Path> links, String a, String b)
            throws IOException, InterruptedException {
        if (!onPath("socat")) {
            String why = "socat is not installed (Debian package socat; .ci/run installs it)";
            if ("true".equals(System.getenv("CI"))) {
                fail(why + ": the serial transport tests must run in CI");
            }
            Assumptions.abort(why);
        }
        Path log = dir.resolve("socat.log");
        Process p = new ProcessBuilder("socat", "-d", "-d", a, b).redirectErrorStream(true)
                .redirectOutput(log.toFile()).start();
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (!links.stream().allMatch(Files::exists)) {
            if (!p.isAlive() || System.nanoTime() > deadline) {
                p.destroyForcibly();
                fail("socat did not create " + links + ": " + Files.readString(log));
            }
            Thread.sleep(20);
        }
        return p;
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

    /** Ends socat, which hangs up both ends (or the pty and the TCP connection). */
    @Override
    public void close() {
        socat.destroy();
        try {
            if (!socat.waitFor(5, TimeUnit.SECONDS)) {
                socat.destroyForcibly();
            }
        } catch (InterruptedException e) {
            socat.destroyForcibly();
            Thread.currentThread().interrupt();
        }
    }
}
