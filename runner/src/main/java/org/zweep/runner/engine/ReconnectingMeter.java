package org.zweep.runner.engine;

import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;
import java.util.function.Consumer;
import java.util.function.Function;
import java.util.function.Supplier;
import org.zweep.driver.MeterException;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.FixtureControl;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.MeterIdentity;
import org.zweep.driver.meter.Reading;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.safety.BiasRamp;
import org.zweep.runner.safety.BiasWatcher;
import org.zweep.runner.safety.SafetyGuard;

/**
 * The meter behind a {@link MeterLink}, kept alive: a call that fails because the link broke or
 * timed out is repeated on a new connection, opened with back-off as the {@link ReconnectPolicy}
 * says, after the meter's state is restored there:
 * <ol>
 *   <li>DC bias the meter still holds where it was left (read back with {@link Meter#readBias()})
 *       is kept; otherwise bias is switched off at once;</li>
 *   <li>the meter's own correction is switched on again when it was on;</li>
 *   <li>the meter's own fixture is brought back to what it held (and the second winding);</li>
 *   <li>the setting the repeated call needs is applied again, its DC bias brought back up from
 *       where the meter is now by a ramp at the rate it went up ({@link #rampControl(BiasControl)}),
 *       then settled.</li>
 * </ol>
 * The waiting budget counts from the last call that succeeded, so a link that keeps breaking
 * before a call can finish ends in a {@link LinkLostException}. An error the meter reports, or any
 * other failure, is not repeated.
 *
 * <p>It also keeps the bias it last sent ({@link #appliedBias()}) and tells a {@link BiasWatcher}
 * of every bias change before it is sent. Driven by one thread; only {@link #biasOffAtOnce()} may
 * be called from another (a shutdown hook).
 */
public final class ReconnectingMeter implements Meter {
    private final MeterLink link;
    private final ReconnectPolicy policy;
    private final Waiter waiter;
    private final Consumer<String> log;

    private volatile Bias applied = Bias.OFF;
    /** The bias of the setting being sent (it may or may not have reached the meter). */
    private Bias sending;
    private MeasurementSetting lastSetting;
    private BiasControl rampControl = BiasControl.NONE;
    private volatile BiasWatcher watcher = BiasWatcher.NONE;
    private boolean correction;
    /** What the fixture was last brought to (null: not known), and the second winding's state. */
    private FixtureState held;
    private FixtureState winding;
    private int reconnects;
    /** Reconnect attempts and back-off waited since the last call that succeeded. */
    private int budgetAttempts;
    private double budgetWaitedS;

    /**
     * @param link the meter connection
     * @param policy how to reconnect
     * @param waiter host-side waits (back-off, restore ramps)
     * @param log where one-line notes go (each reconnect)
     */
    public ReconnectingMeter(MeterLink link, ReconnectPolicy policy, Waiter waiter, Consumer<String> log) {
        this.link = link;
        this.policy = policy;
        this.waiter = waiter;
        this.log = log;
    }

    /** How often the link was re-opened so far. */
    public int reconnects() {
        return reconnects;
    }

    /** The DC bias as last sent and acknowledged (or restored after a reconnect). */
    public Bias appliedBias() {
        return applied;
    }

    /** The setting last sent and acknowledged, or null when none is known (e.g. after a reconnect). */
    public MeasurementSetting lastSetting() {
        return lastSetting;
    }

    /** How the bias now on was reached: a bias lost with the link is brought back up no faster. */
    public BiasControl rampControl() {
        return rampControl;
    }

    /** Sets how the bias now being applied is ramped and settled (see {@link #rampControl()}). */
    public void rampControl(BiasControl control) {
        this.rampControl = control;
    }

    /** Makes {@code w} hear of every bias change before it is sent (the guard process's feed). */
    public void watchBias(BiasWatcher w) {
        this.watcher = w;
    }

    @Override
    public MeterIdentity identify() {
        return call(() -> "identifying the meter", null, Meter::identify);
    }

    @Override
    public void reset() {
        call(() -> "resetting the meter", null, m -> {
            m.reset();
            applied = Bias.OFF;
            lastSetting = null;
            return null;
        });
    }

    @Override
    public MeterCapabilities capabilities() {
        return link.meter().capabilities();
    }

    @Override
    public MeterCapabilities statedLimits() {
        return call(() -> "asking the meter its limits", null, Meter::statedLimits);
    }

    @Override
    public Optional<Bias> readBias() {
        return call(() -> "reading the DC bias back", null, Meter::readBias);
    }

    @Override
    public void apply(MeasurementSetting setting) {
        call(() -> "applying the setting at " + at(setting), setting, m -> {
            send(m, setting);
            return null;
        });
    }

