package org.zweep.runner.results;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.InvalidInputException;

class PointsCsvReaderTest {
    @TempDir
    Path dir;

    private Path writeRows(int n) {
        Path f = dir.resolve("points.csv");
        try (PointsCsvWriter w = PointsCsvWriter.open(f)) {
            for (int i = 0; i < n; i++) {
                w.append(PointsCsvTest.row(i, "s", 1.0 + i, -100.0));
            }
        }
        return f;
    }

    @Test
    void readsBackEveryRowInOrder() {
        Path f = writeRows(5);
        List<PointRow> rows = new ArrayList<>();
        PointsCsvReader.Recovery r = PointsCsvReader.recover(f, rows::add);
        assertEquals(5, r.rows()); // the rows written above
        assertFalse(r.tornLineDropped());
        assertEquals(List.of(0, 1, 2, 3, 4), rows.stream().map(PointRow::point).toList());
    }

    @Test
    void tornLastLineFromAPowerCutIsDroppedAndAppendingContinuesCleanly() throws Exception {
        Path f = writeRows(3);
        String half = PointsCsv.format(PointsCsvTest.row(3, "s", 9.0, -9.0)).substring(0, 40);
        Files.writeString(f, half, StandardCharsets.UTF_8, StandardOpenOption.APPEND);

        List<PointRow> rows = new ArrayList<>();
        PointsCsvReader.Recovery r = PointsCsvReader.recover(f, rows::add);
        // arithmetic from the inputs above: 3 whole rows, then 1 appended; 4.0 Ω is our own demo data
        assertEquals(3, r.rows());
        assertTrue(r.tornLineDropped());
        try (PointsCsvWriter w = PointsCsvWriter.open(f)) {
            w.append(PointsCsvTest.row(3, "s", 4.0, -100.0));
        }
        rows.clear();
        assertEquals(4, PointsCsvReader.recover(f, rows::add).rows());
        assertEquals(List.of(0, 1, 2, 3), rows.stream().map(PointRow::point).toList());
        assertEquals(4.0, rows.get(3).rOhm());
    }

    @Test
    void lastLineOfZeroBytesIsTreatedAsTorn() throws Exception {
        Path f = writeRows(2);
        Files.write(f, new byte[] {0, 0, 0, 0, '\n'}, StandardOpenOption.APPEND);
        PointsCsvReader.Recovery r = PointsCsvReader.recover(f, row -> { });
        // 2 whole rows: the file keeps header + 2 lines
        assertEquals(2, r.rows());
        assertTrue(r.tornLineDropped());
        assertEquals(3, Files.readAllLines(f).size());
    }

