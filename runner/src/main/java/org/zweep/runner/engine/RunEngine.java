package org.zweep.runner.engine;

import org.zweep.runner.safety.Interruption;
import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import java.util.Locale;
import org.zweep.driver.MeterException;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.driver.uncertainty.UncertainImpedance;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.plan.PlannedStep;
import org.zweep.runner.plan.Wiring;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.verdict.CheckEvaluator;

/**
 * Measures a plan's points in the plan's order, skipping those already on disk, and hands each
 * finished row to a sink as soon as it is read. Uses the meter's list sweep for runs of points
 * that differ only in frequency when the meter has one, point by point otherwise. A meter-reported
 * error stops the step it happened in (the next steps still run); a lost link that cannot be
 * re-opened, a safety refusal or a stop request stops the run. DC bias is off when
 * {@link #run} returns or throws, brought down at the step's ramp rate on every one of these ways.
 * A trigger's rows are built, judged and written on a thread of the engine's own while the meter
 * measures the next trigger, no further behind than the {@link RowSync} allows; every row read is
 * written before {@link #run} returns. The meter is used from the caller's thread only. Not
 * thread-safe; one run per engine.
 */
public final class RunEngine {
    private final Plan plan;
    private final Station station;
    private final ReadingCorrector corrector;
    private final CheckEvaluator checks;
    private final ProgressListener progress;
    private final Interruption interruption;
    private final PointUncertainty uncertainty;
    private final Plausibility plausibility;
    private final RowSync rowSync;

    /**
     * @param plan what to measure
     * @param station the bench (already started)
     * @param corrector host-side fixture correction, or {@link ReadingCorrector#NONE}
     * @param checks the point checks; rows already on disk must have been counted into it
     * @param progress where progress goes
     * @param interruption stop requests
     */
    public RunEngine(Plan plan, Station station, ReadingCorrector corrector, CheckEvaluator checks,
            ProgressListener progress, Interruption interruption) {
        this(plan, station, corrector, PointUncertainty.NONE, checks, progress, interruption);
    }

    /**
     * As above, with each point's uncertainty from {@code uncertainty} (which should use the same
     * {@code corrector}).
     */
    public RunEngine(Plan plan, Station station, ReadingCorrector corrector, PointUncertainty uncertainty,
            CheckEvaluator checks, ProgressListener progress, Interruption interruption) {
        this(plan, station, corrector, uncertainty, checks, progress, interruption, RowSync.BEHIND);
    }

    /** As above, with the rows made durable as {@code rowSync} says. */
    public RunEngine(Plan plan, Station station, ReadingCorrector corrector, PointUncertainty uncertainty,
            CheckEvaluator checks, ProgressListener progress, Interruption interruption, RowSync rowSync) {
        this.rowSync = rowSync;
        this.plan = plan;
        this.station = station;
        this.corrector = corrector;
        this.uncertainty = uncertainty;
        this.checks = checks;
        this.progress = progress;
        this.interruption = interruption;
        this.plausibility = station.capabilities() == null ? Plausibility.PHASE_ONLY
                : new Plausibility(maxReadable(station));
    }

    /** The row status of a reading physics does not allow, measured twice. */
    static final String IMPLAUSIBLE = "implausible";

    private static double maxReadable(Station station) {
        double top = station.dialectImpedanceRangeMaxOhm();
        return top > 0 ? 10 * top : Double.POSITIVE_INFINITY;
    }

