package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

class ToleranceAndPreferredValuesTest {
    @Test
    void e6E12E24MatchThePublishedTables() {
        // IEC 60063:2015 E-series tables, as Wikipedia "E series of preferred numbers" reproduces them
        assertEquals(List.of(1.0, 1.5, 2.2, 3.3, 4.7, 6.8), PreferredValues.E6.decade());
        assertEquals(List.of(1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2), PreferredValues.E12.decade());
        assertEquals(24, PreferredValues.E24.decade().size());
        assertEquals(3.0, PreferredValues.E24.decade().get(11)); // not 2.9 from the formula
        assertEquals(9.1, PreferredValues.E24.decade().get(23));
    }

    @Test
    void e96MatchesThePublishedFirstValuesAndDecadeEnd() {
        // IEC 60063:2015 E96 table (as reproduced by Wikipedia and the qsl.net preferred-values page): first 24 values
        // and the last four
        assertEquals(List.of(1.00, 1.02, 1.05, 1.07, 1.10, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.30, 1.33, 1.37, 1.40,
                1.43, 1.47, 1.50, 1.54, 1.58, 1.62, 1.65, 1.69, 1.74), PreferredValues.E96.decade().subList(0, 24));
        assertEquals(List.of(9.09, 9.31, 9.53, 9.76), PreferredValues.E96.decade().subList(92, 96));
        // E48 is every second E96 value (IEC 60063:2015)
        for (int i = 0; i < 48; i++) {
            assertEquals(PreferredValues.E96.decade().get(2 * i), PreferredValues.E48.decade().get(i));
        }
    }

    @Test
    void nearestAndCeilingMatchTheEseriesPackageExamples() {
        // the PyPI package eseries, its documented examples: find_nearest(E24, 319) → 330,
        // find_greater_than_or_equal(E96, 184) → 187
        assertEquals(330, PreferredValues.E24.nearest(319), 1e-9);
        assertEquals(187, PreferredValues.E96.ceiling(184), 1e-9);
    }

    @Test
    void nearestCrossesDecadeEdges() {
        // E12 ends at 8.2 and the next decade starts at 10 (IEC 60063:2015): 9.7 is nearer 10 in ratio
        assertEquals(10.0, PreferredValues.E12.nearest(9.7), 1e-12);
        assertEquals(8.2, PreferredValues.E12.nearest(8.9), 1e-12); // 8.9/8.2 = 1.085 < 10/8.9 = 1.124
        assertEquals(1.0e-7, PreferredValues.E6.nearest(0.96e-7), 1e-20); // just below a decade
        assertEquals(6.8e-6, PreferredValues.E6.nearest(8.0e-6), 1e-18); // 8/6.8 = 1.176 < 10/8 = 1.25
        assertEquals(100.0, PreferredValues.E96.nearest(98.9), 1e-9); // 98.9 → 100 (97.6 is 1.3 % away, 100 is 1.1 %)
        assertEquals(4.7e-9, PreferredValues.E24.ceiling(4.65e-9), 1e-21);
        assertEquals(1.0e3, PreferredValues.E24.ceiling(915), 1e-9); // above 910 the next is 1000
    }
}
