package org.zweep.runner.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;

class EtaTest {
    private static final long S = 1_000_000_000L;

    /** Four points of 1 s of meter work each; the third waits 10 s (a ramp) before it; 1 s to finish. */
    private static RunEstimate estimate() {
        return new RunEstimate(0.5, 1.5, List.of(1.5), List.of(),
                List.of(new RunEstimate.PointTime(1, 0, true), new RunEstimate.PointTime(1, 0, true),
                        new RunEstimate.PointTime(1, 10, true), new RunEstimate.PointTime(1, 0, true)), 1);
    }

    @Test
    void beforeAnythingTheEtaIsTheWholeEstimateCountingDown() {
        Eta eta = new Eta(estimate());
        eta.begin(0);
        // 0.5 + 1.5 + 4 + 10 + 1 = 17 s
        assertEquals(17.0, eta.remainingS(0), 1e-9);
        assertEquals(16.0, eta.remainingS(S), 1e-9);
    }

    @Test
    void aMeterTwiceAsSlowAsExpectedDoublesItsWorkAheadButNotThePlannedWaits() {
        Eta eta = new Eta(estimate());
        eta.begin(0);
        eta.pointsStart(0, 3500 * S / 1000); // 0.5 s start, then 3 s of compensation for 1.5 s expected: ratio 2
        // remaining meter 4 s · 2 + the 10 s ramp + 1 s finish
        assertEquals(19.0, eta.remainingS(3500 * S / 1000), 1e-9);
        eta.measured(0, 5500 * S / 1000); // 2 s for 1 s expected: still 2
        assertEquals(3 * 2 + 10 + 1, eta.remainingS(5500 * S / 1000), 1e-9);
        eta.measured(1, 7500 * S / 1000);
        assertEquals(2 * 2 + 10 + 1, eta.remainingS(7500 * S / 1000), 1e-9);
        // the third point comes after its 10 s ramp and 2 s of meter work: the ramp is not the meter's
        eta.measured(2, 19500 * S / 1000);
        assertEquals(2 + 1, eta.remainingS(19500 * S / 1000), 1e-9);
    }

    @Test
    void aCompensationThatWasReusedSaysNothingAboutTheMetersSpeed() {
        Eta eta = new Eta(estimate());
        eta.begin(0);
        eta.pointsStart(0, S / 10); // 0.1 s instead of 2 s: the stored compensation was reused
        assertEquals(4 + 10 + 1, eta.remainingS(S / 10), 1e-9);
    }

    @Test
    void theRowsOfOneListSweepArrivingTogetherDoNotMakeTheEtaJump() {
        // issue 9: the ETA read 09:13 with 6 s left. A sweep of three 1 s points, then one more point.
        Eta eta = new Eta(new RunEstimate(0, 0, List.of(), List.of(),
                List.of(new RunEstimate.PointTime(1, 0, false), new RunEstimate.PointTime(1, 0, false),
                        new RunEstimate.PointTime(1, 0, true), new RunEstimate.PointTime(1, 0, true)), 0));
        eta.begin(0);
        eta.pointsStart(0, 0);
        eta.measured(0, 3 * S); // the sweep's 3 s are over; its rows come in one after the other
        assertEquals(3.0, eta.remainingS(3 * S), 1e-9);
        eta.measured(1, 3 * S);
        assertEquals(2.0, eta.remainingS(3 * S), 1e-9);
        eta.measured(2, 3 * S);
        assertEquals(1.0, eta.remainingS(3 * S), 1e-9);
    }

    @Test
    void aResumedRunCountsOnlyThePointsLeft() {
        Eta eta = new Eta(estimate());
        eta.begin(0);
        eta.pointsStart(3, 0);
        assertEquals(1 + 1, eta.remainingS(0), 1e-9);
    }
}
