package org.zweep.runner.results;

import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

/**
 * The {@code points.csv} format: UTF-8, comma-separated, a header row, numbers in
 * {@link Double#toString(double)} form, an empty cell for not applicable. Text cells containing a
 * comma, a quote or a line break are quoted as RFC 4180 says.
 */
public final class PointsCsv {
    /** The columns, in order. */
    public static final List<String> COLUMNS = Stream.of(
            List.of("point", "step", "step_index", "repeat", "quantity", "wiring", "frequency_hz", "drive", "level",
                    "bias_mode", "bias", "r_ohm", "x_ohm"),
            Derived.NAMES,
            List.of("ratio", "status", "check", "time"))
            .flatMap(List::stream).toList();

    /** The header line, without its line break. */
    public static final String HEADER = String.join(",", COLUMNS);

    private PointsCsv() {
    }

    /** {@code row} as one line, without its line break. */
    public static String format(PointRow row) {
        StringBuilder b = new StringBuilder(256);
        b.append(row.point()).append(',');
        text(b, row.step()).append(',');
        b.append(row.stepIndex()).append(',').append(row.repeat()).append(',');
        text(b, row.quantity()).append(',');
        text(b, row.wiring()).append(',');
        num(b, row.frequencyHz()).append(',');
        text(b, row.drive()).append(',');
        num(b, row.level()).append(',');
        text(b, row.biasMode()).append(',');
        num(b, row.bias()).append(',');
        num(b, row.rOhm()).append(',');
        num(b, row.xOhm()).append(',');
        for (double v : row.derived().columns()) {
            num(b, v).append(',');
        }
        num(b, row.ratio()).append(',');
        text(b, row.status()).append(',');
        text(b, row.check()).append(',');
        b.append(row.time());
        return b.toString();
    }

    /**
     * Parses one line written by {@link #format}.
     *
     * @throws IllegalArgumentException when the line does not have the columns or values expected
     */
    public static PointRow parse(String line) {
        List<String> c = split(line);
        if (c.size() != COLUMNS.size()) {
            throw new IllegalArgumentException("expected " + COLUMNS.size() + " cells, found " + c.size());
        }
        try {
            int after = 13 + Derived.NAMES.size();
            PointRow.Conditions conditions = new PointRow.Conditions(c.get(4), c.get(5), parseNum(c.get(6)),
                    new PointRow.Source(c.get(7), parseNum(c.get(8))),
                    new PointRow.Source(c.get(9), parseNum(c.get(10))));
            // the derived cells are not read back: every derived value is computed from R and X, once
            String status = c.get(after + 1);
            PointRow row = PointRow.of(new PointRow.Key(Integer.parseInt(c.get(0)), c.get(1),
                    Integer.parseInt(c.get(2)), Integer.parseInt(c.get(3))), conditions, !"no_value".equals(status),
                    parseNum(c.get(11)), parseNum(c.get(12)), c.get(after + 2), Instant.parse(c.get(after + 3)));
            return "ok".equals(status) || "no_value".equals(status) ? row : row.withStatus(status);
        } catch (NumberFormatException | DateTimeParseException e) {
            throw new IllegalArgumentException(e.getMessage(), e);
        }
    }

    private static StringBuilder num(StringBuilder b, double v) {
        if (Double.isFinite(v)) {
            b.append(v);
        }
        return b;
    }

    private static double parseNum(String s) {
        return s.isEmpty() ? Double.NaN : Double.parseDouble(s);
    }

    private static StringBuilder text(StringBuilder b, String s) {
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.indexOf('\n') < 0 && s.indexOf('\r') < 0) {
            return b.append(s);
        }
        return b.append('"').append(s.replace("\"", "\"\"")).append('"');
    }

    static List<String> split(String line) {
        List<String> cells = new ArrayList<>(COLUMNS.size());
        StringBuilder cur = new StringBuilder();
        boolean quoted = false;
        for (int i = 0; i < line.length(); i++) {
            char ch = line.charAt(i);
            if (quoted) {
                if (ch == '"') {
                    if (i + 1 < line.length() && line.charAt(i + 1) == '"') {
                        cur.append('"');
                        i++;
                    } else {
                        quoted = false;
                    }
                } else {
                    cur.append(ch);
                }
            } else if (ch == '"') {
                quoted = true;
            } else if (ch == ',') {
                cells.add(cur.toString());
                cur.setLength(0);
            } else {
                cur.append(ch);
            }
        }
        if (quoted) {
            throw new IllegalArgumentException("unterminated quoted cell");
        }
        cells.add(cur.toString());
        return cells;
    }
}