    @Override
    public Reading measure() {
        MeasurementSetting s = lastSetting;
        return call(() -> s == null ? "measuring" : "measuring at " + at(s), s, Meter::measure);
    }

    /**
     * As {@link #measure()}, for a point whose trigger waits {@code delayS} after its setting (the
     * caller waited it once): when the measurement is repeated after a reconnect, the setting is
     * applied again and the delay is waited again before the trigger.
     */
    public Reading measure(double delayS) {
        MeasurementSetting s = lastSetting;
        boolean[] repeated = {false};
        return call(() -> s == null ? "measuring" : "measuring at " + at(s), s, m -> {
            if (repeated[0]) {
                waiter.waitS(delayS);
            }
            repeated[0] = true;
            return m.measure();
        });
    }

    @Override
    public Reading measureAt(MeasurementSetting setting) {
        return call(() -> "measuring at " + at(setting), setting, m -> sent(m, setting, () -> m.measureAt(setting)));
    }

    @Override
    public List<Reading> measureList(List<MeasurementSetting> settings) {
        return call(() -> "measuring a list of " + settings.size() + " points", settings.get(0), m -> {
            List<Reading> r = m.measureList(settings);
            lastSetting = settings.get(settings.size() - 1);
            return r;
        });
    }

    @Override
    public void acquireCorrection(CorrectionStandard standard) {
        call(() -> "acquiring the " + standard + " correction", lastSetting, m -> {
            m.acquireCorrection(standard);
            return null;
        });
    }

    @Override
    public void acquireCorrection(CorrectionStandard standard, List<MeasurementSetting> settings) {
        call(() -> "acquiring the " + standard + " correction at " + settings.size() + " frequencies", null, m -> {
            m.acquireCorrection(standard, settings);
            lastSetting = null;
            return null;
        });
    }

    @Override
    public void setLoadStandard(Impedance known) {
        call(() -> "setting the load standard", null, m -> {
            m.setLoadStandard(known);
            return null;
        });
    }

    @Override
    public void setCorrectionEnabled(boolean enabled) {
        call(() -> "switching the meter's correction", null, m -> {
            m.setCorrectionEnabled(enabled);
            correction = enabled;
            return null;
        });
    }

    /**
     * The meter's own fixture on the connection of the moment, each switch repeated after a lost
     * link like any other call and brought back after a reconnect; empty when it has none.
     */
    @Override
    public Optional<FixtureControl> fixture() {
        if (link.fixtureControl().isEmpty()) {
            return Optional.empty();
        }
        return Optional.of(new FixtureControl() {
            @Override
            public Set<FixtureState> states() {
                return link.fixtureControl().map(FixtureControl::states).orElse(Set.of());
            }

            @Override
            public void hold(FixtureState state) {
                holdFixture(state, "changing the fixture to " + FixturePort.word(state),
                        () -> link.fixtureControl().orElseThrow().hold(state));
            }
        });
    }

    /**
     * Runs {@code change}, which brings {@code state} into the fixture (through the meter's own
     * fixture or another port), repeated after a lost link like any call; afterwards the meter's own
     * fixture is brought back to {@code state} after every reconnect.
     */
    public void holdFixture(FixtureState state, String what, Runnable change) {
        call(() -> what, null, m -> {
            change.run();
            if (state == FixtureState.SECONDARY_OPEN || state == FixtureState.SECONDARY_SHORTED) {
                winding = state;
            } else {
                held = state;
            }
            return null;
        });
    }

    @Override
    public void biasOff() {
        call(() -> "turning bias off", null, m -> {
            m.biasOff();
            off();
            return null;
        });
    }

    /**
     * Turns bias off at once, on the current connection or, when the link is down, on one new
     * connection (no back-off, no budget). Never throws; safe to call from another thread.
     *
     * @return whether the meter confirmed it
     */
    public boolean biasOffAtOnce() {
        try {
            link.meter().biasOff();
            off();
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
            off();
            log.accept("bias turned off after reconnecting to " + link.address());
            return true;
        } catch (RuntimeException e) {
            return false;
        }
    }

    /**
     * Opens a new connection once, with nothing restored and nothing waited for: for bringing bias
     * down at its ramp rate after the budget was spent (the meter is taken to hold the bias last
     * sent). Does not reset the budget.
     *
     * @throws MeterException when the meter cannot be reached
     */
    public void reopen() {
        link.reconnect();
        reconnects++;
    }

    /** Turns bias off (best effort) and closes the link; never throws. */
    @Override
    public boolean safeShutdown() {
        boolean off = biasOffAtOnce();
        link.close();
        return off;
    }

