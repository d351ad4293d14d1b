package org.zweep.runner.engine;

import org.zweep.runner.safety.BiasWatcher;
import java.util.List;
import java.util.function.Consumer;
import java.util.function.Supplier;
import org.zweep.driver.MeterException;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.MeterIdentity;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.SourceMode;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.Wiring;
import org.zweep.runner.safety.BiasRamp;
import org.zweep.runner.safety.SafetyGuard;

/**
 * The bench as the engine uses it: the meter behind a {@link MeterLink}, the fixture and the
 * operator. It checks every setting against the safety limits before sending it, never changes
 * DC bias faster than the step's ramp limit (intermediate steps, planned by {@link BiasRamp}) and
 * settles after a change. It drives the meter through a {@link ReconnectingMeter}, which reconnects
 * after a lost link or a timeout, restores the meter's state and repeats the interrupted call.
 * Everything that changes what is in the fixture goes through its {@link FixturePort}, with bias off.
 *
 * <p>Driven by one thread; only {@link #biasOffNow()} may be called from another (a shutdown hook).
 */
public final class Station {
    /** The longest wait between two bias steps of a ramp, in seconds. */
    static final double RAMP_STEP_S = BiasRamp.MAX_STEP_S;

    private final MeterLink link;
    private final ReconnectingMeter meter;
    private final SafetyGuard guard;
    private final FixturePort fixture;
    private final Waiter waiter;
    private final Consumer<String> log;

    private MeterIdentity identity;
    private MeterCapabilities capabilities;
    private MeterCapabilities statedLimits;
    private double topRangeOhm;
    /** What the fixture was last brought to (null: not known), and the second winding. */
    private FixtureState held;
    private Wiring wiring = Wiring.NONE;
    private volatile java.util.function.ObjDoubleConsumer<String> work = (what, expectedS) -> { };

    /**
     * @param link the meter connection
     * @param guard the safety limits every setting is checked against before it is sent
     * @param fixture changes what is in the fixture
     * @param waiter host-side waits
     * @param policy how to reconnect
     * @param log where one-line notes go (reconnects)
     */
    public Station(MeterLink link, SafetyGuard guard, FixturePort fixture, Waiter waiter, ReconnectPolicy policy,
            Consumer<String> log) {
        this.link = link;
        this.meter = new ReconnectingMeter(link, policy, waiter, log);
        this.guard = guard;
        this.fixture = fixture;
        this.waiter = waiter;
        this.log = log;
    }

    /** Identifies the meter and resets it (bias off). */
    public void start() {
        identity = meter.identify();
        capabilities = meter.capabilities();
        meter.reset();
        statedLimits = meter.statedLimits();
        topRangeOhm = link.meter() instanceof org.zweep.driver.dialect.DialectMeter d
                ? d.dialect().impedanceRangeOhm().max() : 0.0;
    }

    /** The meter's identity (after {@link #start}). */
    public MeterIdentity identity() {
        return identity;
    }

    /** The meter's capabilities (after {@link #start}). */
    public MeterCapabilities capabilities() {
        return capabilities;
    }

    /**
     * The capabilities with the ranges the meter itself states (its minimum and maximum answers,
     * where the dialect declares the queries), asked at {@link #start}.
     */
    public MeterCapabilities statedLimits() {
        return statedLimits;
    }

    /** The upper limit of the meter's highest impedance range in ohms (its dialect's), 0 when unknown. */
    public double dialectImpedanceRangeMaxOhm() {
        return topRangeOhm;
    }

    /** The address of the meter. */
    public String address() {
        return link.address();
    }

    /** How often the link was re-opened so far. */
    public int reconnects() {
        return meter.reconnects();
    }

    /**
     * Gets {@code state} into the fixture through the fixture port, bias off first. The port is
     * asked when the state changes or {@code instruction} is not empty; a change without an
     * instruction (the part back after the standards) gets one of its own.
     */
    public void insert(FixtureState state, String instruction, BiasControl bias) {
        if (state == held && instruction.isEmpty()) {
            return;
        }
        rampBiasOff(bias);
        String text = instruction.isEmpty() && held != null ? standardInstruction(state) : instruction;
        meter.holdFixture(state, "changing the fixture to " + FixturePort.word(state), () -> fixture.hold(state, text));
        held = state;
    }

    /** What an operator is told to bring about {@code state} when the sequence says nothing. */
    public static String standardInstruction(FixtureState state) {
        return switch (state) {
            case PART -> "put the part back into the fixture";
            case OPEN -> "OPEN standard: leave the fixture's terminals open (nothing inserted)";
            case SHORT -> "SHORT standard: insert the shorting bar across the fixture's terminals";
            case LOAD -> "LOAD standard: insert the known load standard";
            case SECONDARY_OPEN -> "leave the second winding open";
            case SECONDARY_SHORTED -> "short the second winding";
        };
    }

