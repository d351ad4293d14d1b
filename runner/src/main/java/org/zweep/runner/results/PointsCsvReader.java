package org.zweep.runner.results;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.function.Consumer;
import org.zweep.driver.InvalidInputException;

/**
 * Reads back a {@code points.csv} written by {@link PointsCsvWriter}, for resuming a run and for
 * later analysis.
 */
public final class PointsCsvReader {

    /**
     * What {@link #recover} found.
     *
     * @param rows the number of complete rows read
     * @param tornLineDropped whether an incomplete last line (a point being written when the run
     *     died) was found and cut off
     */
    public record Recovery(int rows, boolean tornLineDropped) {
    }

    /**
     * Refuses a second row of a point index: each planned point is measured once into a run
     * folder, so a repeated index means the file was written twice at once or edited by hand.
     */
    public static final class UniquePoints {
        private final Path file;
        private final java.util.Map<Integer, Integer> lineOf = new java.util.HashMap<>();

        /** Checks the rows of {@code file}. */
        public UniquePoints(Path file) {
            this.file = file;
        }

        /**
         * Records that {@code line} holds {@code point}.
         *
         * @throws InvalidInputException {@code file:line: point N repeats line M} when seen before
         */
        public void add(int point, int line) {
            Integer first = lineOf.putIfAbsent(point, line);
            if (first != null) {
                throw new InvalidInputException(file + ":" + line + ": point " + point + " repeats line " + first
                        + " (a point is measured once per run folder; was the folder written by two runs at once"
                        + " or edited?)");
            }
        }
    }

    private PointsCsvReader() {
    }

    /**
     * Reads every complete row of {@code file} in order, giving each to {@code sink}, and cuts off
     * an incomplete last line (no line break, or not a whole row) so that appending can continue.
     * A missing file counts as empty.
     *
     * @throws InvalidInputException when the header is not the expected one, a row other than
     *     the last is malformed, or a point index repeats ({@code file:line: what})
     */
    public static Recovery recover(Path file, Consumer<PointRow> sink) {
        if (!Files.exists(file)) {
            return new Recovery(0, false);
        }
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ, StandardOpenOption.WRITE)) {
            long size = ch.size();
            if (size > Integer.MAX_VALUE) {
                throw new InvalidInputException(file + ": too large to read (" + size + " bytes)");
            }
            ByteBuffer all = ByteBuffer.allocate((int) size);
            while (all.hasRemaining() && ch.read(all) >= 0) {
                // keep reading until the buffer is full
            }
            byte[] bytes = all.array();
            int rows = 0;
            int lineNo = 0;
            int start = 0;
            long goodEnd = 0;
            boolean torn = false;
            UniquePoints unique = new UniquePoints(file);
            while (start < bytes.length) {
                int nl = indexOf(bytes, (byte) '\n', start);
                lineNo++;
                boolean last = nl < 0 || nl == bytes.length - 1;
                if (nl < 0) {
                    torn = true;
                    break;
                }
                String line;
                try {
                    line = decode(bytes, start, nl - start);
                } catch (CharacterCodingException e) {
                    if (last) {
                        torn = true;
                        break;
                    }
                    throw new InvalidInputException(file + ":" + lineNo + ": not UTF-8 text");
                }
                if (lineNo == 1) {
                    if (!line.equals(PointsCsv.HEADER)) {
                        if (last && PointsCsv.HEADER.startsWith(line)) {
                            torn = true;
                            break;
                        }
                        throw new InvalidInputException(file + ":1: expected the header " + PointsCsv.HEADER);
                    }
                } else {
                    PointRow row;
                    try {
                        row = PointsCsv.parse(line);
                    } catch (IllegalArgumentException e) {
                        if (last) {
                            torn = true;
                            break;
                        }
                        throw new InvalidInputException(file + ":" + lineNo + ": malformed row: " + e.getMessage());
                    }
                    unique.add(row.point(), lineNo);
                    sink.accept(row);
                    rows++;
                }
                start = nl + 1;
                goodEnd = start;
            }
            if (torn) {
                ch.truncate(goodEnd);
                ch.force(true);
            }
            return new Recovery(rows, torn);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + file + ": " + e.getMessage(), e);
        }
    }

    private static String decode(byte[] b, int off, int len) throws CharacterCodingException {
        return StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT).decode(ByteBuffer.wrap(b, off, len)).toString();
    }

    private static int indexOf(byte[] b, byte v, int from) {
        for (int i = from; i < b.length; i++) {
            if (b[i] == v) {
                return i;
            }
        }
        return -1;
    }
}
