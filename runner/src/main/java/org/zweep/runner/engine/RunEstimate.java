package org.zweep.runner.engine;

import java.util.ArrayList;
import java.util.List;
import org.zweep.runner.safety.BiasRamp;
import java.util.Map;
import java.util.TreeMap;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.meter.CorrectionStyle;
import org.zweep.driver.dialect.MeterTiming;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.plan.PlannedStep;

/**
 * How long a run of a plan takes, walked the way {@link RunEngine} and {@link Station} run it:
 * the meter's work from its dialect's {@link MeterTiming} (the same model the reply deadlines come
 * from), the host's planned waits (bias ramps at the step's rate, settling, point delays), a
 * small cost per round trip, counted as the engine sends them (a point measured at once after its
 * setting is one message where the dialect allows: {@link Station#measuresAtOnce},
 * {@link Dialect#roundTripsPerPoint}), and per row; rows are synced behind, so a sync costs only
 * what it outlasts the next trigger by. Compensation is counted as if measured (stored data that is
 * reused makes the run shorter); the time someone or something takes to change the fixture is not
 * counted. Immutable.
 *
 * @param startS connecting, identifying and resetting the meter, in s
 * @param compensationS preparing fixture compensation (every standard), in s
 * @param compensationStandardS each standard's share of {@code compensationS}, in order
 * @param steps each step's time
 * @param points per point index: the meter's work (its share of its trigger) and the host's waits
 *     and exchanges before it (a ramp down after a step counts before the next step's first point), in s
 * @param finishS after the last point: the last ramp down, the whole-sweep checks and the summary, in s
 */
