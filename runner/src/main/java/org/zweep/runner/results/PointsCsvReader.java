package org.zweep.runner.results;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Consumer;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.zweep.driver.InvalidInputException;

/**
 * The one reader of {@code points.csv}, for resuming a run ({@link #recover}) and for everything
 * that reads a run folder afterwards ({@link #open}): rows are streamed one at a time, never all
 * held. One rule for a torn write: a last record without its line break, or a last record that is
 * not a whole row, is what a run that died while writing leaves; it is dropped with a note
 * ({@link #recover} also cuts it off so that appending can continue). A malformed record anywhere
 * else, a wrong header or a repeated point index is an error naming {@code file:line}.
 *
 * <p>Records are split at line breaks outside quoted cells (a quoted cell may hold a line break);
 * each record's cells are decoded by {@link Csv}. Not thread-safe.
 */
public final class PointsCsvReader implements AutoCloseable {

    /**
     * What {@link #recover} found.
     *
     * @param rows the number of complete rows read
     * @param tornLineDropped whether an incomplete last line (a point being written when the run
     *     died) was found and cut off
     */
    public record Recovery(int rows, boolean tornLineDropped) {
    }

    /** One record's bytes, before decoding: its first line's number and its byte range. */
    private record Raw(byte[] bytes, int line, long end, boolean terminated) {
    }

    /** A record read ahead: its text (null when not UTF-8), its cells (null: not decoded yet), whether it ends the file. */
    private record Item(Raw raw, String text, List<String> cells, boolean last) {
    }

    private static final int BATCH = 256;

