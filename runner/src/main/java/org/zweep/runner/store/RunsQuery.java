package org.zweep.runner.store;

import java.util.ArrayList;
import java.util.List;

/**
 * Which runs to list; each criterion {@code null} when not asked for.
 *
 * @param part the part's name or serial
 * @param lot the lot
 * @param since runs started at or after this instant (ISO-8601)
 * @param verdict {@code pass}, {@code fail} or {@code none}
 */
public record RunsQuery(String part, String lot, String since, String verdict) {
    /** Every run. */
    public static final RunsQuery ALL = new RunsQuery(null, null, null, null);

    /**
     * One row of a run list.
     *
     * @param runId the run's id
     * @param started when it started (ISO-8601)
     * @param partName the part's name (type)
     * @param serial the part's serial, or null
     * @param lot the lot, or null
     * @param station the station, or null
     * @param outcome how the run ended
     * @param verdict its verdict
     * @param measured the points measured
     * @param folder the run folder
     */
    public record Row(String runId, String started, String partName, String serial, String lot, String station,
            String outcome, String verdict, Integer measured, String folder) {
    }

    /** The runs of {@code store} that match, oldest first. */
    public List<Row> run(ResultsStore store) {
        StringBuilder sql = new StringBuilder("SELECT run_id, started, part_name, serial, lot, station, outcome, verdict,"
                + " measured, folder FROM runs WHERE 1 = 1");
        List<Object> args = new ArrayList<>();
        if (part != null) {
            sql.append(" AND (part_name = ? OR serial = ?)");
            args.add(part);
            args.add(part);
        }
        if (lot != null) {
            sql.append(" AND lot = ?");
            args.add(lot);
        }
        if (since != null) {
            sql.append(" AND started >= ?");
            args.add(since);
        }
        if (verdict != null) {
            sql.append(" AND verdict = ?");
            args.add(verdict);
        }
        sql.append(" ORDER BY started, run_id");
        return store.query(sql.toString(), args, rs -> new Row(rs.getString(1), rs.getString(2), rs.getString(3),
                rs.getString(4), rs.getString(5), rs.getString(6), rs.getString(7), rs.getString(8),
                (Integer) (rs.getObject(9) == null ? null : rs.getInt(9)), rs.getString(10)));
    }
}
