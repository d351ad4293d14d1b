package org.zweep.runner.engine;

import java.util.List;
import java.util.Optional;
import java.util.function.Consumer;
import java.util.function.Supplier;
import org.zweep.driver.MeterException;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.MeterIdentity;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.SourceMode;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.Wiring;
import org.zweep.runner.safety.SafetyGuard;

/**
 * The bench as the engine uses it: the meter behind a {@link MeterLink}, the fixture and the
 * operator. It checks every setting against the safety limits before sending it, never changes
 * DC bias faster than the step's ramp limit (intermediate steps) and settles after a change,
 * reconnects with back-off after a lost link or a timeout and then turns bias off, restores the
 * meter's state and repeats the interrupted operation, and switches the simulator's fixture
 * instead of prompting when the meter is the simulator.
 *
 * <p>Driven by one thread; only {@link #biasOffNow()} may be called from another (a shutdown hook).
 */
public final class Station {
    /** The longest wait between two bias steps of a ramp, in seconds. */
    static final double RAMP_STEP_S = 0.1;

    private final MeterLink link;
    private final SafetyGuard guard;
    private final Prompter prompter;
    private final Waiter waiter;
    private final ReconnectPolicy policy;
    private final Consumer<String> log;

    private MeterIdentity identity;
    private MeterCapabilities capabilities;
    private MeterCapabilities statedLimits;
    private double topRangeOhm;
    private volatile Bias applied = Bias.OFF;
    /** The bias of the setting being sent (it may or may not have reached the meter). */
    private Bias sending;
    private boolean meterCorrection;
    private SimulatorControl.Slot slot;
    private Wiring wiring = Wiring.NONE;
    private Long seed;
    private int reconnects;
    private MeasurementSetting lastSetting;
    /** Reconnect attempts and back-off waited since the last operation that succeeded. */
    private int budgetAttempts;
    private double budgetWaitedS;
    /** Settings the meter accepted in the current attempt of an operation, and the most in any attempt. */
    private int acceptedThisAttempt;
    private int mostAccepted;

    /**
     * @param link the meter connection
     * @param guard the safety limits every setting is checked against before it is sent
     * @param prompter asks the operator (not used on the simulator)
     * @param waiter host-side waits
     * @param policy how to reconnect
     * @param log where one-line notes go (reconnects, prompts passed on the simulator)
     */
    public Station(MeterLink link, SafetyGuard guard, Prompter prompter, Waiter waiter, ReconnectPolicy policy,
            Consumer<String> log) {
        this.link = link;
        this.guard = guard;
        this.prompter = prompter;
        this.waiter = waiter;
        this.policy = policy;
        this.log = log;
    }

