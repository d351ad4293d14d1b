package org.zweep.runner.store;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Types;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.UUID;
import org.flywaydb.core.Flyway;
import org.flywaydb.core.api.FlywayException;
import org.sqlite.SQLiteConfig;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.verdict.CheckOutcome;

/**
 * The results index: run folders in a database (runs, parts, lots, stations, steps, points,
 * checks, fits), SQLite or PostgreSQL, its schema kept by Flyway. Indexing a run is one
 * transaction keyed by the run's id, so a run indexed twice (or by two processes at once) is
 * there once. One connection per store; not thread-safe (use one store per thread).
 */
public final class ResultsStore implements AutoCloseable {
    /** Where the schema's migrations are, on the class path. */
    static final String MIGRATIONS = "classpath:org/zweep/runner/store/migration";
    /** The tables, in the order a rebuild compares them. */
    public static final List<String> TABLES = List.of("runs", "parts", "lots", "stations", "steps", "points", "checks",
            "fits");
    private static final int ATTEMPTS = 8;

    private final Database db;
    private final Connection connection;

    private ResultsStore(Database db, Connection connection) {
        this.db = db;
        this.connection = connection;
    }

    /**
     * Opens the index, creating or upgrading its schema first.
     *
     * @throws StoreException when the database cannot be reached or migrated (the reason in one line)
     */
    public static ResultsStore open(Database db) {
        try {
            if (!db.postgres()) {
                Path parent = db.sqliteFile().getParent();
                if (parent != null) {
                    Files.createDirectories(parent);
                }
            }
            migrate(db);
            // outside index() no transaction is open: on SQLite an open one would hold the write lock
            return new ResultsStore(db, connect(db));
        } catch (SQLException | FlywayException e) {
            throw new StoreException(db.describe() + ": " + oneLine(e), e);
        } catch (IOException e) {
            throw new StoreException(db.describe() + ": cannot create its folder: " + e.getMessage(), e);
        }
    }

    /** Where this index is, for people. */
    public Database database() {
        return db;
    }

    private static Connection connect(Database db) throws SQLException {
        if (db.postgres()) {
            return DriverManager.getConnection(db.jdbcUrl(), db.properties());
        }
        SQLiteConfig config = new SQLiteConfig();
        config.setBusyTimeout(60_000);
        // the write lock is taken when a transaction begins, so that two writers never deadlock
        config.setTransactionMode(SQLiteConfig.TransactionMode.IMMEDIATE);
        return DriverManager.getConnection(db.jdbcUrl(), config.toProperties());
    }

    /**
     * Brings the schema up to date. On PostgreSQL Flyway serialises concurrent migrations itself
     * (an advisory lock); on SQLite a lock file beside the database does.
     */
    private static void migrate(Database db) throws IOException {
        Flyway flyway = Flyway.configure().dataSource(db.jdbcUrl(), db.user(), db.password())
                .locations(MIGRATIONS).table("zweep_schema_history").load();
        if (db.postgres()) {
            flyway.migrate();
            return;
        }
        Path lockFile = db.sqliteFile().resolveSibling(db.sqliteFile().getFileName() + ".migrate-lock");
        try (FileChannel ch = FileChannel.open(lockFile, StandardOpenOption.CREATE, StandardOpenOption.WRITE);
                FileLock lock = ch.lock()) {
            flyway.migrate();
        }
    }

    /** What indexing one run folder did. */
    public record Indexed(String runId, Path folder, int points, int checks, int fits) {
    }

