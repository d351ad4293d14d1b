package org.zweep.runner.results;

import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

/**
 * The {@code points.csv} format: UTF-8, a header row, cells as {@link Csv} writes them (RFC 4180
 * through Apache Commons CSV; numbers in {@link Double#toString(double)} form, an empty cell for
 * not applicable). Folders written before the drive's mode column was named {@code drive_mode}
 * (it was {@code drive}) are read all the same.
 */
public final class PointsCsv {
    /** The columns, in order. */
    public static final List<String> COLUMNS = Stream.of(
            List.of("point", "step", "step_index", "repeat", "quantity", "wiring", "frequency_hz", "drive_mode",
                    "level", "bias_mode", "bias", "r_ohm", "x_ohm"),
            Derived.NAMES,
            List.of("ratio", "status", "check", "time"),
            RowUncertainty.COLUMNS)
            .flatMap(List::stream).toList();

    /** The header line, without its line break. */
    public static final String HEADER = String.join(",", COLUMNS);

    /** The header of folders written before the drive's mode column was renamed ({@code drive}). */
    public static final String HEADER_BEFORE_DRIVE_MODE = HEADER.replace(",drive_mode,", ",drive,");

    private static final int AFTER_DERIVED = 13 + Derived.NAMES.size();

    private PointsCsv() {
    }

    /** Whether {@code line} is a header this format reads (the current one or the one before). */
    public static boolean isHeader(String line) {
        return line.equals(HEADER) || line.equals(HEADER_BEFORE_DRIVE_MODE);
    }

    /** {@code row} as one record, without its line break. */
    public static String format(PointRow row) {
        return Csv.append(new StringBuilder(320), cells(row)).toString();
    }

    /** The cells of {@code row}, in {@link #COLUMNS} order. */
    static List<String> cells(PointRow row) {
        List<String> c = new ArrayList<>(COLUMNS.size());
        c.add(Integer.toString(row.point()));
        c.add(row.step());
        c.add(Integer.toString(row.stepIndex()));
        c.add(Integer.toString(row.repeat()));
        c.add(row.quantity());
        c.add(row.wiring());
        c.add(Csv.number(row.frequencyHz()));
        c.add(row.driveMode());
        c.add(Csv.number(row.level()));
        c.add(row.biasMode());
        c.add(Csv.number(row.bias()));
        c.add(Csv.number(row.rOhm()));
        c.add(Csv.number(row.xOhm()));
        for (double v : row.derived().columns()) {
            c.add(Csv.number(v));
        }
        c.add(Csv.number(row.ratio()));
        c.add(row.status());
        c.add(row.check());
        c.add(row.time().toString());
        for (double v : row.uncertainty().columns()) {
            c.add(Csv.number(v));
        }
        return c;
    }

    /**
     * Parses one record written by {@link #format}.
     *
     * @throws IllegalArgumentException when the record does not have the columns or values expected
     */
    public static PointRow parse(String record) {
        return parse(Csv.cells(record));
    }

    /**
     * The row of a record's cells.
     *
     * @throws IllegalArgumentException when they are not the columns or values expected
     */
    static PointRow parse(List<String> c) {
        if (c.size() != COLUMNS.size()) {
            throw new IllegalArgumentException("expected " + COLUMNS.size() + " cells, found " + c.size());
        }
        try {
            int after = AFTER_DERIVED;
            PointRow.Conditions conditions = new PointRow.Conditions(c.get(4), c.get(5), Csv.number(c.get(6)),
                    new PointRow.Source(c.get(7), Csv.number(c.get(8))),
                    new PointRow.Source(c.get(9), Csv.number(c.get(10))));
            // the derived cells are not read back: every derived value (and its u) is computed from R and X
            // (and u(R), u(X), r), once
            String status = c.get(after + 1);
            PointRow.Key key = new PointRow.Key(Integer.parseInt(c.get(0)), c.get(1), Integer.parseInt(c.get(2)),
                    Integer.parseInt(c.get(3)));
            PointRow row = new PointRow(key, conditions, PointRow.Measured.of(conditions, !"no_value".equals(status),
                    Csv.number(c.get(11)), Csv.number(c.get(12)), Csv.number(c.get(after + 4)),
                    Csv.number(c.get(after + 5)), Csv.number(c.get(after + 6))), c.get(after + 2),
                    Instant.parse(c.get(after + 3)));
            return "ok".equals(status) || "no_value".equals(status) ? row : row.withStatus(status);
        } catch (NumberFormatException | DateTimeParseException e) {
            throw new IllegalArgumentException(e.getMessage(), e);
        }
    }
}
