package org.zweep.runner.testsupport;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;

/**
 * A real PostgreSQL server for a test: Debian's {@code postgresql} package ({@code initdb} and
 * {@code pg_ctl} under {@code /usr/lib/postgresql/VERSION/bin}, the highest version there, or the
 * folder {@code ZWEEP_PG_BIN} names), a fresh cluster in a temporary folder, listening on
 * 127.0.0.1 at a free port, trust authentication for the user {@code zweep}. PostgreSQL refuses
 * to run as root: when the test runs as root the server runs as {@code nobody} (through
 * {@code runuser}). {@link #close} stops it at once and removes the folder.
 */
public final class PostgresServer implements AutoCloseable {
    /** The database user (trusted, superuser of the cluster). */
    public static final String USER = "zweep";

    private final Path dir;
    private final Path bin;
    private final boolean asNobody;
    private final int port;

    private PostgresServer(Path dir, Path bin, boolean asNobody, int port) {
        this.dir = dir;
        this.bin = bin;
        this.asNobody = asNobody;
        this.port = port;
    }

    /**
     * Starts a server.
     *
     * @throws AssertionError naming what is missing when PostgreSQL is not installed (the tests
     *     that need it fail rather than skip; {@code .ci/run} installs it)
     */
    public static PostgresServer start() throws IOException, InterruptedException {
        Path bin = binaries();
        boolean root = "root".equals(System.getProperty("user.name"));
        Path dir = Files.createTempDirectory("zweep-pg");
        if (root) {
            run(List.of("chown", "nobody", dir.toString()), dir, "chown");
            dir.toFile().setReadable(true, false);
            dir.toFile().setExecutable(true, false);
        }
        int port;
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort();
        }
        PostgresServer pg = new PostgresServer(dir, bin, root, port);
        pg.as(List.of(bin.resolve("initdb").toString(), "-D", dir.resolve("data").toString(), "-A", "trust", "-U",
                USER, "-E", "UTF8", "--no-sync", "--no-instructions"), "initdb");
        pg.as(List.of(bin.resolve("pg_ctl").toString(), "-D", dir.resolve("data").toString(), "-l",
                dir.resolve("server.log").toString(), "-w", "-t", "60", "-o",
                "-p " + port + " -k " + dir + " -c listen_addresses=127.0.0.1 -c fsync=off -c max_connections=50",
                "start"), "pg_ctl start");
        return pg;
    }

    /** The JDBC URL of the cluster's {@code postgres} database. */
    public String jdbcUrl() {
        return "jdbc:postgresql://127.0.0.1:" + port + "/postgres?user=" + USER;
    }

    /** The same database as {@code zweep --db} takes it. */
    public String url() {
        return "postgresql://" + USER + "@127.0.0.1:" + port + "/postgres";
    }

    /** A new database on this server, named {@code name}; its {@code postgresql://} URL. */
    public String createDatabase(String name) throws IOException, InterruptedException {
        as(List.of(bin.resolve("createdb").toString(), "-h", "127.0.0.1", "-p", Integer.toString(port), "-U", USER,
                name), "createdb");
        return "postgresql://" + USER + "@127.0.0.1:" + port + "/" + name;
    }

    private static Path binaries() {
        String env = System.getenv("ZWEEP_PG_BIN");
        if (env != null && Files.isExecutable(Path.of(env, "pg_ctl"))) {
            return Path.of(env);
        }
        Path root = Path.of("/usr/lib/postgresql");
        if (Files.isDirectory(root)) {
            try (Stream<Path> s = Files.list(root)) {
                var found = s.map(p -> p.resolve("bin")).filter(p -> Files.isExecutable(p.resolve("pg_ctl")))
                        .max(Comparator.comparingInt(p -> version(p.getParent().getFileName().toString())));
                if (found.isPresent()) {
                    return found.get();
                }
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }
        throw new AssertionError("PostgreSQL's server programs are not installed (looked in /usr/lib/postgresql/*/bin"
                + " and ZWEEP_PG_BIN): install the Debian package postgresql (.ci/run does)");
    }

    private static int version(String name) {
        try {
            return Integer.parseInt(name.replaceAll("\\D.*", ""));
        } catch (NumberFormatException e) {
            return 0;
        }
    }

    private void as(List<String> command, String what) throws IOException, InterruptedException {
        List<String> cmd = new ArrayList<>();
        if (asNobody) {
            cmd.addAll(List.of("runuser", "-u", "nobody", "--"));
        }
        cmd.addAll(command);
        run(cmd, dir, what);
    }

    private static void run(List<String> cmd, Path dir, String what) throws IOException, InterruptedException {
        ProcessBuilder pb = new ProcessBuilder(cmd).directory(dir.toFile()).redirectErrorStream(true);
        Process p = pb.start();
        byte[] out = p.getInputStream().readAllBytes();
        if (!p.waitFor(90, TimeUnit.SECONDS) || p.exitValue() != 0) {
            String log = Files.exists(dir.resolve("server.log"))
                    ? Files.readString(dir.resolve("server.log"), StandardCharsets.UTF_8) : "";
            throw new AssertionError(what + " failed: " + new String(out, StandardCharsets.UTF_8) + log);
        }
    }

    @Override
    public void close() throws IOException, InterruptedException {
        try {
            as(List.of(bin.resolve("pg_ctl").toString(), "-D", dir.resolve("data").toString(), "-m", "immediate",
                    "-w", "stop"), "pg_ctl stop");
        } finally {
            try (Stream<Path> s = Files.walk(dir)) {
                for (Path p : s.sorted(Comparator.reverseOrder()).toList()) {
                    Files.deleteIfExists(p);
                }
            }
        }
    }
}