    /**
     * Indexes the run folder {@code dir} (replacing what the index held for the same run id).
     * One transaction: either all of the run is in the index or none of it; retried when another
     * writer holds the database.
     *
     * @throws InvalidInputException when {@code dir} is not a readable run folder
     * @throws StoreException when the database refuses the write
     */
    public Indexed index(Path dir) {
        Path folder = dir.toAbsolutePath().normalize();
        RunData run = RunData.read(folder);
        // the analysis is made before the transaction (the write lock is held only for writing); the
        // points are streamed from the folder into the batch, never all held: a run of a million
        // points is indexed in the heap a run of a thousand needs
        AnalysisResult analysis = analyse(run);
        String runId = idOf(run.manifest());
        SQLException last = null;
        for (int attempt = 1; attempt <= ATTEMPTS; attempt++) {
            try {
                connection.setAutoCommit(false);
                Indexed done = write(runId, folder, run, analysis);
                connection.commit();
                connection.setAutoCommit(true);
                return done;
            } catch (SQLException e) {
                last = e;
                rollbackQuietly();
                if (!retryable(e)) {
                    break;
                }
                pause(attempt);
            }
        }
        throw new StoreException(db.describe() + ": cannot index " + folder + ": " + oneLine(last), last);
    }

    /**
     * The run's id; for a folder written before ids existed, a name-based UUID (version 3) of its
     * host, start time and sequence hash, so that indexing it again finds the same run.
     */
    static String idOf(RunManifest m) {
        if (m.id() != null && !m.id().isBlank()) {
            return m.id();
        }
        String key = m.host() + "|" + m.started() + "|" + (m.sequence() == null ? "" : m.sequence().sha256());
        return UUID.nameUUIDFromBytes(key.getBytes(StandardCharsets.UTF_8)).toString();
    }

    /** Whether the folder's points.csv holds a line after its header (read no further than that). */
    /** The analysis of the run (check values, fits), or null when it cannot be made (no points yet). */
    private static AnalysisResult analyse(RunData run) {
        try {
            return Analysis.analyze(run.requirePoints(), null);
        } catch (RuntimeException e) {
            return null; // the run and its points are still indexed; checks keep their recorded results
        }
    }