public record RunEstimate(double startS, double compensationS, List<Double> compensationStandardS,
        List<StepTime> steps, List<PointTime> points, double finishS) {

    /**
     * The host's and the link's cost of one round trip with the meter beyond the meter's own work
     * (writing, the reply's way back, parsing), in s: 0.7 ms measured on the in-process simulator
     * (3.72 ms median against the 3 ms modelled), rounded up.
     */
    static final double EXCHANGE_S = 0.001;
    /**
     * Starting a run in a running JVM: opening the link, identifying, resetting, the run folder and
     * its manifest, the first use of each part of zweep, in s (measured on the shipped sequences).
     */
    static final double START_S = 1.0;
    /** Ending a run: the whole-sweep checks, the final manifest and the summary, in s. */
    static final double END_S = 0.5;
    /** Writing one result row (formatting, its check), in s. */
    static final double ROW_S = 0.001;
    /**
     * Making one trigger's rows durable (one {@code fdatasync}, 0.1–2 ms on the development
     * machine's disk), in s. It runs on a background thread while the next trigger is measured: the
     * host waits only for what it outlasts that trigger by.
     */
    static final double SYNC_S = 0.002;

    public RunEstimate {
        compensationStandardS = List.copyOf(compensationStandardS);
        steps = List.copyOf(steps);
        points = List.copyOf(points);
    }

    /**
     * One step's expected time.
     *
     * @param name the step's name
     * @param points how many points
     * @param meterS the meter's work (measuring), in s
     * @param waitS the host's waits (bias ramps, settling, delays) and command exchanges, in s
     */
    public record StepTime(String name, int points, double meterS, double waitS) {
        /** The step's whole time, in s. */
        public double totalS() {
            return meterS + waitS;
        }
    }

    /**
     * One point's share of the run.
     *
     * @param meterS the meter's work for it (its share of its trigger's), in s
     * @param waitS the host's waits and exchanges attributed to it, in s
     * @param endsTrigger whether it is the last point of its trigger (a list sweep's rows arrive together)
     */
    public record PointTime(double meterS, double waitS, boolean endsTrigger) {
    }

    /** The whole run, in s. */
    public double totalS() {
        return startS + compensationS + steps.stream().mapToDouble(StepTime::totalS).sum() + END_S;
    }

    /** The estimate of {@code plan} on the meter its dialect describes. */
    public static RunEstimate of(Plan plan) {
        return of(plan, Dialect.load(plan.meter().dialect()));
    }

    /** The estimate of {@code plan} on a meter speaking {@code dialect}. */
    public static RunEstimate of(Plan plan, Dialect dialect) {
        return new Walk(dialect).run(plan);
    }

    /** The walk through a plan, tracking what the meter last measured and the bias applied. */
    private static final class Walk {
        private final Dialect dialect;
        private final MeterTiming timing;
        private final MeterCapabilities caps;
        private MeasurementSetting previous;
        private Bias applied = Bias.OFF;
        private double meter;
        private double host;
        /** The meter's and the host's time of the steps before this one, in s. */
        private double before;
        /** When the sync in flight ends, on the clock of {@link #now()}, in s. */
        private double syncEnds;

        Walk(Dialect dialect) {
            this.dialect = dialect;
            this.timing = dialect.timing();
            this.caps = dialect.capabilities();
        }

        /** The time walked through the steps so far, in s. */
        private double now() {
            return before + meter + host;
        }

        RunEstimate run(Plan plan) {
            List<Double> standards = compensation(plan);
            double comp = standards.stream().mapToDouble(Double::doubleValue).sum();
            List<StepTime> steps = new ArrayList<>();
            List<PointTime> points = new ArrayList<>();
            double pending = 0; // host time after the last point, counted with the next one
            for (PlannedStep step : plan.steps()) {
                meter = 0;
                host = 0;
                exchange(2); // the fixture and the wiring
                pending += host;
                int max = caps.maxListPoints();
                for (List<PlannedPoint> chunk : RunEngine.chunks(step.points(), max)) {
                    double m0 = meter;
                    double h0 = host;
                    PlannedPoint first = chunk.get(0);
                    List<MeasurementSetting> settings = chunk.stream().map(PlannedPoint::setting).toList();
                    double sweepS = timing.sweepS(settings, previous);
                    if (chunk.size() == 1 && Station.measuresAtOnce(applied, first.setting().bias(), first.delayS())) {
                        // the setting travels with the trigger (Meter.measureAt)
                        exchange(dialect.roundTripsPerPoint(!first.setting().equals(previous)));
                    } else {
                        moveTo(first.setting(), step.bias());
                        host += first.delayS();
                        exchange(chunk.size() > 1 ? 2 : dialect.roundTripsPerPoint(false)); // list set-up and trigger
                    }
                    meter += sweepS;
                    // the rows wait for the sync in flight (the trigger before's), then their own starts
                    host += Math.max(0, syncEnds - now()) + chunk.size() * ROW_S;
                    syncEnds = now() + SYNC_S;
                    previous = settings.get(settings.size() - 1);
                    double share = (meter - m0) / chunk.size();
                    for (int i = 0; i < chunk.size(); i++) {
                        points.add(new PointTime(share, i == 0 ? host - h0 + pending : 0, i == chunk.size() - 1));
                    }
                    pending = 0;
                }
                double h0 = host;
                rampTo(0.0, step.bias());
                if (applied.on()) {
                    exchange(1);
                    applied = Bias.OFF;
                }
                pending += host - h0;
                steps.add(new StepTime(step.name(), step.points().size(), meter, host));
                before += meter + host;
                meter = 0;
                host = 0;
            }
            pending += Math.max(0, syncEnds - now()); // closing waits for the last sync
            return new RunEstimate(START_S, comp, standards, steps, points, pending + END_S);
        }

        /** Each standard's time, as {@code CompensationWorkflow} acquires or measures it. */
        private List<Double> compensation(Plan plan) {
            List<Double> out = new ArrayList<>();
            var fx = plan.fixture();
            if (fx.compensation() == CompensationMode.NONE || fx.standards().isEmpty()) {
                return out;
            }
            MeasurementSetting first = plan.points().stream().map(PlannedPoint::setting)
                    .filter(s -> s.quantity() == MeasuredQuantity.IMPEDANCE).findFirst()
                    .orElse(plan.points().get(0).setting()).withBias(Bias.OFF);
            for (CorrectionStandard s : fx.standards()) {
                double t = EXCHANGE_S; // the fixture
                if (fx.compensation() == CompensationMode.METER
                        && caps.correctionStyle() == CorrectionStyle.WHOLE_RANGE) {
                    t += 2 * EXCHANGE_S + timing.correctionS(first, caps.frequencyHz());
                    previous = null;
                } else {
                    // host-side, or a meter that acquires at the frequency it is set to: once per frequency
                    for (MeasurementSetting m : hostSettings(plan).values()) {
                        // Station.measure with bias off and no delay: at once
                        t += dialect.roundTripsPerPoint(!m.equals(previous)) * EXCHANGE_S + timing.pointS(m, previous);
                        previous = m;
                    }
                }
                out.add(t);
            }
            return out;
        }

        private void moveTo(MeasurementSetting target, BiasControl control) {
            Bias to = target.bias();
            boolean changed = false;
            if (applied.on() && (!to.on() || applied.mode() != to.mode())) {
                rampTo(0.0, control);
                exchange(1);
                applied = Bias.OFF;
                changed = true;
            }
            if (to.on() && (!applied.on() || applied.value() != to.value())) {
                applied = new Bias(to.mode(), applied.on() ? applied.value() : 0.0, true);
                rampTo(to.value(), control);
                changed = true;
            }
            exchange(1);
            applied = to;
            if (changed) {
                host += control.settleS();
            }
        }

        /** Steps the applied bias to {@code value} as {@code Station} does: the one ramp planner's steps and waits. */
        private void rampTo(double value, BiasControl control) {
            if (!applied.on() || applied.value() == value) {
                return;
            }
            List<BiasRamp.Step> steps = BiasRamp.plan(applied.value(), value, control.rampPerS(), Station.RAMP_STEP_S);
            host += steps.stream().mapToDouble(BiasRamp.Step::waitS).sum();
            exchange(steps.size());
            applied = new Bias(applied.mode(), value, true);
        }

        private void exchange(int n) {
            host += n * EXCHANGE_S;
        }
    }

    /**
     * The settings host-side compensation measures each standard at: one per distinct impedance
     * frequency of the plan (the first point's drive), bias off, ascending.
     */
    public static Map<Double, MeasurementSetting> hostSettings(Plan plan) {
        Map<Double, MeasurementSetting> bySetting = new TreeMap<>();
        for (PlannedPoint p : plan.points()) {
            MeasurementSetting s = p.setting();
            if (s.quantity() == MeasuredQuantity.IMPEDANCE) {
                bySetting.putIfAbsent(s.frequencyHz(), s.withBias(Bias.OFF));
            }
        }
        return new java.util.LinkedHashMap<>(bySetting);
    }

    /** {@code seconds} for people: {@code 4.2 s}, {@code 42 s}, {@code 3 min 5 s}, {@code 1 h 2 min}. */
    public static String format(double seconds) {
        if (seconds < 9.95) {
            return String.format(java.util.Locale.ROOT, "%.1f s", seconds);
        }
        long s = Math.round(seconds);
        if (s < 60) {
            return s + " s";
        }
        if (s < 3600) {
            return (s / 60) + " min " + (s % 60) + " s";
        }
        return (s / 3600) + " h " + ((s % 3600) / 60) + " min";
    }
}