    /**
     * Gets a transformer's second winding connected as {@code w} (nothing for {@link Wiring#NONE}
     * or when already so) through the fixture port, bias off first.
     */
    public void connect(Wiring w, BiasControl bias) {
        connect(w, bias, false);
    }

    /**
     * As {@link #connect(Wiring, BiasControl)}; {@code told} says the step's own instruction
     * (given with {@link #insert}) covers the wiring, so an operator is not asked again.
     */
    public void connect(Wiring w, BiasControl bias, boolean told) {
        if (w == Wiring.NONE || w == wiring) {
            return;
        }
        rampBiasOff(bias);
        FixtureState state = w == Wiring.SECONDARY_SHORTED ? FixtureState.SECONDARY_SHORTED
                : FixtureState.SECONDARY_OPEN;
        meter.holdFixture(state, "switching the wiring", () -> fixture.hold(state, told ? "" : standardInstruction(state)));
        wiring = w;
    }

    /**
     * Measures one point: moves to {@code s} (bias ramped and settled), waits {@code delayS},
     * triggers and reads.
     */
    public Reading measure(MeasurementSetting s, BiasControl bias, double delayS) {
        check(s);
        if (measuresAtOnce(meter.appliedBias(), s.bias(), delayS)) {
            // nothing to wait for between setting and trigger: one message where the meter allows
            return meter.measureAt(s);
        }
        moveTo(s, bias);
        waiter.waitS(delayS);
        return meter.measure(delayS);
    }

    /** Measures a list of settings that differ only in frequency with the meter's list sweep. */
    public List<Reading> measureList(List<MeasurementSetting> settings, BiasControl bias) {
        for (MeasurementSetting s : settings) {
            check(s);
        }
        moveTo(settings.get(0), bias);
        return meter.measureList(settings);
    }

    /**
     * Where announcements of long pieces of work without points of their own go (compensation
     * standards, bias ramps): what is being done and its expected time in s.
     */
    public void reportWorkTo(java.util.function.ObjDoubleConsumer<String> listener) {
        this.work = listener;
    }

    /** Announces a piece of work about to start and its expected time in s (see {@link #reportWorkTo}). */
    public void announce(String what, double expectedS) {
        work.accept(what, expectedS);
    }

    /** Moves the meter to {@code s} (checked against the safety limits, bias ramped) without measuring. */
    public void applySetting(MeasurementSetting s) {
        String at = org.zweep.runner.text.Figures.format(s.frequencyHz(), org.zweep.driver.impedance.Unit.HERTZ, 6);
        guard.check(s, "setting at " + at);
        moveTo(s, BiasControl.NONE);
    }

    /** Tells the meter to acquire {@code standard} now inserted. */
    public void acquireCorrection(CorrectionStandard standard) {
        meter.acquireCorrection(standard);
    }

    /**
     * Tells the meter to acquire {@code standard} now inserted at each of {@code settings} (checked
     * against the safety limits; bias off, brought down first at the rate it went up), in one list
     * message where its dialect allows (see {@link Meter#acquireCorrection(CorrectionStandard, List)}).
     */
    public void acquireCorrection(CorrectionStandard standard, List<MeasurementSetting> settings) {
        for (MeasurementSetting s : settings) {
            if (s.bias().on()) {
                throw new IllegalArgumentException("a correction standard is acquired with bias off");
            }
            guard.check(s, "setting at " + org.zweep.runner.safety.SafetyGuard.human(s.frequencyHz(), "Hz"));
        }
        rampBiasOff(BiasControl.NONE);
        meter.acquireCorrection(standard, settings);
    }

    /** Tells the meter its load standard's value. */
    public void setLoadStandard(Impedance known) {
        meter.setLoadStandard(known);
    }

    /** Switches the meter's own correction on or off (restored after a reconnect). */
    public void setMeterCorrection(boolean on) {
        meter.setCorrectionEnabled(on);
    }

    /**
     * Brings bias down to zero, no faster than {@code bias} allows nor than it went up, and
     * switches it off. The ramp's waits go on through a stop request (Ctrl-C, a termination
     * signal): only the end of the process cuts it short.
     */
    public void rampBiasOff(BiasControl bias) {
        if (!meter.appliedBias().on()) {
            return;
        }
        rampDownNow(downRate(bias));
    }

    /**
     * Brings bias down at the ramp rate it went up at and switches it off, whatever stopped the
     * run; falls back to {@link #biasOffNow()} (and says so) only when the ramp cannot be done.
     * Never throws.
     *
     * @return whether the meter confirmed that bias is off
     */
    public boolean stopBias() {
        try {
            rampBiasOff(meter.rampControl());
        } catch (RuntimeException e) {
            // given up on (a lost link, a meter error): once more on a fresh connection, still ramped
            try {
                meter.reopen();
                rampDownNow(meter.rampControl().rampPerS());
                log.accept("reconnected to " + link.address() + " and brought DC bias down at the ramp rate");
            } catch (RuntimeException second) {
                log.accept("could not ramp DC bias down (" + e.getMessage() + "); switching it off at once,"
                        + " without a ramp");
            }
        }
        return biasOffNow();
    }