    private Indexed write(String runId, Path folder, RunData run, AnalysisResult analysis)
            throws SQLException {
        RunManifest m = run.manifest();
        RunManifest.Identity id = m.identityOrNone();
        RunManifest.PartInfo part = m.part();
        RunManifest.CompensationInfo comp = m.compensation();
        try (PreparedStatement s = connection.prepareStatement("INSERT INTO runs (run_id, folder, sequence_name,"
                + " sequence_sha256, part_name, part_kind, nominal, nominal_unit, tolerance_percent, serial, lot,"
                + " operator_name, station, meter_address, meter_identity, host, seed, compensation_mode,"
                + " compensation_source, compensation_reused_from, compensation_measured_at, started, ended, outcome,"
                + " verdict, planned, measured) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)"
                + " ON CONFLICT (run_id) DO UPDATE SET folder = excluded.folder, sequence_name = excluded.sequence_name,"
                + " sequence_sha256 = excluded.sequence_sha256, part_name = excluded.part_name,"
                + " part_kind = excluded.part_kind, nominal = excluded.nominal, nominal_unit = excluded.nominal_unit,"
                + " tolerance_percent = excluded.tolerance_percent, serial = excluded.serial, lot = excluded.lot,"
                + " operator_name = excluded.operator_name, station = excluded.station,"
                + " meter_address = excluded.meter_address, meter_identity = excluded.meter_identity,"
                + " host = excluded.host, seed = excluded.seed, compensation_mode = excluded.compensation_mode,"
                + " compensation_source = excluded.compensation_source,"
                + " compensation_reused_from = excluded.compensation_reused_from,"
                + " compensation_measured_at = excluded.compensation_measured_at, started = excluded.started,"
                + " ended = excluded.ended, outcome = excluded.outcome, verdict = excluded.verdict,"
                + " planned = excluded.planned, measured = excluded.measured")) {
            int i = 1;
            s.setString(i++, runId);
            s.setString(i++, folder.toString());
            s.setString(i++, m.sequence() == null ? null : m.sequence().name());
            s.setString(i++, m.sequence() == null ? null : m.sequence().sha256());
            s.setString(i++, part == null ? null : part.name());
            s.setString(i++, part == null ? null : part.kind());
            number(s, i++, part == null ? null : part.nominal());
            s.setString(i++, part == null ? null : part.unit());
            number(s, i++, part == null ? null : part.tolerancePercent());
            s.setString(i++, id.serial());
            s.setString(i++, id.lot());
            s.setString(i++, id.operator());
            s.setString(i++, id.station());
            s.setString(i++, m.meter() == null ? null : m.meter().address());
            s.setString(i++, m.meter() == null ? null : m.meter().identity());
            s.setString(i++, m.host());
            if (m.seed() == null) {
                s.setNull(i++, Types.BIGINT);
            } else {
                s.setLong(i++, m.seed());
            }
            s.setString(i++, comp == null ? null : comp.mode());
            s.setString(i++, comp == null ? null : comp.source());
            s.setString(i++, comp == null ? null : comp.reusedFrom());
            s.setString(i++, comp == null ? null : comp.measuredAt());
            s.setString(i++, m.started());
            s.setString(i++, m.ended());
            s.setString(i++, m.outcome());
            s.setString(i++, m.verdict());
            integer(s, i++, m.counts() == null ? null : m.counts().planned());
            integer(s, i++, m.counts() == null ? null : m.counts().measured());
            s.executeUpdate();
        }
        for (String child : List.of("steps", "points", "checks", "fits")) {
            try (PreparedStatement d = connection.prepareStatement("DELETE FROM " + child + " WHERE run_id = ?")) {
                d.setString(1, runId);
                d.executeUpdate();
            }
        }
        if (id.station() != null) {
            insertKey("INSERT INTO stations (name) VALUES (?) ON CONFLICT DO NOTHING", id.station());
        }
        if (id.lot() != null) {
            insertKey("INSERT INTO lots (name) VALUES (?) ON CONFLICT DO NOTHING", id.lot());
        }
        if (id.serial() != null) {
            try (PreparedStatement s = connection.prepareStatement(
                    "INSERT INTO parts (serial, part_name, kind) VALUES (?,?,?) ON CONFLICT DO NOTHING")) {
                s.setString(1, id.serial());
                s.setString(2, part == null || part.name() == null ? "" : part.name());
                s.setString(3, part == null ? null : part.kind());
                s.executeUpdate();
            }
        }
        if (m.steps() != null) {
            try (PreparedStatement s = connection.prepareStatement(
                    "INSERT INTO steps (run_id, step_index, name, points) VALUES (?,?,?,?)")) {
                for (RunManifest.StepInfo st : m.steps()) {
                    s.setString(1, runId);
                    s.setInt(2, st.index());
                    s.setString(3, st.name());
                    s.setInt(4, st.points());
                    s.addBatch();
                }
                s.executeBatch();
            }
        }
        int points = writePoints(runId, run);
        int checks = writeChecks(runId, m, analysis);
        int fits = writeFits(runId, analysis);
        return new Indexed(runId, folder, points, checks, fits);
    }

    private int writePoints(String runId, RunData run) throws SQLException {
        try (PreparedStatement s = connection.prepareStatement("INSERT INTO points (run_id, point_no, step, step_index,"
                + " repeat_no, quantity, wiring, frequency_hz, drive, drive_level, bias_mode, bias, r_ohm, x_ohm, ratio,"
                + " status, point_check, measured_at) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)")) {
            int[] n = {0};
            try {
                run.forEachRow(r -> {
                    try {
                        addPoint(s, runId, r);
                        if (++n[0] % 1000 == 0) {
                            s.executeBatch();
                        }
                    } catch (SQLException e) {
                        throw new PointWriteFailure(e);
                    }
                });
            } catch (PointWriteFailure e) {
                throw e.sql;
            }
            s.executeBatch();
            return n[0];
        }
    }

    /** An SQL failure carried out of the row callback. */
    private static final class PointWriteFailure extends RuntimeException {
        final SQLException sql;

        PointWriteFailure(SQLException sql) {
            super(sql);
            this.sql = sql;
        }
    }