    /**
     * Runs the plan.
     *
     * @param done the indices of points already on disk; updated as points are written
     * @param sink receives each new row (with its check outcome); rows of one trigger (a point, or
     *     a whole list sweep) are made durable together, with the last of them (see {@link RowSink})
     * @return how the run ended
     */
    public RunResult run(BitSet done, RowSink sink) {
        int total = plan.points().size();
        List<String> problems = new ArrayList<>();
        RunResult.Outcome outcome = RunResult.Outcome.COMPLETED;
        progress.started(total, done.cardinality());
        // which points to skip is decided on the rows on disk when the run began: the writing
        // thread sets the bits of the points it writes meanwhile
        BitSet onDisk = (BitSet) done.clone();
        RowWritingThread rows = new RowWritingThread();
        try {
            try {
                for (PlannedStep step : plan.steps()) {
                    if (step.points().stream().allMatch(p -> onDisk.get(p.index()))) {
                        continue;
                    }
                    stopIfRequested();
                    try {
                        runStep(step, onDisk, done, sink, total, rows);
                    } catch (LinkLostException e) {
                        throw e;
                    } catch (MeterException e) {
                        String line = "step '" + step.name() + "' stopped: " + e.getMessage();
                        problems.add(line);
                        rows.then(() -> progress.note(line));
                        station.stopBias();
                    }
                }
                if (!problems.isEmpty()) {
                    outcome = RunResult.Outcome.FAILED;
                }
            } catch (RunInterruptedException e) {
                outcome = RunResult.Outcome.ABORTED;
                problems.add("stopped: " + e.getMessage());
            } catch (LinkLostException e) {
                outcome = RunResult.Outcome.FAILED;
                problems.add(e.getMessage());
            } finally {
                if (!station.stopBias()) {
                    rows.then(() -> progress.note("WARNING: could not confirm that DC bias is off on " + station.address()
                            + "; check the meter before touching the part"));
                }
            }
        } finally {
            try {
                // every row read from the meter is written before the run ends, whatever ended it
                rows.close();
            } finally {
                progress.finished();
            }
        }
        return new RunResult(outcome, total, done.cardinality(), problems);
    }

    /**
     * Measures {@code step}'s points not {@code onDisk}; their rows are written on {@code rows}'
     * thread, which sets them in {@code done}.
     */
    private void runStep(PlannedStep step, BitSet onDisk, BitSet done, RowSink sink, int total, RowWritingThread rows) {
        // every row so far is on disk before the operator may be asked for anything
        rows.awaitBehind(0);
        station.insert(FixtureState.PART, step.prompt(), step.bias());
        Wiring wiring = step.points().get(0).wiring();
        station.connect(wiring, step.bias(), !step.prompt().isEmpty());
        int max = station.capabilities() == null ? 0 : station.capabilities().maxListPoints();
        for (List<PlannedPoint> chunk : chunks(step.points(), max)) {
            if (chunk.stream().allMatch(p -> onDisk.get(p.index()))) {
                continue;
            }
            PlannedPoint first = chunk.get(0);
            // the rows on disk lag the meter by no more than the row sync allows, and not at all
            // when the wiring changes (the operator may be asked to change it)
            rows.awaitBehind(first.wiring() == wiring ? rowSync.triggersBehind() : 0);
            wiring = first.wiring();
            stopIfRequested();
            station.connect(first.wiring(), step.bias());
            List<Reading> readings = measure(chunk, step);
            List<String> problems = problems(readings);
            for (int i = 0; i < problems.size(); i++) {
                if (!problems.get(i).isEmpty()) {
                    // measured again: a reading corrupted on the way comes back right, a real one comes back
                    // the same
                    String line = "point " + chunk.get(i).index() + ": " + problems.get(i) + "; measuring again";
                    rows.then(() -> progress.note(line));
                    readings = measure(chunk, step);
                    problems = problems(readings);
                    break;
                }
            }
            List<Reading> read = readings;
            List<String> found = problems;
            rows.trigger(() -> write(chunk, step, read, found, onDisk, done, sink, total));
        }
        station.rampBiasOff(step.bias());
    }

    /** Builds, judges and writes the rows of one trigger's {@code readings} (on the writing thread). */
    private void write(List<PlannedPoint> chunk, PlannedStep step, List<Reading> readings, List<String> problems,
            BitSet onDisk, BitSet done, RowSink sink, int total) {
        int last = chunk.size() - 1;
        while (last > 0 && onDisk.get(chunk.get(last).index())) {
            last--;
        }
        for (int i = 0; i < chunk.size(); i++) {
            PlannedPoint p = chunk.get(i);
            if (onDisk.get(p.index())) {
                continue;
            }
            Reading raw = readings.get(i);
            PointRow row = row(p, step, corrector.correct(raw), uncertainty.of(raw));
            if (!problems.get(i).isEmpty()) {
                progress.note("point " + p.index() + ": " + problems.get(i) + " again; stored with status"
                        + " implausible");
                row = row.withStatus(IMPLAUSIBLE);
            }
            row = row.withCheck(checks.judge(row));
            sink.write(row, i == last);
            done.set(p.index());
            progress.measured(row, done.cardinality(), total);
        }
    }

