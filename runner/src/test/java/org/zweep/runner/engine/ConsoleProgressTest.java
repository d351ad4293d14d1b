package org.zweep.runner.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.time.Instant;
import java.util.List;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Test;
import org.zweep.runner.results.PointRow;

class ConsoleProgressTest {
    private final StringWriter text = new StringWriter();
    private final AtomicLong clock = new AtomicLong();

    private static RunEstimate estimate(int points) {
        return new RunEstimate(1, 0, List.of(), List.of(),
                java.util.Collections.nCopies(points, new RunEstimate.PointTime(1, 0, true)), 0.5);
    }

    private static PointRow row(int i) {
        return PointRow.of(new PointRow.Key(i, "a-step-with-a-rather-long-name", 0, 0),
                new PointRow.Conditions("impedance", "none", 123456.7, new PointRow.Source("V", 0.5),
                        new PointRow.Source("A", 3.75)), true, 1, 2, "", Instant.EPOCH);
    }

    @Test
    void aRedrawnLineNeverExceedsTheTerminalWidthSoNoRedrawLeavesANewLine() {
        // issue 9: an 80+ character line in an 80-column terminal left a new line at every redraw
        int[] width = {40};
        ConsoleProgress p = new ConsoleProgress(new PrintWriter(text), true, clock::get, 5, estimate(3),
                () -> width[0], false);
        p.work("compensation: the meter acquires the OPEN standard", 8.5);
        p.started(3, 0);
        p.measured(row(0), 1, 3);
        width[0] = 25; // the window was made narrower
        p.work("ramping DC bias 0 → 3.75 A", 7.5);
        p.measured(row(1), 2, 3);
        p.finished();
        for (String redraw : text.toString().split("[\r\n]")) {
            assertTrue(redraw.strip().length() <= 39, "'" + redraw + "'");
        }
        String last = text.toString().substring(text.toString().lastIndexOf('\r') + 1).strip();
        assertTrue(last.length() <= 24 && last.endsWith("…"), last);
    }

    @Test
    void aTerminalOfUnknownWidthCountsAsEightyColumns() {
        ConsoleProgress p = new ConsoleProgress(new PrintWriter(text), true, clock::get, 5, estimate(3), () -> 0,
                false);
        p.started(3, 0);
        p.measured(row(0), 1, 3);
        String line = text.toString().substring(text.toString().lastIndexOf('\r') + 1);
        assertEquals(79, line.length(), line);
    }

    @Test
    void plainLinesCarryCountsEtaAndTheWorkWithItsOwnTimeLeft() {
        ConsoleProgress p = new ConsoleProgress(new PrintWriter(text), false, clock::get, 5, estimate(3), () -> 0,
                false);
        clock.set(2_000_000_000L);
        p.work("compensation: the meter acquires the OPEN standard", 8.4);
        // 1 s start + 3 points of 1 s + 0.5 s finish = 4.5 s, 2 s gone: 2.5 s (rounds to 3)
        assertEquals("[0/3] 0%  ETA 00:03  elapsed 00:02  compensation: the meter acquires the OPEN standard"
                + " (00:08 left)", text.toString().strip());
    }
}