    @Override
    public void close() {
        safeShutdown();
    }

    // ---- the calls, their retries and the restore ------------------------------------------

    /** Sends {@code s} to {@code m}, its bias heard by the watcher first. */
    private void send(Meter m, MeasurementSetting s) {
        sent(m, s, () -> {
            m.apply(s);
            return null;
        });
    }

    /** Runs {@code exchange}, which sends {@code s} to {@code m}: its bias heard by the watcher first, then kept. */
    private <T> T sent(Meter m, MeasurementSetting s, Supplier<T> exchange) {
        sending = s.bias();
        if (s.bias().on() || applied.on()) {
            watcher.applying(s, rampControl.rampPerS());
        }
        T result = exchange.get();
        lastSetting = s;
        applied = s.bias();
        return result;
    }

    private void off() {
        applied = Bias.OFF;
        watcher.off();
    }

    /**
     * Runs {@code op} on the current meter; after a link failure, reconnects, restores (with
     * {@code needs} applied again, when not null) and runs it again. {@code what} is made only for
     * a message (a point's hot path formats nothing).
     */
    private <T> T call(Supplier<String> what, MeasurementSetting needs, Function<Meter, T> op) {
        while (true) {
            try {
                T result = op.apply(link.meter());
                budgetAttempts = 0;
                budgetWaitedS = 0.0;
                return result;
            } catch (MeterException e) {
                if (!link.isLinkFailure(e)) {
                    throw e;
                }
                recover(what.get(), needs, e);
            }
        }
    }

    private void recover(String what, MeasurementSetting needs, MeterException cause) {
        log.accept("link to " + link.address() + " failed while " + what + ": " + cause.getMessage()
                + "; reconnecting");
        MeterException last = cause;
        for (int attempt = 1;; attempt++) {
            double delay = Math.min(policy.maxDelayS(), policy.firstDelayS() * Math.pow(policy.factor(), budgetAttempts));
            if (budgetAttempts + 1 > policy.maxAttempts() || budgetWaitedS + delay > policy.budgetS() + 1e-9) {
                throw new LinkLostException("lost the link to " + link.address() + " while " + what
                        + " and could not reconnect (" + budgetAttempts + " attempts in "
                        + String.format(Locale.ROOT, "%.1f", budgetWaitedS)
                        + " s since the last successful operation): " + last.getMessage(), last);
            }
            waiter.waitS(delay);
            budgetWaitedS += delay;
            budgetAttempts++;
            try {
                Meter m = link.reconnect();
                reconnects++;
                restore(m, needs);
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

    /** Brings the new connection's meter {@code m} back to the state this object left it in. */
    private void restore(Meter m, MeasurementSetting needs) {
        Bias kept = applied.on() ? m.readBias().filter(this::whereLeft).orElse(null) : null;
        if (kept != null) {
            // the meter holds the bias where it was left: keep it and go on from there, rather than
            // switching it off abruptly and ramping all the way up again
            applied = kept;
        } else {
            m.biasOff();
            off();
        }
        lastSetting = null;
        if (correction) {
            m.setCorrectionEnabled(true);
        }
        link.fixtureControl().ifPresent(own -> {
            for (FixtureState s : new FixtureState[] {held, winding}) {
                if (s != null && own.states().contains(s)) {
                    own.hold(s);
                }
            }
        });
        if (needs != null) {
            reach(m, needs);
        }
    }

    /** Applies {@code target}, its DC bias ramped from what the meter holds now and settled. */
    private void reach(Meter m, MeasurementSetting target) {
        Bias to = target.bias();
        Bias from = applied;
        if (!to.on() || (from.on() && from.mode() == to.mode() && from.value() == to.value())) {
            send(m, target);
            return;
        }
        double start = from.on() && from.mode() == to.mode() ? from.value() : 0.0;
        for (BiasRamp.Step step : BiasRamp.plan(start, to.value(), rampControl.rampPerS(), Station.RAMP_STEP_S)) {
            send(m, target.withBias(new Bias(to.mode(), step.value(), true)));
            try {
                waiter.waitS(step.waitS());
            } catch (RunInterruptedException e) {
                // hold this value its full step before the ramp down starts from it
                waiter.waitThroughStopS(step.waitS());
                throw e;
            }
        }
        waiter.waitS(rampControl.settleS());
    }

    /**
     * Whether {@code b}, read back after a reconnect, is where the bias was left: on, in the same
     * mode, at the last level the meter acknowledged or at the one being sent when the link broke
     * (within 1e-6 of it, for the reply's rounding).
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

    private static String at(MeasurementSetting s) {
        return SafetyGuard.human(s.frequencyHz(), "Hz");
    }
}