    private List<Reading> measure(List<PlannedPoint> chunk, PlannedStep step) {
        PlannedPoint first = chunk.get(0);
        if (chunk.size() == 1) {
            return List.of(station.measure(first.setting(), step.bias(), first.delayS()));
        }
        List<Reading> readings = station.measureList(chunk.stream().map(PlannedPoint::setting).toList(), step.bias());
        if (readings.size() != chunk.size()) {
            throw new MeterException("the meter returned " + readings.size() + " readings for a list of "
                    + chunk.size() + " points");
        }
        return readings;
    }

    /** One entry per reading: what physics does not allow in it, or empty. */
    /**
     * Whether {@code r}'s only fault is a negative R that lies within three standard
     * uncertainties of zero: a nearly lossless part read by a meter that states its accuracy
     * (an R of −0.05 Ω with u(R) = 0.1 Ω is what such a part gives half the time).
     */
    private boolean negativeWithinUncertainty(Reading r) {
        if (!(r.real() < 0) || !Double.isFinite(r.imaginary()) || r.magnitude() > plausibility.maxImpedanceOhm()) {
            return false;
        }
        UncertainImpedance u = uncertainty.of(r);
        return u != null && r.real() >= -3 * u.uROhm();
    }

    private List<String> problems(List<Reading> readings) {
        return readings.stream().map(r -> plausibility.problem(r).filter(x -> !negativeWithinUncertainty(r))
                .orElse("")).toList();
    }

    private void stopIfRequested() {
        if (interruption.requested()) {
            throw new RunInterruptedException(interruption.reason());
        }
    }

    /**
     * Splits a step's points into runs measured with one trigger: consecutive points that differ
     * only in frequency, without their own delay, at most {@code maxList} long. With no list
     * sweep ({@code maxList} below 2), every point is its own run. The split depends only on the
     * plan, so a resumed run measures the same lists.
     */
    static List<List<PlannedPoint>> chunks(List<PlannedPoint> points, int maxList) {
        List<List<PlannedPoint>> out = new ArrayList<>();
        List<PlannedPoint> cur = new ArrayList<>();
        for (PlannedPoint p : points) {
            boolean joins = maxList >= 2 && !cur.isEmpty() && cur.size() < maxList && p.delayS() == 0.0
                    && listCompatible(cur.get(0), p);
            if (!joins && !cur.isEmpty()) {
                out.add(cur);
                cur = new ArrayList<>();
            }
            cur.add(p);
        }
        if (!cur.isEmpty()) {
            out.add(cur);
        }
        return out;
    }

    private static boolean listCompatible(PlannedPoint a, PlannedPoint b) {
        MeasurementSetting x = a.setting();
        MeasurementSetting y = b.setting();
        return a.stepIndex() == b.stepIndex() && a.repeat() == b.repeat() && a.wiring() == b.wiring()
                && x.withFrequencyHz(y.frequencyHz()).equals(y);
    }

    /** The result row for point {@code p} of {@code step} read as {@code r}. */
    static PointRow row(PlannedPoint p, PlannedStep step, Reading r) {
        return row(p, step, r, null);
    }

    /** As {@link #row(PlannedPoint, PlannedStep, Reading)} with the corrected reading's uncertainty (null: unknown). */
    static PointRow row(PlannedPoint p, PlannedStep step, Reading r, UncertainImpedance u) {
        MeasurementSetting s = r.setting() != null ? r.setting() : p.setting();
        boolean ratio = s.quantity() == MeasuredQuantity.VOLTAGE_RATIO;
        PointRow.Conditions c = new PointRow.Conditions(ratio ? "voltage_ratio" : "impedance",
                p.wiring().name().toLowerCase(Locale.ROOT), s.frequencyHz(),
                new PointRow.Source(s.drive().mode().unit(), s.drive().levelRms()),
                new PointRow.Source(s.bias().mode().unit(), s.bias().appliedValue()));
        return PointRow.of(new PointRow.Key(p.index(), step.name(), p.stepIndex(), p.repeat()), c,
                r.status() == ReadingStatus.OK, r.real(), r.imaginary(), u, "", r.timestamp());
    }
}