    /**
     * Identifies the meter, resets it (bias off) and, on the simulator, sets the noise seed.
     *
     * @param noiseSeed the simulator's seed; {@code null} leaves it as it is
     */
    public void start(Long noiseSeed) {
        this.seed = noiseSeed;
        withRetry("identifying the meter", () -> {
            Meter m = link.meter();
            identity = m.identify();
            capabilities = m.capabilities();
            m.reset();
            statedLimits = m.statedLimits();
            topRangeOhm = m instanceof org.zweep.driver.dialect.DialectMeter d ? d.dialect().impedanceRangeOhm().max()
                    : 0.0;
            applied = Bias.OFF;
            if (seed != null) {
                link.simulator().ifPresent(s -> s.setSeed(seed));
            }
            return null;
        });
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

    /** Whether the meter is the simulator (prompts pass by themselves). */
    public boolean onSimulator() {
        return link.simulator().isPresent();
    }

    /** The address of the meter. */
    public String address() {
        return link.address();
    }

    /** How often the link was re-opened so far. */
    public int reconnects() {
        return reconnects;
    }

    /**
     * Gets {@code s} fitted to the fixture and the second winding connected as {@code w}: turns
     * bias off, then switches the simulator's slot and wiring, or prompts the operator with
     * {@code instruction} (when not empty), whose instruction is taken to cover the wiring too.
     */
    public void fit(SimulatorControl.Slot s, String instruction, BiasControl bias, Wiring w) {
        rampBiasOff(bias);
        Optional<SimulatorControl> sim = link.simulator();
        if (sim.isPresent()) {
            if (s != slot) {
                withRetry("switching the fixture", () -> {
                    link.simulator().orElseThrow().setSlot(s);
                    return null;
                });
                slot = s;
            }
            if (!instruction.isEmpty() && prompter.onSimulator()) {
                prompter.prompt(instruction);
            } else if (!instruction.isEmpty()) {
                log.accept(">> " + instruction + " (simulator: fixture holds " + s.name().toLowerCase(java.util.Locale.ROOT)
                        + ")");
            }
            connect(w, bias);
        } else {
            if (!instruction.isEmpty()) {
                prompter.prompt(instruction);
            }
            if (w != Wiring.NONE) {
                wiring = w;
            }
        }
    }

    /**
     * Gets a transformer's second winding connected as {@code w} (nothing for {@link Wiring#NONE}
     * or when already so): switched on the simulator, prompted for otherwise.
     */
    public void connect(Wiring w, BiasControl bias) {
        if (w == Wiring.NONE || w == wiring) {
            return;
        }
        rampBiasOff(bias);
        if (link.simulator().isPresent()) {
            withRetry("switching the wiring", () -> {
                link.simulator().orElseThrow().setWiring(w);
                return null;
            });
        } else {
            prompter.prompt(w == Wiring.SECONDARY_SHORTED ? "short the second winding" : "leave the second winding open");
        }
        wiring = w;
    }

    /**
     * Measures one point: moves to {@code s} (bias ramped and settled), waits {@code delayS}, keys
     * the simulator's noise with {@code noiseKey}, triggers and reads.
     */
    public Reading measure(MeasurementSetting s, BiasControl bias, double delayS, long noiseKey) {
        guard.check(s, "setting at " + org.zweep.runner.safety.SafetyGuard.human(s.frequencyHz(), "Hz"));
        return withRetry("measuring at " + org.zweep.runner.safety.SafetyGuard.human(s.frequencyHz(), "Hz"), () -> {
            moveTo(s, bias);
            waiter.waitS(delayS);
            link.simulator().ifPresent(c -> c.setNoiseKey(noiseKey));
            return link.meter().measure();
        });
    }

    /**
     * Measures a list of settings that differ only in frequency with the meter's list sweep,
     * keying the simulator's noise with {@code noiseKey} once for the list.
     */
    public List<Reading> measureList(List<MeasurementSetting> settings, BiasControl bias, long noiseKey) {
        for (MeasurementSetting s : settings) {
            guard.check(s, "setting at " + org.zweep.runner.safety.SafetyGuard.human(s.frequencyHz(), "Hz"));
        }
        return withRetry("measuring a list of " + settings.size() + " points", () -> {
            moveTo(settings.get(0), bias);
            link.simulator().ifPresent(c -> c.setNoiseKey(noiseKey));
            return link.meter().measureList(settings);
        });
    }

    /** Tells the meter to acquire {@code standard} now fitted. */
    public void acquireCorrection(CorrectionStandard standard) {
        withRetry("acquiring the " + standard + " correction", () -> {
            // keyed like a point, so that an acquisition repeated after a reconnect draws the same noise
            link.simulator().ifPresent(c -> c.setNoiseKey(-(1L << 40) - standard.ordinal() * 1_000_000L));
            link.meter().acquireCorrection(standard);
            return null;
        });
    }

    /** Tells the meter its load standard's value. */
    public void setLoadStandard(Impedance known) {
        withRetry("setting the load standard", () -> {
            link.meter().setLoadStandard(known);
            return null;
        });
    }

    /** Switches the meter's own correction on or off (restored after a reconnect). */
    public void setMeterCorrection(boolean on) {
        withRetry("switching the meter's correction", () -> {
            link.meter().setCorrectionEnabled(on);
            return null;
        });
        meterCorrection = on;
    }

    /** Brings bias down to zero at the ramp limit and switches it off. */
    public void rampBiasOff(BiasControl bias) {
        Bias from = applied;
        if (!from.on()) {
            return;
        }
        withRetry("turning bias off", () -> {
            if (applied.on()) {
                if (lastSetting != null) {
                    double seconds = Math.abs(applied.value()) / bias.rampPerS();
                    if (seconds >= 1.0) {
                        // Tell the operator why nothing seems to happen for a while.
                        log.accept(String.format(java.util.Locale.ROOT, "bringing DC bias from %s %s down to 0 at"
                                + " %s %s/s (about %.0f s)", ConsoleProgress.num(applied.value()), applied.mode().unit(),
                                ConsoleProgress.num(bias.rampPerS()), applied.mode().unit(), seconds));
                    }
                    ramp(lastSetting, applied.mode(), applied.value(), 0.0, bias.rampPerS());
                }
                link.meter().biasOff();
                applied = Bias.OFF;
            }
            return null;
        });
    }

    /**
     * Turns bias off at once, reconnecting once if the link is down. Never throws; safe to call
     * from another thread.
     *
     * @return whether the meter confirmed it
     */
    public boolean biasOffNow() {
        try {
            link.meter().biasOff();
            applied = Bias.OFF;
            return true;
        } catch (MeterException e) {
            if (!link.isLinkFailure(e)) {
                return false;
            }
        } catch (RuntimeException e) {
            return false;
        }
        try {
            link.reconnect().biasOff();
            applied = Bias.OFF;
            log.accept("bias turned off after reconnecting to " + link.address());
            return true;
        } catch (RuntimeException e) {
            return false;
        }
    }

    /** The DC bias as last applied through this station. */
    public Bias appliedBias() {
        return applied;
    }

    private void moveTo(MeasurementSetting target, BiasControl control) {
        Bias from = applied;
        Bias to = target.bias();
        double rate = control.rampPerS();
        boolean changed = false;
        if (from.on() && (!to.on() || from.mode() != to.mode())) {
            ramp(target, from.mode(), from.value(), 0.0, rate);
            apply(target.withBias(new Bias(from.mode(), 0.0, false)));
            changed = true;
            from = Bias.OFF;
        }
        if (to.on()) {
            double start = from.on() ? from.value() : 0.0;
            if (!from.on() || start != to.value()) {
                ramp(target, to.mode(), start, to.value(), rate);
                changed = true;
            }
        }
        apply(target);
        if (changed) {
            waiter.waitS(control.settleS());
        }
    }

    /** Steps bias from {@code a} to {@code b} no faster than {@code rate}, ending at {@code b} applied. */
    private void ramp(MeasurementSetting base, SourceMode mode, double a, double b, double rate) {
        if (a == b) {
            return;
        }
        int n = 1;
        double total = 0.0;
        if (Double.isFinite(rate) && rate > 0) {
            total = Math.abs(b - a) / rate;
            n = Math.max(1, (int) Math.ceil(total / RAMP_STEP_S - 1e-9));
        }
        for (int k = 1; k <= n; k++) {
            double v = k == n ? b : a + (b - a) * k / n;
            apply(base.withBias(new Bias(mode, v, true)));
            waiter.waitS(total / n);
        }
    }

    /**
     * Whether {@code b}, read back after a reconnect, is where this station left the bias: on, in
     * the same mode, at the last level the meter acknowledged or at the one being sent when the
     * link broke (within 1e-6 of it, for the reply's rounding).
     */
    private boolean whereLeft(Bias b) {
        if (!b.on() || b.mode() != applied.mode()) {
            return false;
        }
        return near(b.value(), applied.value()) || (sending != null && sending.on() && sending.mode() == b.mode()
                && near(b.value(), sending.value()));
    }

    private static boolean near(double a, double b) {
        return Math.abs(a - b) <= 1e-6 * Math.max(1.0, Math.abs(b));
    }

    private void apply(MeasurementSetting s) {
        guard.check(s, "setting at " + org.zweep.runner.safety.SafetyGuard.human(s.frequencyHz(), "Hz"));
        sending = s.bias();
        link.meter().apply(s);
        lastSetting = s;
        applied = s.bias();
        acceptedThisAttempt++;
    }

    private <T> T withRetry(String what, Supplier<T> op) {
        while (true) {
            acceptedThisAttempt = 0;
            try {
                T result = op.get();
                budgetAttempts = 0;
                budgetWaitedS = 0.0;
                mostAccepted = 0;
                return result;
            } catch (MeterException e) {
                if (!link.isLinkFailure(e)) {
                    throw e;
                }
                if (acceptedThisAttempt > mostAccepted) {
                    // got further than every attempt before (a long bias ramp on a link that drops at
                    // random): progress, so the budget starts again; a fault that strikes at the same
                    // place on every connection makes no progress and still uses the budget up
                    mostAccepted = acceptedThisAttempt;
                    budgetAttempts = 0;
                    budgetWaitedS = 0.0;
                }
                recover(what, e);
            }
        }
    }

    private void recover(String what, MeterException cause) {
        log.accept("link to " + link.address() + " failed while " + what + ": " + cause.getMessage()
                + "; reconnecting");
        MeterException last = cause;
        for (int attempt = 1;; attempt++) {
            double delay = Math.min(policy.maxDelayS(), policy.firstDelayS() * Math.pow(policy.factor(), budgetAttempts));
            if (budgetAttempts + 1 > policy.maxAttempts() || budgetWaitedS + delay > policy.budgetS() + 1e-9) {
                throw new LinkLostException("lost the link to " + link.address() + " while " + what
                        + " and could not reconnect (" + budgetAttempts + " attempts in " + fmt(budgetWaitedS)
                        + " s since the last successful operation): " + last.getMessage(), last);
            }
            waiter.waitS(delay);
            budgetWaitedS += delay;
            budgetAttempts++;
            try {
                Meter m = link.reconnect();
                reconnects++;
                Bias held = applied.on() ? m.readBias().filter(this::whereLeft).orElse(null) : null;
                if (held != null) {
                    // the meter holds the bias where the ramp left it: keep it and go on from there,
                    // rather than switching it off abruptly and ramping all the way up again
                    applied = held;
                } else {
                    m.biasOff();
                    applied = Bias.OFF;
                    lastSetting = null;
                }
                if (meterCorrection) {
                    m.setCorrectionEnabled(true);
                }
                Optional<SimulatorControl> sim = link.simulator();
                if (sim.isPresent()) {
                    if (seed != null) {
                        sim.get().setSeed(seed);
                    }
                    if (slot != null) {
                        sim.get().setSlot(slot);
                    }
                    if (wiring != Wiring.NONE) {
                        sim.get().setWiring(wiring);
                    }
                }
                log.accept("reconnected to " + link.address() + " (attempt " + attempt + "); "
                        + (applied.on() ? "bias held at " + ConsoleProgress.num(applied.value()) + " "
                                + applied.mode().unit() : "bias is off") + ", repeating " + what);
                return;
            } catch (MeterException e) {
                if (!link.isLinkFailure(e)) {
                    throw e;
                }
                last = e;
            }
        }
    }

    private static String fmt(double s) {
        return String.format(java.util.Locale.ROOT, "%.1f", s);
    }
}
