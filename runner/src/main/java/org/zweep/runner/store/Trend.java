package org.zweep.runner.store;

import java.util.List;

/**
 * One check's values across the completed runs of a part, oldest first, and their capability.
 *
 * @param part the part's name or serial asked for
 * @param check the check's name
 * @param parameter the parameter the check judges (its unit follows from the name: {@code cs_f} is in F)
 * @param points one per run that has the check
 * @param capability mean, σ and Cpk of the values against the latest run's limits
 */
public record Trend(String part, String check, String parameter, List<Point> points, Capability capability) {

    /**
     * One run's value.
     *
     * @param runId the run
     * @param started when it started
     * @param serial the part's serial, or null
     * @param lot the lot, or null
     * @param value the check's value, {@code NaN} when the run had none
     * @param result the check's result
     */
    public record Point(String runId, String started, String serial, String lot, double value, String result) {
    }

    private record Raw(Point point, String parameter, Double lsl, Double usl) {
    }

    /** The trend of {@code check} over the completed runs of {@code part} (its name or a serial). */
    public static Trend of(ResultsStore store, String part, String check) {
        List<Raw> raw = store.query("SELECT r.run_id, r.started, r.serial, r.lot, c.check_value, c.result, c.parameter,"
                + " c.lower_limit, c.upper_limit FROM runs r JOIN checks c ON c.run_id = r.run_id"
                + " WHERE (r.part_name = ? OR r.serial = ?) AND c.name = ? AND r.outcome = 'completed'"
                + " ORDER BY r.started, r.run_id", List.of(part, part, check), rs -> {
                    double v = rs.getDouble(5);
                    boolean none = rs.wasNull();
                    Double lo = rs.getDouble(8);
                    if (rs.wasNull()) {
                        lo = null;
                    }
                    Double hi = rs.getDouble(9);
                    if (rs.wasNull()) {
                        hi = null;
                    }
                    return new Raw(new Point(rs.getString(1), rs.getString(2), rs.getString(3), rs.getString(4),
                            none ? Double.NaN : v, rs.getString(6)), rs.getString(7), lo, hi);
                });
        List<Point> points = raw.stream().map(Raw::point).toList();
        Raw last = raw.isEmpty() ? null : raw.get(raw.size() - 1);
        double lsl = last == null || last.lsl() == null ? Double.NaN : last.lsl();
        double usl = last == null || last.usl() == null ? Double.NaN : last.usl();
        List<Double> values = points.stream().map(Point::value).filter(Double::isFinite).toList();
        return new Trend(part, check, last == null ? null : last.parameter(), points, Capability.of(values, lsl, usl));
    }
}