    private final Path file;
    private final InputStream in;
    private final byte[] buf = new byte[1 << 16];
    private int bufPos;
    private int bufLen;
    private byte[] rec = new byte[512];
    private long offset;
    private int lineNo;
    private Raw ahead;
    private final ArrayDeque<Item> pending = new ArrayDeque<>();
    private boolean headerRead;
    private long completeEnd;
    private int rows;
    private String tornNote;
    private final UniquePoints unique;
    private final CharsetDecoder utf8 = StandardCharsets.UTF_8.newDecoder()
            .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT);

    private PointsCsvReader(Path file, InputStream in) {
        this.file = file;
        this.in = in;
        this.unique = new UniquePoints(file);
    }

    /**
     * Opens {@code file} for reading its rows in order with {@link #next}; a missing file reads as
     * empty. Never changes the file.
     */
    public static PointsCsvReader open(Path file) {
        try {
            return new PointsCsvReader(file, Files.newInputStream(file));
        } catch (NoSuchFileException e) {
            return new PointsCsvReader(file, InputStream.nullInputStream());
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * The next complete row, or null at the end (after which {@link #tornNote()} says whether a
     * torn last record was dropped).
     *
     * @throws InvalidInputException when the header is not the expected one, a record other than
     *     the last is malformed, or a point index repeats ({@code file:line: what})
     */
    public PointRow next() {
        while (true) {
            if (pending.isEmpty() && !fill()) {
                return null;
            }
            Item it = pending.poll();
            Raw cur = it.raw();
            if (!cur.terminated()) {
                return torn(cur);
            }
            boolean last = it.last();
            if (it.text() == null) {
                if (last) {
                    return torn(cur);
                }
                throw new InvalidInputException(file + ":" + cur.line() + ": not UTF-8 text");
            }
            String text = it.text();
            if (!headerRead) {
                if (!PointsCsv.isHeader(text)) {
                    if (last && (PointsCsv.HEADER.startsWith(text) || PointsCsv.HEADER_BEFORE_DRIVE_MODE.startsWith(text))) {
                        return torn(cur);
                    }
                    throw new InvalidInputException(file + ":" + cur.line() + ": expected the header " + PointsCsv.HEADER);
                }
                headerRead = true;
                completeEnd = cur.end();
                continue;
            }
            PointRow row;
            try {
                row = PointsCsv.parse(it.cells() != null ? it.cells() : Csv.cells(text));
            } catch (IllegalArgumentException e) {
                if (last) {
                    return torn(cur);
                }
                throw new InvalidInputException(file + ":" + cur.line() + ": malformed row: " + e.getMessage());
            }
            unique.add(row.point(), cur.line());
            completeEnd = cur.end();
            rows++;
            return row;
        }
    }

    /**
     * Reads the next records into {@link #pending}, each with its text and (when the batch reads
     * as one run of well-formed records) its cells, decoded in one pass of the CSV parser rather
     * than one parser per record; false at the end of the file.
     */
    private boolean fill() {
        List<Raw> batch = new ArrayList<>(BATCH);
        while (batch.size() < BATCH) {
            Raw cur = ahead != null ? ahead : readRaw();
            ahead = null;
            if (cur == null) {
                break;
            }
            batch.add(cur);
            if (!cur.terminated()) {
                break;
            }
        }
        if (batch.isEmpty()) {
            return false;
        }
        if (batch.get(batch.size() - 1).terminated()) {
            ahead = readRaw();
        }
        String[] texts = new String[batch.size()];
        StringBuilder all = new StringBuilder(batch.size() * 360);
        int parseable = 0;
        for (int i = 0; i < batch.size(); i++) {
            Raw r = batch.get(i);
            try {
                utf8.reset();
                texts[i] = utf8.decode(ByteBuffer.wrap(r.bytes())).toString();
                if (r.terminated()) {
                    all.append(texts[i]).append('\n');
                    parseable++;
                }
            } catch (CharacterCodingException e) {
                texts[i] = null;
            }
        }
        List<List<String>> cells = bulkCells(all, parseable, parseable == batch.size());
        for (int i = 0; i < batch.size(); i++) {
            pending.add(new Item(batch.get(i), texts[i], cells == null ? null : cells.get(i),
                    i == batch.size() - 1 && ahead == null));
        }
        return true;
    }

    /** The cells of {@code expected} records in {@code text}, or null when they do not read as exactly that many. */
    private static List<List<String>> bulkCells(CharSequence text, int expected, boolean wanted) {
        if (!wanted || expected == 0) {
            return null;
        }
        List<List<String>> out = new ArrayList<>(expected);
        try (CSVParser p = CSVParser.parse(text.toString(), Csv.FORMAT)) {
            for (CSVRecord r : p) {
                out.add(r.toList());
                if (out.size() > expected) {
                    return null;
                }
            }
        } catch (IOException | RuntimeException e) {
            return null; // each record is decoded on its own, for the error of the one that is malformed
        }
        return out.size() == expected ? out : null;
    }

    private PointRow torn(Raw r) {
        refuseHiddenRows(r);
        tornNote = file.getFileName() + ":" + r.line() + ": incomplete last row skipped";
        ahead = null;
        pending.clear();
        return null;
    }

    /**
     * A torn record is one row cut short. When a quote opened in it is never closed, the record
     * runs on over the following lines; if one of those is a whole row of its own, the quote is a
     * stray one (an edit, a damaged byte) and the lines are measured points, never to be cut off.
     */
    private void refuseHiddenRows(Raw r) {
        byte[] b = r.bytes();
        int start = 0;
        int line = r.line();
        for (int i = 0; i < b.length; i++) {
            if (b[i] != '\n') {
                continue;
            }
            if (start > 0 && isRow(b, start, i)) {
                throw new InvalidInputException(file + ":" + r.line() + ": a quoted cell is never closed (line "
                        + line + " and the ones after it would be read as part of it)");
            }
            start = i + 1;
            line++;
        }
        if (start > 0 && isRow(b, start, b.length)) {
            throw new InvalidInputException(file + ":" + r.line() + ": a quoted cell is never closed (line "
                    + line + " and the ones after it would be read as part of it)");
        }
    }

    private boolean isRow(byte[] b, int from, int to) {
        try {
            utf8.reset();
            PointsCsv.parse(utf8.decode(ByteBuffer.wrap(b, from, to - from)).toString());
            return true;
        } catch (CharacterCodingException | IllegalArgumentException e) {
            return false;
        }
    }

    /** Whether the file began with the header (false for an empty or missing file, or a torn header). */
    public boolean hasHeader() {
        return headerRead;
    }

    /** The rows returned so far. */
    public int rows() {
        return rows;
    }

    /** {@code points.csv:N: incomplete last row skipped} once a torn last record was met; null otherwise. */
    public String tornNote() {
        return tornNote;
    }

    /** What was skipped while reading, for people (the torn last record), so far. */
    public List<String> notes() {
        return tornNote == null ? List.of() : List.of(tornNote);
    }

    @Override
    public void close() {
        try {
            in.close();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot close " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Reads every complete row of {@code file} in order, giving each to {@code sink}, and cuts off
     * a torn last record (see the class description) so that appending can continue. A missing
     * file counts as empty.
     *
     * @throws InvalidInputException when the header is not the expected one, a row other than
     *     the last is malformed, or a point index repeats ({@code file:line: what})
     */
    public static Recovery recover(Path file, Consumer<PointRow> sink) {
        if (!Files.exists(file)) {
            return new Recovery(0, false);
        }
        int rows;
        boolean torn;
        long keep;
        try (PointsCsvReader r = open(file)) {
            for (PointRow row = r.next(); row != null; row = r.next()) {
                sink.accept(row);
            }
            rows = r.rows();
            torn = r.tornNote() != null;
            keep = r.completeEnd;
        }
        if (torn) {
            try (FileChannel ch = FileChannel.open(file, StandardOpenOption.WRITE)) {
                ch.truncate(keep);
                ch.force(true);
            } catch (IOException e) {
                throw new UncheckedIOException("cannot cut the torn last line off " + file + ": " + e.getMessage(), e);
            }
        }
        return new Recovery(rows, torn);
    }

    /** The next record's bytes (up to a line break outside quotes), or null at the end of the file. */
    private Raw readRaw() {
        int n = 0;
        boolean quoted = false;
        int firstLine = lineNo + 1;
        try {
            while (true) {
                if (bufPos == bufLen) {
                    bufLen = in.read(buf);
                    bufPos = 0;
                    if (bufLen <= 0) {
                        bufLen = 0;
                        if (n == 0) {
                            return null;
                        }
                        lineNo++;
                        return new Raw(Arrays.copyOf(rec, n), firstLine, offset, false);
                    }
                }
                byte b = buf[bufPos++];
                offset++;
                if (b == '\n' && !quoted) {
                    lineNo++;
                    return new Raw(Arrays.copyOf(rec, n), firstLine, offset, true);
                }
                if (b == '\n') {
                    lineNo++;
                } else if (b == '"') {
                    quoted = !quoted;
                }
                if (n == rec.length) {
                    rec = Arrays.copyOf(rec, n * 2);
                }
                rec[n++] = b;
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Refuses a second row of a point index: each planned point is measured once into a run
     * folder, so a repeated index means the file was written twice at once or edited by hand.
     * Holds an int per point index (not a map entry), so a million-point run costs 4 MB.
     */
    static final class UniquePoints {
        private static final int DENSE_LIMIT = 1 << 26;
        private final Path file;
        private int[] lineOf = new int[1024];
        private final Map<Integer, Integer> sparse = new HashMap<>();

        UniquePoints(Path file) {
            this.file = file;
        }

        /**
         * Records that {@code line} holds {@code point}.
         *
         * @throws InvalidInputException {@code file:line: point N repeats line M} when seen before
         */
        void add(int point, int line) {
            Integer first;
            if (point >= 0 && point < DENSE_LIMIT) {
                if (point >= lineOf.length) {
                    lineOf = Arrays.copyOf(lineOf, Math.max(point + 1, lineOf.length * 2));
                }
                first = lineOf[point] == 0 ? null : lineOf[point];
                if (first == null) {
                    lineOf[point] = line;
                }
            } else {
                first = sparse.putIfAbsent(point, line);
            }
            if (first != null) {
                throw new InvalidInputException(file + ":" + line + ": point " + point + " repeats line " + first
                        + " (a point is measured once per run folder; was the folder written by two runs at once"
                        + " or edited?)");
            }
        }
    }
}