    private static void addPoint(PreparedStatement s, String runId, PointRow r) throws SQLException {
        int i = 1;
        s.setString(i++, runId);
        s.setInt(i++, r.point());
        s.setString(i++, r.step());
        s.setInt(i++, r.key().stepIndex());
        s.setInt(i++, r.repeat());
        s.setString(i++, r.quantity());
        s.setString(i++, r.wiring());
        number(s, i++, r.frequencyHz());
        s.setString(i++, r.driveMode());
        number(s, i++, r.level());
        s.setString(i++, r.biasMode());
        number(s, i++, r.bias());
        number(s, i++, r.rOhm());
        number(s, i++, r.xOhm());
        number(s, i++, r.ratio());
        s.setString(i++, r.status());
        s.setString(i++, r.check().isEmpty() ? null : r.check());
        s.setString(i++, r.time().toString());
        s.addBatch();
    }

    private int writeChecks(String runId, RunManifest m, AnalysisResult analysis) throws SQLException {
        List<RunManifest.CheckInfo> infos = m.checks() == null ? List.of() : m.checks();
        List<CheckOutcome> outcomes = analysis == null ? List.of() : analysis.checks();
        try (PreparedStatement s = connection.prepareStatement("INSERT INTO checks (run_id, check_index, name,"
                + " parameter, step, frequency_hz, lower_limit, upper_limit, check_value, value_count, result,"
                + " expanded_u, probability) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?)")) {
            for (int k = 0; k < infos.size(); k++) {
                RunManifest.CheckInfo c = infos.get(k);
                CheckOutcome o = k < outcomes.size() && outcomes.get(k).name().equals(c.name()) ? outcomes.get(k) : null;
                int i = 1;
                s.setString(i++, runId);
                s.setInt(i++, k);
                s.setString(i++, c.name());
                s.setString(i++, c.parameter());
                s.setString(i++, c.step());
                number(s, i++, c.frequencyHz());
                number(s, i++, c.min());
                number(s, i++, c.max());
                number(s, i++, o == null ? null : o.lastValue());
                integer(s, i++, o == null ? null : o.values().size());
                // the result the run recorded; the analysis's when the run recorded none (older folders)
                s.setString(i++, c.result() != null ? c.result() : o == null ? null : o.result());
                number(s, i++, c.expandedU());
                number(s, i++, c.probability());
                s.addBatch();
            }
            s.executeBatch();
            return infos.size();
        }
    }

    private int writeFits(String runId, AnalysisResult analysis) throws SQLException {
        if (analysis == null) {
            return 0;
        }
        int n = 0;
        try (PreparedStatement s = connection.prepareStatement("INSERT INTO fits (run_id, step_index, sweep_no, sweep,"
                + " model, parameter, fit_value, sigma) VALUES (?,?,?,?,?,?,?,?)")) {
            for (StepResult step : analysis.steps()) {
                int sweepNo = 0;
                for (StepResult.SweepFit f : step.fits()) {
                    if (f.fit() == null) {
                        sweepNo++;
                        continue;
                    }
                    for (Map.Entry<String, Double> p : f.fit().parameters().entrySet()) {
                        s.setString(1, runId);
                        s.setInt(2, step.index());
                        s.setInt(3, sweepNo);
                        s.setString(4, f.sweep().describe());
                        s.setString(5, f.fit().model().id());
                        s.setString(6, p.getKey());
                        number(s, 7, p.getValue());
                        number(s, 8, f.fit().sigma().get(p.getKey()));
                        s.addBatch();
                        n++;
                    }
                    if (f.fit().srfHz() != null) {
                        s.setString(1, runId);
                        s.setInt(2, step.index());
                        s.setInt(3, sweepNo);
                        s.setString(4, f.sweep().describe());
                        s.setString(5, f.fit().model().id());
                        s.setString(6, "srf_hz");
                        number(s, 7, f.fit().srfHz());
                        s.setNull(8, Types.DOUBLE);
                        s.addBatch();
                        n++;
                    }
                    sweepNo++;
                }
            }
            s.executeBatch();
        }
        return n;
    }

