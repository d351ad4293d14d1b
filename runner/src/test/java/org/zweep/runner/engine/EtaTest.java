package org.zweep.runner.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;

class EtaTest {
    private static final long S = 1_000_000_000L;

    /** Four points of 1 s of meter work each; the third waits 10 s (a ramp) before it; 1 s to finish. */
    private static RunEstimate estimate() {
        return new RunEstimate(0.5, 1.5, List.of(1.5), List.of(),
                List.of(new RunEstimate.PointTime(1, 0), new RunEstimate.PointTime(1, 0),
                        new RunEstimate.PointTime(1, 10), new RunEstimate.PointTime(1, 0)), 1);
    }

    @Test
    void beforeAnythingTheEtaIsTheWholeEstimateCountingDown() {
        Eta eta = new Eta(estimate());
        eta.begin(0);
        // no outside source: 0.5 + 1.5 + 4 + 10 + 1 = 17 s
        assertEquals(17.0, eta.remainingS(0), 1e-9);
        assertEquals(16.0, eta.remainingS(S), 1e-9);
    }

    @Test
    void aMeterTwiceAsSlowAsExpectedDoublesItsWorkAheadButNotThePlannedWaits() {
        Eta eta = new Eta(estimate());
        eta.begin(0);
        eta.pointsStart(0, 4 * S); // start and compensation took 4 s for 2 s expected: ratio 2
        // no outside source: remaining meter 4 s · 2 + the 10 s ramp + 1 s finish
        assertEquals(19.0, eta.remainingS(4 * S), 1e-9);
        eta.measured(0, 6 * S); // 2 s for 1 s expected: still 2
        assertEquals(3 * 2 + 10 + 1, eta.remainingS(6 * S), 1e-9);
        eta.measured(1, 8 * S);
        assertEquals(2 * 2 + 10 + 1, eta.remainingS(8 * S), 1e-9);
        // the third point comes after its 10 s ramp and 2 s of meter work: the ramp is not the meter's
        eta.measured(2, 20 * S);
        assertEquals(2 + 1, eta.remainingS(20 * S), 1e-9);
    }

    @Test
    void aCompensationThatWasReusedSaysNothingAboutTheMetersSpeed() {
        Eta eta = new Eta(estimate());
        eta.begin(0);
        eta.pointsStart(0, S / 10); // 0.1 s instead of 2 s: the stored compensation was reused
        assertEquals(4 + 10 + 1, eta.remainingS(S / 10), 1e-9);
    }

    @Test
    void aResumedRunCountsOnlyThePointsLeft() {
        Eta eta = new Eta(estimate());
        eta.begin(0);
        eta.pointsStart(3, 0);
        assertEquals(1 + 1, eta.remainingS(0), 1e-9);
    }
}