    @Test
    void malformedRowInTheMiddleIsAnErrorNamingItsLine() throws Exception {
        Path f = writeRows(2);
        List<String> lines = new ArrayList<>(Files.readAllLines(f));
        lines.add(2, "garbage,row");
        Files.write(f, lines);
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> PointsCsvReader.recover(f, r -> { }));
        assertTrue(e.getMessage().startsWith(f + ":3: malformed row"), e.getMessage());
    }

    @Test
    void unexpectedHeaderIsAnError() throws Exception {
        Path f = dir.resolve("points.csv");
        Files.writeString(f, "a,b,c\n1,2,3\n");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> PointsCsvReader.recover(f, r -> { }));
        assertTrue(e.getMessage().startsWith(f + ":1: expected the header"), e.getMessage());
    }

    @Test
    void missingFileReadsAsEmpty() {
        assertEquals(0, PointsCsvReader.recover(dir.resolve("none.csv"), r -> { }).rows()); // no file, no rows
    }

    @Test
    void writerPutsTheHeaderOnlyIntoANewFile() throws Exception {
        Path f = writeRows(1);
        try (PointsCsvWriter w = PointsCsvWriter.open(f)) {
            w.append(PointsCsvTest.row(1, "s", 1.0, -1.0));
        }
        List<String> lines = Files.readAllLines(f);
        assertEquals(3, lines.size()); // arithmetic from the inputs above: header + 2 rows
        assertEquals(PointsCsv.HEADER, lines.get(0));
        assertEquals(1, lines.stream().filter(PointsCsv.HEADER::equals).count());
    }

    @Test
    void aStepNameWithAQuotedLineBreakQuotesAndCommasRoundTripsThroughTheFile() {
        Path f = dir.resolve("points.csv");
        String name = "warm-up, \"slow\"\nthen 85 \u00b0C,\r\nhold";
        try (PointsCsvWriter w = PointsCsvWriter.open(f)) {
            w.append(PointsCsvTest.row(0, name, 1.0, -100.0));
            w.append(PointsCsvTest.row(1, "plain", 2.0, -100.0));
        }
        List<PointRow> rows = new ArrayList<>();
        PointsCsvReader.Recovery r = PointsCsvReader.recover(f, rows::add);
        assertEquals(2, r.rows());
        assertFalse(r.tornLineDropped());
        assertEquals(name, rows.get(0).step());
        assertEquals(PointsCsvTest.row(0, name, 1.0, -100.0), rows.get(0));
        assertEquals("plain", rows.get(1).step());
    }

    @Test
    void aTornRowWithAQuotedLineBreakIsCutOffAndTheRowsBeforeItStay() throws Exception {
        Path f = writeRows(2);
        String whole = PointsCsv.format(PointsCsvTest.row(2, "two\nlines", 9.0, -9.0));
        Files.writeString(f, whole.substring(0, whole.indexOf('\n') + 5), StandardCharsets.UTF_8,
                StandardOpenOption.APPEND);
        List<PointRow> rows = new ArrayList<>();
        PointsCsvReader.Recovery r = PointsCsvReader.recover(f, rows::add);
        assertEquals(2, r.rows());
        assertTrue(r.tornLineDropped());
        assertEquals(3, Files.readAllLines(f).size()); // header + 2 rows
    }

    @Test
    void aStrayQuoteNeverCutsOffTheRowsAfterIt() throws Exception {
        Path f = writeRows(3);
        List<String> lines = new ArrayList<>(Files.readAllLines(f));
        lines.set(1, lines.get(1).replace(",s,", ",s\",")); // an edit leaves a quote open on line 2
        Files.write(f, lines);
        long size = Files.size(f);
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> PointsCsvReader.recover(f, r -> { }));
        assertTrue(e.getMessage().startsWith(f + ":2: a quoted cell is never closed (line 3"), e.getMessage());
        assertEquals(size, Files.size(f)); // nothing cut off
    }

    @Test
    void aFolderWrittenWithTheOldDriveHeaderIsResumedUnderThatHeader() throws Exception {
        Path f = writeRows(2);
        List<String> lines = new ArrayList<>(Files.readAllLines(f));
        lines.set(0, PointsCsv.HEADER_BEFORE_DRIVE_MODE);
        Files.write(f, lines);
        List<PointRow> rows = new ArrayList<>();
        assertEquals(2, PointsCsvReader.recover(f, rows::add).rows());
        try (PointsCsvWriter w = PointsCsvWriter.open(f)) {
            w.append(PointsCsvTest.row(2, "s", 3.0, -100.0));
        }
        rows.clear();
        assertEquals(3, PointsCsvReader.recover(f, rows::add).rows());
        assertEquals("V", rows.get(2).driveMode());
        assertEquals(PointsCsv.HEADER_BEFORE_DRIVE_MODE, Files.readAllLines(f).get(0));
    }

    @Test
    void readingWithoutRecoveringNotesATornLastRowAndLeavesTheFileAlone() throws Exception {
        Path f = writeRows(2);
        Files.writeString(f, "2,s,0,0,imped", StandardCharsets.UTF_8, StandardOpenOption.APPEND);
        long size = Files.size(f);
        try (PointsCsvReader r = PointsCsvReader.open(f)) {
            int n = 0;
            while (r.next() != null) {
                n++;
            }
            assertEquals(2, n);
            assertEquals(List.of("points.csv:4: incomplete last row skipped"), r.notes());
        }
        assertEquals(size, Files.size(f));
    }
}
