package org.zweep.runner.results;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.Iterator;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVPrinter;
import org.apache.commons.csv.CSVRecord;

/**
 * The one CSV dialect of every file zweep writes and reads ({@code points.csv}, exports,
 * compensation data): RFC 4180 cells through Apache Commons CSV, comma-separated, a cell quoted
 * only when it must be (a comma, a quote, a line break), records ended by {@code \n}. Numbers are
 * written in {@link Double#toString(double)} form, an empty cell for a value that does not apply.
 * Stateless and thread-safe.
 */
public final class Csv {
    /** The format: RFC 4180 with {@code \n} between records. */
    public static final CSVFormat FORMAT = CSVFormat.RFC4180.builder().setRecordSeparator('\n').get();

    private Csv() {
    }

    /** {@code cells} as one record, without its line break. */
    public static String record(List<String> cells) {
        StringBuilder b = new StringBuilder(cells.size() * 12);
        append(b, cells);
        return b.toString();
    }

    /** Appends {@code cells} as one record, without its line break, to {@code b}; returns {@code b}. */
    public static StringBuilder append(StringBuilder b, Iterable<String> cells) {
        try {
            CSVPrinter p = new CSVPrinter(b, FORMAT);
            for (String c : cells) {
                p.print(c);
            }
            // no println: the caller ends the record (files written row by row add the \n themselves)
        } catch (IOException e) {
            throw new UncheckedIOException(e); // a StringBuilder does not fail
        }
        return b;
    }

    /**
     * The cells of one record written by {@link #record} (which may hold quoted line breaks),
     * without its line break.
     *
     * @throws IllegalArgumentException when it is not one well-formed record (an unterminated
     *     quoted cell, text after a closing quote, more than one record)
     */
    public static List<String> cells(String record) {
        try (CSVParser p = CSVParser.parse(record, FORMAT)) {
            Iterator<CSVRecord> it = p.iterator();
            if (!it.hasNext()) {
                return List.of("");
            }
            CSVRecord r = it.next();
            if (it.hasNext()) {
                throw new IllegalArgumentException("more than one record");
            }
            return r.toList();
        } catch (IOException | UncheckedIOException | IllegalStateException e) {
            throw new IllegalArgumentException(e.getMessage(), e);
        }
    }

    /** {@code v} as a cell: {@link Double#toString(double)}, or empty when not finite. */
    public static String number(double v) {
        return Double.isFinite(v) ? Double.toString(v) : "";
    }

    /** A cell as a number: {@code NaN} for an empty cell. */
    public static double number(String cell) {
        return cell.isEmpty() ? Double.NaN : Double.parseDouble(cell);
    }
}
