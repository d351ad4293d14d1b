package org.zweep.runner.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.Impedance;

class SweepThinnedTest {
    private static Sweep sweep(int n) {
        List<Impedance> pts = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            pts.add(new Impedance(100.0 * (i + 1), 1, -i));
        }
        return new Sweep("s", 0, "none", "V", 1, "V", 0, pts, 1);
    }

    @Test
    void aLongSweepKeepsEvenlySpreadFrequenciesWithBothEnds() {
        Sweep t = sweep(12).thinned(4);
        // indices round(i * 11 / 3) for i = 0..3: 0, 4, 7, 11
        assertEquals(List.of(100.0, 500.0, 800.0, 1200.0), t.points().stream().map(Impedance::frequencyHz).toList());
    }

    @Test
    void aSweepWithinTheLimitIsFittedWhole() {
        Sweep s = sweep(12);
        assertSame(s, s.thinned(12));
    }
}