    private void insertKey(String sql, String key) throws SQLException {
        try (PreparedStatement s = connection.prepareStatement(sql)) {
            s.setString(1, key);
            s.executeUpdate();
        }
    }

    /** A non-finite or null number is stored as NULL (unknown). */
    private static void number(PreparedStatement s, int i, Double v) throws SQLException {
        if (v == null || !Double.isFinite(v)) {
            s.setNull(i, Types.DOUBLE);
        } else {
            s.setDouble(i, v);
        }
    }

    private static void integer(PreparedStatement s, int i, Integer v) throws SQLException {
        if (v == null) {
            s.setNull(i, Types.INTEGER);
        } else {
            s.setInt(i, v);
        }
    }

    /** Runs {@code sql} with {@code args} and hands each row to {@code row}; read-only. */
    <T> List<T> query(String sql, List<Object> args, RowReader<T> row) {
        try (PreparedStatement s = connection.prepareStatement(sql)) {
            for (int i = 0; i < args.size(); i++) {
                s.setObject(i + 1, args.get(i));
            }
            List<T> out = new ArrayList<>();
            try (ResultSet rs = s.executeQuery()) {
                while (rs.next()) {
                    out.add(row.read(rs));
                }
            }
            return out;
        } catch (SQLException e) {
            throw new StoreException(db.describe() + ": " + oneLine(e), e);
        }
    }

    /** Reads one row of a result set. */
    @FunctionalInterface
    interface RowReader<T> {
        T read(ResultSet rs) throws SQLException;
    }

    /**
     * Every table's rows as text, sorted, table by table in {@link #TABLES} order: what a rebuild
     * from the folders must reproduce.
     */
    public Map<String, List<String>> contents() {
        Map<String, List<String>> out = new java.util.LinkedHashMap<>();
        for (String t : TABLES) {
            List<String> rows = query("SELECT * FROM " + t, List.of(), rs -> {
                StringBuilder b = new StringBuilder();
                int n = rs.getMetaData().getColumnCount();
                for (int i = 1; i <= n; i++) {
                    Object o = rs.getObject(i);
                    b.append(i > 1 ? "|" : "").append(o instanceof Number num ? canonical(num) : String.valueOf(o));
                }
                return b.toString();
            });
            out.put(t, rows.stream().sorted().toList());
        }
        return out;
    }

    /** Integers as integers, other numbers as the shortest double text, so that both databases print alike. */
    private static String canonical(Number n) {
        if (n instanceof Integer || n instanceof Long || n instanceof Short) {
            return Long.toString(n.longValue());
        }
        double d = n.doubleValue();
        return d == Math.rint(d) && Math.abs(d) < 1e15 ? Long.toString((long) d) : Double.toString(d);
    }

    private static boolean retryable(SQLException e) {
        String state = e.getSQLState();
        String msg = String.valueOf(e.getMessage());
        // PostgreSQL: serialization failure, deadlock, unique violation in a race; SQLite: busy, locked
        return "40001".equals(state) || "40P01".equals(state) || "23505".equals(state)
                || msg.contains("SQLITE_BUSY") || msg.contains("SQLITE_LOCKED") || msg.contains("database is locked");
    }

    private static void pause(int attempt) {
        try {
            Thread.sleep(Math.min(2000, 25L << attempt) + (long) (Math.random() * 50));
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    private void rollbackQuietly() {
        try {
            connection.rollback();
            connection.setAutoCommit(true);
        } catch (SQLException ignored) {
            // the connection is gone; the next use says so
        }
    }

    static String oneLine(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null && (t.getMessage() == null || t instanceof FlywayException)) {
            t = t.getCause();
        }
        String m = t.getMessage() == null ? t.getClass().getSimpleName() : t.getMessage();
        return m.replaceAll("\\s+", " ").strip();
    }

    @Override
    public void close() {
        try {
            connection.close();
        } catch (SQLException e) {
            throw new StoreException(db.describe() + ": " + oneLine(e), e);
        }
    }

}