    /** Makes {@code w} hear of every bias change before it is sent (the guard process's feed). */
    public void watchBias(BiasWatcher w) {
        meter.watchBias(w);
    }

    private double downRate(BiasControl bias) {
        return Math.min(bias.rampPerS(), meter.rampControl().rampPerS());
    }

    /** Ramps the applied bias to 0 at {@code rate} on the link as it is, then switches bias off. */
    private void rampDownNow(double rate) {
        Bias applied = meter.appliedBias();
        if (!applied.on()) {
            return;
        }
        MeasurementSetting lastSetting = meter.lastSetting();
        if (lastSetting != null) {
            double seconds = BiasRamp.durationS(applied.value(), 0.0, rate);
            if (seconds >= 1.0) {
                // Tell the operator why nothing seems to happen for a while.
                log.accept(String.format(java.util.Locale.ROOT, "bringing DC bias from %s %s down to 0 at"
                        + " %s %s/s (about %.0f s)", ConsoleProgress.num(applied.value()), applied.mode().unit(),
                        ConsoleProgress.num(rate), applied.mode().unit(), seconds));
            }
            ramp(lastSetting, applied.mode(), applied.value(), 0.0, rate, true);
        }
        meter.biasOff();
        meter.rampControl(BiasControl.NONE);
    }

    /**
     * Turns bias off at once, reconnecting once if the link is down. Never throws; safe to call
     * from another thread.
     *
     * @return whether the meter confirmed it
     */
    public boolean biasOffNow() {
        return meter.biasOffAtOnce();
    }

    /** The DC bias as last applied through this station. */
    public Bias appliedBias() {
        return meter.appliedBias();
    }

    private void moveTo(MeasurementSetting target, BiasControl control) {
        Bias from = meter.appliedBias();
        Bias to = target.bias();
        double rate = control.rampPerS();
        boolean changed = false;
        if (from.on() && (!to.on() || from.mode() != to.mode())) {
            ramp(target, from.mode(), from.value(), 0.0, downRate(control), false);
            apply(target.withBias(new Bias(from.mode(), 0.0, false)));
            changed = true;
            from = Bias.OFF;
        }
        if (to.on()) {
            meter.rampControl(control);
            double start = from.on() ? from.value() : 0.0;
            if (!from.on() || start != to.value()) {
                ramp(target, to.mode(), start, to.value(), rate, false);
                changed = true;
            }
        }
        apply(target);
        if (changed) {
            waiter.waitS(control.settleS());
        }
    }

    /**
     * Steps bias from {@code a} to {@code b} no faster than {@code rate}, ending at {@code b}
     * applied, as {@link BiasRamp} plans it; {@code stopping} ramps go on through a stop request.
     */
    private void ramp(MeasurementSetting base, SourceMode mode, double a, double b, double rate, boolean stopping) {
        List<BiasRamp.Step> steps = BiasRamp.plan(a, b, rate, RAMP_STEP_S);
        double total = steps.stream().mapToDouble(BiasRamp.Step::waitS).sum();
        if (total >= 0.5) {
            work.accept(String.format(java.util.Locale.ROOT, "ramping DC bias %s → %s %s", ConsoleProgress.num(a),
                    ConsoleProgress.num(b), mode.unit()), total);
        }
        for (BiasRamp.Step step : steps) {
            apply(base.withBias(new Bias(mode, step.value(), true)));
            if (stopping) {
                waiter.waitThroughStopS(step.waitS());
            } else {
                try {
                    waiter.waitS(step.waitS());
                } catch (RunInterruptedException e) {
                    // hold this value its full step before the ramp down starts from it
                    waiter.waitThroughStopS(step.waitS());
                    throw e;
                }
            }
        }
    }

    /** Refuses {@code s} when it is outside the safety limits, naming it; nothing is formatted when it is within. */
    private void check(MeasurementSetting s) {
        if (guard.problem(s) != null) {
            guard.check(s, "setting at " + org.zweep.runner.safety.SafetyGuard.human(s.frequencyHz(), "Hz"));
        }
    }

    /**
     * Whether {@link #measure} sends a point's setting and trigger together ({@link Meter#measureAt}):
     * no delay before it, and the meter already holds its bias (nothing to ramp or settle). The
     * run estimate walks a plan with the same rule.
     */
    static boolean measuresAtOnce(Bias applied, Bias wanted, double delayS) {
        return delayS <= 0 && (!wanted.on() && !applied.on() || wanted.on() && applied.on()
                && wanted.mode() == applied.mode() && wanted.value() == applied.value());
    }

    private void apply(MeasurementSetting s) {
        check(s);
        meter.apply(s);
    }
}
