package org.zweep.runner.engine;

import java.util.BitSet;
import java.util.List;

/**
 * The time left in a run, from its {@link RunEstimate} and the time measured so far for each kind
 * of work: the host's planned waits (bias ramps, settling, delays) count as planned; the meter's
 * work is scaled by how long it has really taken so far against what the timing model expected
 * (compensation first, then the points, judged when a trigger's last row is in). Between two events the estimate counts down. Not
 * thread-safe; times are nanoseconds of a monotonic clock.
 */
final class Eta {
    /** The meter's measured-to-expected ratio is trusted once this much meter work is done, in s. */
    static final double MIN_MEASURED_S = 0.5;
    private static final double MIN_RATIO = 0.25;
    private static final double MAX_RATIO = 4;

    private final List<RunEstimate.PointTime> points;
    private final double startS;
    private final double compensationS;
    private final double finishS;
    private final BitSet done;
    private long beginNs;
    private boolean pointsStarted;
    private long pointsStartNs;
    private double ratio = 1;
    private double doneMeterS;
    private double doneWaitS;
    private double remainingAtEventS;
    private long eventNs;

    Eta(RunEstimate estimate) {
        this.points = estimate.points();
        this.startS = estimate.startS();
        this.compensationS = estimate.compensationS();
        this.finishS = estimate.finishS();
        this.done = new BitSet(points.size());
    }

    /** The run begins (before connecting and compensation). */
    void begin(long nowNs) {
        beginNs = nowNs;
        eventNs = nowNs;
        remainingAtEventS = startS + compensationS + remainingPointsS();
    }

    /**
     * The points begin, the first {@code alreadyDone} of them already on disk (a resumed run); the
     * time since {@link #begin} was start and compensation.
     */
    void pointsStart(int alreadyDone, long nowNs) {
        done.set(0, Math.min(alreadyDone, points.size()));
        // the compensation was the meter's work; one that was reused (or done before a resume)
        // took no time and says nothing about the meter's speed
        double r = ((nowNs - beginNs) / 1e9 - startS) / compensationS;
        if (compensationS >= 2 * MIN_MEASURED_S && r >= 0.5 && r <= 2) {
            ratio = r;
        }
        pointsStarted = true;
        pointsStartNs = nowNs;
        eventNs = nowNs;
        remainingAtEventS = remainingPointsS();
    }

    /** Point {@code index} was measured. */
    void measured(int index, long nowNs) {
        if (!pointsStarted) {
            pointsStart(0, nowNs);
        }
        if (index >= 0 && index < points.size() && !done.get(index)) {
            done.set(index);
            doneMeterS += points.get(index).meterS();
            doneWaitS += points.get(index).waitS();
        }
        double elapsedS = (nowNs - pointsStartNs) / 1e9;
        boolean triggerDone = index < 0 || index >= points.size() || points.get(index).endsTrigger();
        if (triggerDone && doneMeterS >= MIN_MEASURED_S) {
            ratio = clamp((elapsedS - doneWaitS) / doneMeterS);
        }
        eventNs = nowNs;
        remainingAtEventS = remainingPointsS();
    }

    /** The time left at {@code nowNs}, in s: the last event's estimate counted down, never below 0. */
    double remainingS(long nowNs) {
        return Math.max(0, remainingAtEventS - (nowNs - eventNs) / 1e9);
    }

    private double remainingPointsS() {
        double t = finishS;
        for (int i = done.nextClearBit(0); i < points.size(); i = done.nextClearBit(i + 1)) {
            t += points.get(i).meterS() * ratio + points.get(i).waitS();
        }
        return t;
    }

    private static double clamp(double r) {
        return Math.max(MIN_RATIO, Math.min(MAX_RATIO, r));
    }
}
