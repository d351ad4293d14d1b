package org.zweep.runner.store;

import java.net.URI;
import java.net.URISyntaxException;
import java.net.URLDecoder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.Properties;
import org.zweep.driver.InvalidInputException;

/**
 * Where the results index lives: a SQLite file (the embedded default) or a PostgreSQL server.
 *
 * @param jdbcUrl the JDBC URL
 * @param user the user name for PostgreSQL, or null
 * @param password the password for PostgreSQL, or null
 * @param sqliteFile the SQLite file, or null for PostgreSQL
 */
public record Database(String jdbcUrl, String user, String password, Path sqliteFile) {

    /** Whether this is a PostgreSQL server. */
    public boolean postgres() {
        return sqliteFile == null;
    }

    /** Where it is, for people: the file, or the URL without its password. */
    public String describe() {
        return sqliteFile != null ? sqliteFile.toString()
                : jdbcUrl.replaceAll("(?i)([?&]password=)[^&]*", "$1***") + (user != null ? " (user " + user + ")" : "");
    }

    /** The connection properties (user and password when given). */
    Properties properties() {
        Properties p = new Properties();
        if (user != null) {
            p.setProperty("user", user);
        }
        if (password != null) {
            p.setProperty("password", password);
        }
        return p;
    }

    /**
     * The database {@code option} names, or else the station file's, or else the default
     * {@code index.sqlite} beside the station file ({@code ~/.zweep/index.sqlite}).
     *
     * @param option {@code --db}: a file path, {@code postgresql://[user[:password]@]host[:port]/name},
     *     or a {@code jdbc:postgresql:} or {@code jdbc:sqlite:} URL; null when not given
     */
    public static Database choose(String option, StationFile station, Map<String, String> env) {
        if (option != null) {
            return parse(option, "--db");
        }
        if (station.database() != null) {
            return parse(station.database(), station.file() + ": database");
        }
        return sqlite(StationFile.location(env).resolveSibling("index.sqlite"));
    }

    /** A SQLite database in {@code file}. */
    public static Database sqlite(Path file) {
        Path f = file.toAbsolutePath().normalize();
        return new Database("jdbc:sqlite:" + f, null, null, f);
    }

    /**
     * Reads a database name.
     *
     * @param what what it came from, for the message
     * @throws InvalidInputException for a URL that is not one of the accepted forms
     */
    public static Database parse(String text, String what) {
        String t = text.strip();
        if (t.isEmpty()) {
            throw new InvalidInputException(what + ": empty database name");
        }
        String lower = t.toLowerCase(java.util.Locale.ROOT);
        if (lower.startsWith("jdbc:postgresql:")) {
            return new Database(t, null, null, null);
        }
        if (lower.startsWith("jdbc:sqlite:")) {
            return named(sqlite(Path.of(t.substring("jdbc:sqlite:".length()))), what);
        }
        if (lower.startsWith("postgresql://") || lower.startsWith("postgres://")) {
            URI u;
            try {
                u = new URI(t);
            } catch (URISyntaxException e) {
                throw new InvalidInputException(what + ": not a valid PostgreSQL URL: " + e.getMessage());
            }
            if (u.getHost() == null || u.getPath() == null || u.getPath().length() < 2) {
                throw new InvalidInputException(what + ": a PostgreSQL URL names the host and the database: "
                        + "postgresql://[USER[:PASSWORD]@]HOST[:PORT]/DATABASE");
            }
            String user = null;
            String password = null;
            if (u.getRawUserInfo() != null) {
                String[] up = u.getRawUserInfo().split(":", 2);
                user = URLDecoder.decode(up[0], StandardCharsets.UTF_8);
                password = up.length > 1 ? URLDecoder.decode(up[1], StandardCharsets.UTF_8) : null;
            }
            String url = "jdbc:postgresql://" + u.getHost() + (u.getPort() > 0 ? ":" + u.getPort() : "") + u.getRawPath()
                    + (u.getRawQuery() != null ? "?" + u.getRawQuery() : "");
            return new Database(url, user, password, null);
        }
        if (lower.matches("^[a-z][a-z0-9+.-]*://.*")) {
            throw new InvalidInputException(what + ": '" + t + "' is neither a file nor a postgresql:// URL");
        }
        return named(sqlite(Path.of(t)), what);
    }

    /**
     * A SQLite file someone named: its folder must exist. zweep creates the file, and the default
     * folder ({@code ~/.zweep}), but not a folder it was told about: a mistyped path or a lab share
     * that is not mounted would otherwise get an index of its own nobody looks at.
     */
    private static Database named(Database db, String what) {
        Path folder = db.sqliteFile().getParent();
        if (folder != null && !Files.isDirectory(folder)) {
            throw new InvalidInputException(what + ": " + (Files.exists(folder) ? folder + " is not a folder"
                    : "the folder " + folder + " does not exist") + " (zweep creates the index file, not its folder)");
        }
        return db;
    }
}
