package org.zweep.driver.dialect;

import java.math.BigDecimal;
import java.nio.ByteOrder;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.stream.Collectors;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.CorrectionStyle;
import org.zweep.driver.meter.FixtureControl;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.MeterIdentity;
import org.zweep.driver.meter.Interval;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.driver.meter.SourceMode;
import org.zweep.driver.scpi.ErrorQueue;
import org.zweep.driver.scpi.MeterErrorException;
import org.zweep.driver.scpi.ScpiError;
import org.zweep.driver.scpi.ScpiProtocolException;
import org.zweep.driver.scpi.ScpiSession;
import org.zweep.driver.scpi.ScpiValues;
import org.zweep.driver.transport.MeterTimeoutException;

/**
 * A {@link Meter} driven entirely by a {@link Dialect} over one {@link ScpiSession}.
 *
 * <p>Costs: it remembers what it last told the meter and sends only settings that changed, all in
 * one compound message; where the dialect allows, the error query ends that message, so applying a
 * setting is one round trip and measuring one point another. A whole list sweep is one
 * configuration round trip, one trigger and one read. Every setting is checked against the
 * dialect's capabilities before anything is sent ({@link InvalidInputException} naming the setting
 * and the limit); errors the meter reports raise {@link MeterErrorException} with every entry.
 *
 * <p>Deadlines: a measurement, a sweep or a correction standard is awaited for the time the
 * dialect's {@link MeterTiming} expects plus the session's slack; a timeout names the exchange.
 *
 * <p>Not thread-safe: one thread drives a meter at a time. After any failure the remembered state
 * is forgotten, so the next {@link #apply} sends every setting again.
 */
public final class DialectMeter implements Meter {
    /** How often a result is read again, at most, to find two reads that agree. */
    private static final int MAX_READS_AGAIN = 3;

    private final ScpiSession session;
    private final Dialect dialect;
    private final Clock clock;
    private final SettingMessages planner;
    private MeasurementSetting current;
    /** The setting of the point this object last had measured (for the timing model), or null. */
    private MeasurementSetting lastMeasured;
    private boolean resync;
    private boolean closed;
    private boolean biasConfirmedOff;
    /** Settings to send in front of the next measuring query, in its message ("" for none). */
    private String prefix = "";
    /**
     * Whether the meter holds the list sweeps' data format (dialects whose lists answer in another
     * encoding); null when unknown after a failure.
     */
    private Boolean listFormatHeld = Boolean.FALSE;
    /** Whether the session reads blocks and text in one reply (false once it said it cannot). */
    private boolean blocksJoinable = true;

    /** A meter speaking {@code dialect} over {@code session}, timestamping readings with the system clock. */
    public DialectMeter(ScpiSession session, Dialect dialect) {
        this(session, dialect, Clock.systemUTC());
    }

    /**
     * @param session the open conversation; this meter owns it and closes it in {@link #safeShutdown()}
     * @param dialect the meter's dialect
     * @param clock the clock reading timestamps come from
     */
    public DialectMeter(ScpiSession session, Dialect dialect, Clock clock) {
        this.session = session;
        this.dialect = dialect;
        this.clock = clock;
        this.planner = new SettingMessages(dialect);
    }

    /**
     * A meter speaking the dialect named by {@code dialectNameOrPath} (see {@link Dialect#load}).
     * Sends nothing until the first operation.
     *
     * @throws InvalidInputException when the dialect cannot be loaded
     */
    public static DialectMeter open(ScpiSession session, String dialectNameOrPath) {
        return new DialectMeter(session, Dialect.load(dialectNameOrPath));
    }

    /** The dialect this meter speaks. */
    public Dialect dialect() {
        return dialect;
    }

    @Override
    public MeterIdentity identify() {
        requireOpen();
        String reply = session.query(render(Command.IDENTIFY));
        String[] f = reply.split(",", -1);
        if (f.length < 2) {
            throw new ScpiProtocolException(session.address() + ": identity reply '" + abbreviate(reply)
                    + "' does not have comma-separated fields (IEEE 488.2 *IDN? form)");
        }
        String firmware = f.length > 3 ? String.join(",", List.of(f).subList(3, f.length)).trim() : "0";
        return new MeterIdentity(f[0].trim(), f[1].trim(), f.length > 2 ? f[2].trim() : "0", firmware);
    }

    @Override
    public void reset() {
        requireOpen();
        planner.reset();
        listFormatHeld = Boolean.FALSE;
        current = null;
        lastMeasured = null;
        resync = false;
        dialect.command(Command.RESET).ifPresent(t -> send(List.of(t.render()), "resetting"));
    }

    @Override
    public MeterCapabilities capabilities() {
        return dialect.capabilities();
    }

    @Override
    public MeterCapabilities statedLimits() {
        requireOpen();
        MeterCapabilities c = dialect.capabilities();
        Map<Command, Double> asked = limits();
        return new MeterCapabilities(
                stated(c.frequencyHz(), asked, Command.LIMIT_FREQUENCY_MIN, Command.LIMIT_FREQUENCY_MAX),
                stated(c.voltageLevelVrms(), asked, Command.LIMIT_VOLTAGE_LEVEL_MIN, Command.LIMIT_VOLTAGE_LEVEL_MAX),
                stated(c.currentLevelArms(), asked, Command.LIMIT_CURRENT_LEVEL_MIN, Command.LIMIT_CURRENT_LEVEL_MAX),
                stated(c.biasVoltageV(), asked, Command.LIMIT_BIAS_VOLTAGE_MIN, Command.LIMIT_BIAS_VOLTAGE_MAX),
                stated(c.biasCurrentA(), asked, Command.LIMIT_BIAS_CURRENT_MIN, Command.LIMIT_BIAS_CURRENT_MAX),
                c.maxListPoints(), c.corrections(), c.voltageRatio(), c.correctionStyle());
    }

    /** {@code declared} with each end the meter answered for in its place. */
    private static Interval stated(Interval declared, Map<Command, Double> asked, Command min, Command max) {
        return new Interval(asked.getOrDefault(min, declared.min()), asked.getOrDefault(max, declared.max()));
    }

    /**
     * The meter's answer to each limit query the dialect declares. Where the dialect joins commands
     * and its meter joins the replies, all of them go in one message, sent twice and kept when both
     * answers agree (two round trips, not two a limit); otherwise, or when the joined answers do not
     * agree or do not fit, each is asked on its own, as {@link #limit} does.
     */
    private Map<Command, Double> limits() {
        List<Command> declared = new ArrayList<>();
        for (Command c : Command.values()) {
            if (c.key().startsWith("limit-") && dialect.has(c)) {
                declared.add(c);
            }
        }
        Map<Command, Double> asked = new java.util.EnumMap<>(Command.class);
        if (declared.size() > 1 && dialect.messages().join()
                && dialect.messages().replies() == Dialect.ReplyFraming.SEMICOLON_JOINED) {
            String message = String.join(";", declared.stream().map(this::render).toList());
            double[] first = joinedLimits(message, declared.size());
            double[] second = first == null ? null : joinedLimits(message, declared.size());
            if (first != null && java.util.Arrays.equals(first, second)) {
                for (int i = 0; i < declared.size(); i++) {
                    asked.put(declared.get(i), first[i]);
                }
                return asked;
            }
            // a meter error (one of them is not known to it) or a corrupted reply: one at a time,
            // where the query at fault is named
            readErrors(List.of(), Duration.ZERO, "asking the meter its limits");
        }
        for (Command c : declared) {
            asked.put(c, limit(c));
        }
        return asked;
    }

    /** The {@code count} numbers the joined limit queries answered, or {@code null} when they did not fit. */
    private double[] joinedLimits(String message, int count) {
        List<String> units = ScpiValues.splitUnits(session.query(message));
        if (units.size() != count) {
            return null;
        }
        double[] v = new double[count];
        for (int i = 0; i < count; i++) {
            try {
                double[] one = ScpiValues.parseNumbers(units.get(i));
                if (one.length != 1) {
                    return null;
                }
                v[i] = one[0];
            } catch (NumberFormatException e) {
                return null;
            }
        }
        return v;
    }

    /** A query answering one number, read until two reads agree (at most four). */
    private double limit(Command c) {
        String what = "asking the meter " + c.key();
        List<Double> seen = new ArrayList<>();
        for (int i = 0; i < 4; i++) {
            String reply = session.query(render(c));
            double[] v = parseNumbers(reply, what);
            if (v.length != 1) {
                throw new ScpiProtocolException(session.address() + ": expected one number but got '"
                        + abbreviate(reply) + "' while " + what);
            }
            if (seen.contains(v[0])) {
                return v[0];
            }
            seen.add(v[0]);
        }
        throw new ScpiProtocolException(session.address() + ": " + seen.size() + " different replies while " + what);
    }

    @Override
    public void apply(MeasurementSetting setting) {
        requireOpen();
        validate(setting);
        try {
            configure(setting, List.of(), "applying " + describe(setting));
        } catch (RuntimeException e) {
            // a later measure() retries this setting, never silently measures at an older one
            current = setting;
            resync = true;
            throw e;
        }
        current = setting;
        resync = false;
    }

    @Override
    public Reading measure() {
        requireOpen();
        if (current == null) {
            throw new IllegalStateException("apply a setting before measuring");
        }
        if (resync) {
            apply(current);
        }
        String what = "measuring at " + describe(current);
        double[] values = measured(Command.MEASURE, 1, dialect.timing().pointS(current, lastMeasured), what);
        lastMeasured = current;
        return reading(current, values, 0, clock.instant());
    }

    /**
     * Where the dialect joins commands in one message, ends it with the error query and reads
     * ASCII: the settings that changed, the trigger (and {@code measure-again}) and the error
     * query in one message, one round trip. Otherwise as {@link #apply} then {@link #measure}.
     */
    @Override
    public Reading measureAt(MeasurementSetting setting) {
        requireOpen();
        if (resync || !dialect.measuresAtInOneMessage()) {
            apply(setting);
            return measure();
        }
        validate(setting);
        SettingMessages.Pending pending = planner.plan(setting, List.of());
        String what = "measuring at " + describe(setting);
        double[] values;
        try {
            prefix = String.join(";", withFormat(pending.units(), false));
            formatSent(false); // the reply comes in the points' format (forgotten again on a failure)
            values = measured(Command.MEASURE, 1, dialect.timing().pointS(setting, lastMeasured), what);
        } catch (RuntimeException e) {
            // whether the meter took the setting is unknown: the next operation sends it again
            forget();
            current = setting;
            resync = true;
            throw e;
        } finally {
            prefix = "";
        }
        planner.sent(pending);
        current = setting;
        lastMeasured = setting;
        return reading(setting, values, 0, clock.instant());
    }

    @Override
    public List<Reading> measureList(List<MeasurementSetting> settings) {
        requireOpen();
        settings.forEach(this::validate);
        List<Reading> readings = new ArrayList<>(settings.size());
        if (!planner.sweepable(settings)) {
            for (MeasurementSetting s : settings) {
                apply(s);
                readings.add(measure());
            }
            return readings;
        }
        int max = dialect.capabilities().maxListPoints();
        for (int from = 0; from < settings.size(); from += max) {
            List<MeasurementSetting> chunk = settings.subList(from, Math.min(settings.size(), from + max));
            if (chunk.size() == 1) {
                apply(chunk.get(0));
                readings.add(measure());
            } else {
                readings.addAll(sweep(chunk));
            }
        }
        return readings;
    }

    @Override
    public void acquireCorrection(CorrectionStandard standard) {
        requireOpen();
        requireStandard(standard);
        if (resync && current != null) {
            apply(current);
        }
        Command c = Command.acquiring(standard);
        MeasurementSetting at = current != null ? current : MeasurementSetting.at(dialect.capabilities().frequencyHz().min());
        // a meter correcting at the acquired frequency measures the standard there, once; one
        // correcting its whole range sweeps its own grid
        double expectedS = dialect.capabilities().correctionStyle() == CorrectionStyle.AT_ACQUIRED_FREQUENCY
                ? dialect.timing().pointS(at, at) : dialect.timing().correctionS(at, dialect.capabilities().frequencyHz());
        send(List.of(render(c)), expectedS, "acquiring the " + standard + " correction");
        lastMeasured = null;
    }

    /**
     * {@inheritDoc} With the dialect's {@code list-acquisition: yes}, the standard is acquired over
     * the settings' frequencies in one message each (the {@code correction-<standard>-list} command;
     * at most {@code list-points} frequencies a message when the dialect declares list sweeps),
     * after the first setting is applied; otherwise, and when the settings differ in more than
     * frequency, point by point.
     */
    @Override
    public void acquireCorrection(CorrectionStandard standard, List<MeasurementSetting> settings) {
        requireOpen();
        settings.forEach(this::validate);
        MeasurementSetting first = settings.isEmpty() ? null : settings.get(0).withFrequencyHz(1);
        boolean list = dialect.correctionListAcquisition() && settings.size() > 1
                && settings.stream().allMatch(s -> s.withFrequencyHz(1).equals(first));
        if (!list) {
            Meter.super.acquireCorrection(standard, settings);
            return;
        }
        requireStandard(standard);
        Template t = dialect.command(Command.acquiringList(standard)).orElseThrow();
        apply(settings.get(0));
        int max = dialect.capabilities().maxListPoints() > 0 ? dialect.capabilities().maxListPoints() : settings.size();
        for (int from = 0; from < settings.size(); from += max) {
            List<MeasurementSetting> chunk = settings.subList(from, Math.min(settings.size(), from + max));
            double expectedS = dialect.timing().sweepS(chunk, null);
            // the meter steps through the list itself: where it is left is not known
            current = chunk.get(chunk.size() - 1);
            resync = true;
            send(List.of(t.render(Map.of("frequencies", chunk.stream().map(MeasurementSetting::frequencyHz).toList()))),
                    expectedS, "acquiring the " + standard + " correction at " + chunk.size() + " frequencies from "
                            + describe(chunk.get(0)) + " to " + describe(chunk.get(chunk.size() - 1)));
            planner.forget();
        }
        lastMeasured = null;
    }

    private void requireStandard(CorrectionStandard standard) {
        if (!dialect.capabilities().corrections().contains(standard)) {
            throw new InvalidInputException("correction " + standard + ": " + meterName()
                    + " cannot acquire this standard (it acquires " + dialect.capabilities().corrections().stream()
                    .sorted().map(c -> c.name().toLowerCase(java.util.Locale.ROOT)).collect(Collectors.joining(", "))
                    + ")");
        }
    }

    @Override
    public void setLoadStandard(Impedance known) {
        requireOpen();
        if (!dialect.capabilities().corrections().contains(CorrectionStandard.LOAD)) {
            throw new InvalidInputException("load standard: " + meterName() + " has no load correction");
        }
        if (!Double.isFinite(known.resistanceOhm()) || !Double.isFinite(known.reactanceOhm())) {
            throw new InvalidInputException("load standard: resistance and reactance must be finite numbers");
        }
        String unit = dialect.command(Command.LOAD_STANDARD).orElseThrow()
                .render(Map.of("resistance", known.resistanceOhm(), "reactance", known.reactanceOhm()));
        send(List.of(unit), "setting the load standard");
    }

    @Override
    public void setCorrectionEnabled(boolean enabled) {
        requireOpen();
        if (dialect.capabilities().corrections().isEmpty()) {
            throw new InvalidInputException("correction: " + meterName() + " has no fixture correction of its own");
        }
        send(List.of(render(enabled ? Command.CORRECTION_ON : Command.CORRECTION_OFF)),
                "switching correction " + (enabled ? "on" : "off"));
    }

    @Override
    public Optional<Bias> readBias() {
        requireOpen();
        if (!dialect.has(Command.BIAS_VOLTAGE_QUERY) || !dialect.has(Command.BIAS_VOLTAGE_STATE_QUERY)
                || !dialect.has(Command.BIAS_CURRENT_QUERY) || !dialect.has(Command.BIAS_CURRENT_STATE_QUERY)) {
            return Optional.empty();
        }
        boolean voltageOn = state(Command.BIAS_VOLTAGE_STATE_QUERY);
        boolean currentOn = state(Command.BIAS_CURRENT_STATE_QUERY);
        double volts = limit(Command.BIAS_VOLTAGE_QUERY);
        double amperes = limit(Command.BIAS_CURRENT_QUERY);
        // what the meter holds is now known: the next setting sends only what differs from it (no
        // off-and-on again of a bias that is to stay on)
        planner.biasHeld(voltageOn, currentOn, volts, amperes);
        if (voltageOn == currentOn) {
            return Optional.of(voltageOn ? new Bias(SourceMode.VOLTAGE, volts, true) : Bias.OFF);
        }
        return Optional.of(voltageOn ? new Bias(SourceMode.VOLTAGE, volts, true)
                : new Bias(SourceMode.CURRENT, amperes, true));
    }

    /** A state query's answer (IEEE 488.2 boolean: 1/0, ON/OFF), read until two reads agree. */
    private boolean state(Command c) {
        String what = "asking the meter " + c.key();
        List<String> seen = new ArrayList<>();
        for (int i = 0; i < 4; i++) {
            String r = session.query(render(c)).strip().toUpperCase(java.util.Locale.ROOT);
            if (seen.contains(r)) {
                if (r.equals("1") || r.equals("ON")) {
                    return true;
                }
                if (r.equals("0") || r.equals("OFF")) {
                    return false;
                }
                throw new ScpiProtocolException(session.address() + ": '" + abbreviate(r) + "' is not 1 or 0 while "
                        + what);
            }
            seen.add(r);
        }
        throw new ScpiProtocolException(session.address() + ": " + seen.size() + " different replies while " + what);
    }

    /**
     * The meter's own fixture switch, when the dialect has a {@code fixture} section: {@link
     * FixtureControl#hold} sends the state's command, checks errors as after a setting, then waits
     * the section's {@code settle} time.
     */
    @Override
    public Optional<FixtureControl> fixture() {
        if (dialect.fixtureStates().isEmpty()) {
            return Optional.empty();
        }
        return Optional.of(new FixtureControl() {
            @Override
            public java.util.Set<FixtureState> states() {
                return dialect.fixtureStates();
            }

            @Override
            public void hold(FixtureState state) {
                requireOpen();
                Template t = dialect.fixtureCommand(state).orElseThrow(() -> new IllegalArgumentException(
                        "the fixture of " + meterName() + " cannot be switched to " + state));
                send(List.of(t.render()), "switching the fixture to " + state.name().toLowerCase(java.util.Locale.ROOT)
                        .replace('_', ' '));
                if (dialect.fixtureSettleS() > 0) {
                    try {
                        Thread.sleep(seconds(dialect.fixtureSettleS()).toMillis());
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                        throw new org.zweep.driver.MeterException(session.address()
                                + ": interrupted while the fixture settled");
                    }
                }
            }
        });
    }

    @Override
    public void biasOff() {
        requireOpen();
        dialect.command(Command.BIAS_OFF).ifPresent(t -> send(List.of(t.render()), "switching DC bias off"));
        planner.biasOff();
        if (current != null && current.bias().on()) {
            // the next reading must say what is true: no bias, until a setting turns it on again
            current = current.withBias(new Bias(current.bias().mode(), current.bias().value(), false));
        }
    }

    /**
     * Sends the dialect's {@code bias-off} command as the very first thing, checks the meter's
     * errors where the dialect can, then closes the session. Never throws. Calling it again
     * returns the first answer without sending anything.
     *
     * @return whether bias-off was sent and the meter reported no error (an error left in the
     *     queue by an earlier failure also makes this {@code false}: unconfirmed is reported as such)
     */
    @Override
    public boolean safeShutdown() {
        if (closed) {
            return biasConfirmedOff;
        }
        closed = true;
        try {
            // a meter without a DC bias source (no bias-off command) has no bias to switch off
            dialect.command(Command.BIAS_OFF).ifPresent(t -> send(List.of(t.render()), "switching DC bias off at shutdown"));
            biasConfirmedOff = true;
        } catch (RuntimeException e) {
            biasConfirmedOff = false;
        } finally {
            try {
                session.close();
            } catch (RuntimeException ignored) {
                // the bias outcome is what the caller needs; a failing close changes nothing about it
            }
        }
        return biasConfirmedOff;
    }

    @Override
    public void close() {
        safeShutdown();
    }

    // ---- configuration ------------------------------------------------------------------------

    private List<Reading> sweep(List<MeasurementSetting> chunk) {
        configure(chunk.get(0), chunk, "setting up a list sweep of " + chunk.size() + " points");
        current = chunk.get(chunk.size() - 1);
        resync = true;
        String what = "sweeping " + chunk.size() + " points from " + describe(chunk.get(0)) + " to "
                + describe(chunk.get(chunk.size() - 1));
        double[] values = measured(Command.LIST_MEASURE, chunk.size(), dialect.timing().sweepS(chunk, lastMeasured),
                what);
        lastMeasured = chunk.get(chunk.size() - 1);
        Instant t = clock.instant();
        List<Reading> readings = new ArrayList<>(chunk.size());
        for (int i = 0; i < chunk.size(); i++) {
            readings.add(reading(chunk.get(i), values, i, t));
        }
        return readings;
    }

    /**
     * Sends what differs between {@code s} and what the meter holds; with a non-empty {@code sweep},
     * the list commands too.
     */
    private void configure(MeasurementSetting s, List<MeasurementSetting> sweep, String what) {
        SettingMessages.Pending pending = planner.plan(s, sweep);
        send(withFormat(pending.units(), !sweep.isEmpty()), what);
        planner.sent(pending);
        formatSent(!sweep.isEmpty());
    }

    /**
     * {@code units} with the dialect's {@code list-format} (for a list sweep) or {@code point-format}
     * command added when the meter may hold the other data format; {@code units} itself otherwise.
     */
    private List<String> withFormat(List<String> units, boolean list) {
        if (!dialect.reply().listsSwitchEncoding() || Boolean.valueOf(list).equals(listFormatHeld)) {
            return units;
        }
        List<String> out = new ArrayList<>(units);
        out.add(render(list ? Command.LIST_FORMAT : Command.POINT_FORMAT));
        return out;
    }

    /** Records that the meter now holds the list sweeps' data format, or the points'. */
    private void formatSent(boolean list) {
        if (dialect.reply().listsSwitchEncoding()) {
            listFormatHeld = list;
        }
    }

    /** After a failure: nothing is known of what the meter holds. */
    private void forget() {
        planner.forget();
        if (dialect.reply().listsSwitchEncoding()) {
            listFormatHeld = null;
        }
    }

    /** The encoding of the next measurement's reply: that of the data format the meter holds. */
    private ReplyShape.Encoding encodingNow() {
        return Boolean.TRUE.equals(listFormatHeld) ? dialect.reply().listEncoding() : dialect.reply().encoding();
    }

    // ---- the wire -----------------------------------------------------------------------------

    /**
     * Sends {@code units} (one message when the dialect allows compound messages) and checks the
     * meter's error queue, appending the error query to the message where allowed. Sends nothing
     * for no units. On any failure the remembered state is forgotten.
     */
    private void send(List<String> units, String what) {
        send(units, 0.0, what);
    }

    /** As {@link #send(List, String)}, for a message the meter works on for {@code expectedS} seconds. */
    private void send(List<String> units, double expectedS, String what) {
        if (units.isEmpty()) {
            return;
        }
        try {
            Dialect.Messages m = dialect.messages();
            List<String> messages = m.join() ? List.of(String.join(";", units)) : units;
            for (int i = 0; i < messages.size() - 1; i++) {
                session.write(messages.get(i));
            }
            String last = messages.get(messages.size() - 1);
            Duration work = seconds(expectedS);
            if (m.errorCheck().afterSettings() && m.errorQueryJoined()) {
                ScpiError first = parseError(session.query(last + ";" + render(Command.ERROR_QUERY), work), what);
                if (first.code() != 0) {
                    throw errors(first, what);
                }
            } else {
                session.write(last);
                if (m.errorCheck().afterSettings()) {
                    List<ScpiError> errors = readErrors(List.of(), work, what);
                    if (!errors.isEmpty()) {
                        throw errors(errors, what);
                    }
                } else {
                    dialect.command(Command.SYNC).ifPresent(t -> session.waitForCompletion(t.render(), work));
                }
            }
        } catch (MeterTimeoutException e) {
            forget();
            resync = current != null;
            lastMeasured = null;
            throw named(e, what);
        } catch (RuntimeException e) {
            forget();
            resync = current != null;
            lastMeasured = null;
            throw e;
        }
    }

    /** {@code e} with the exchange it happened in named. */
    private static MeterTimeoutException named(MeterTimeoutException e, String what) {
        return new MeterTimeoutException(e.getMessage() + " while " + what, e.received());
    }

    private static Duration seconds(double s) {
        return s > 0 ? Duration.ofNanos((long) Math.ceil(s * 1e9)) : Duration.ZERO;
    }

    /** Reads the error queue until it is empty: every entry, after those in {@code earlier}. */
    private List<ScpiError> readErrors(List<ScpiError> earlier, Duration work, String what) {
        return ErrorQueue.read(session, render(Command.ERROR_QUERY), work, earlier, what);
    }

    /** The failure for a first entry {@code first}, with the rest of the queue read. */
    private MeterErrorException errors(ScpiError first, String what) {
        return errors(readErrors(List.of(first), Duration.ZERO, what), what);
    }

    private MeterErrorException errors(List<ScpiError> errors, String what) {
        return ErrorQueue.failure(session.address(), errors, what);
    }

    private ScpiError parseError(String reply, String what) {
        return ErrorQueue.parse(session.address(), reply, what);
    }

    /**
     * The result of {@code command}, read until two reads agree when the dialect declares
     * {@code measure-again} (the last result again, no new trigger): so a reply corrupted on the
     * way that still reads as numbers is never taken for a measurement. With compound messages
     * and ASCII replies the second read joins the trigger's message (no extra round trip).
     *
     * @throws ScpiProtocolException when no two of the reads agree
     */
    private double[] measured(Command command, int points, double expectedS, String what) {
        if (!dialect.has(Command.MEASURE_AGAIN)) {
            return readValues(command, points, expectedS, what, false)[0];
        }
        List<double[]> seen = new ArrayList<>();
        double[][] both = null;
        if (dialect.messages().join() && (encodingNow() == ReplyShape.Encoding.ASCII || blocksJoinable)) {
            try {
                both = readValues(command, points, expectedS, what, true);
            } catch (UnsupportedOperationException e) {
                blocksJoinable = false; // nothing was sent: read once, then again on its own
            }
        }
        if (both != null) {
            if (Arrays.equals(both[0], both[1])) {
                return both[0];
            }
            seen.addAll(List.of(both));
        } else {
            seen.add(readValues(command, points, expectedS, what, false)[0]);
        }
        for (int i = 0; i < MAX_READS_AGAIN; i++) {
            double[] again = readValues(Command.MEASURE_AGAIN, points, what + " (reading the result again)");
            for (double[] earlier : seen) {
                if (Arrays.equals(earlier, again)) {
                    return again;
                }
            }
            seen.add(again);
        }
        forget();
        resync = current != null;
        throw new ScpiProtocolException(session.address() + ": the meter gave " + seen.size()
                + " different results for one measurement (replies corrupted on the way) while " + what);
    }

    /** Sends {@code command} (a query, no work for the meter) and returns {@code points} points' worth of numbers. */
    private double[] readValues(Command command, int points, String what) {
        return readValues(command, points, 0.0, what, false)[0];
    }

    /**
     * Sends {@code command} (a query the meter works on for about {@code expectedS} seconds) and
     * returns {@code points} points' worth of numbers; with {@code twice}, {@code measure-again}
     * joins the same message (ASCII replies only) and both results are returned. A timeout names
     * the exchange ({@code what}).
     */
    private double[][] readValues(Command command, int points, double expectedS, String what, boolean twice) {
        try {
            return readValuesTimed(command, points, seconds(expectedS), what, twice);
        } catch (MeterTimeoutException e) {
            lastMeasured = null;
            throw named(e, what);
        }
    }

    private double[][] readValuesTimed(Command command, int points, Duration work, String what, boolean twice) {
        String query = twice ? render(command) + ";" + render(Command.MEASURE_AGAIN) : render(command);
        if (!prefix.isEmpty()) {
            query = prefix + ";" + query;
            prefix = "";
        }
        ReplyShape shape = dialect.reply();
        int expected = points * shape.fields().size();
        double[][] results;
        String shown;
        Dialect.Messages m = dialect.messages();
        boolean appended = false;
        if (encodingNow() == ReplyShape.Encoding.ASCII) {
            boolean append = m.errorCheck().afterMeasurement() && m.errorQueryJoined();
            appended = append;
            int queries = (twice ? 2 : 1) + (append ? 1 : 0);
            List<String> units = replies(append ? query + ";" + render(Command.ERROR_QUERY) : query, queries, work,
                    what);
            if (append) {
                ScpiError error;
                try {
                    error = parseError(units.get(units.size() - 1), what);
                } catch (ScpiProtocolException e) {
                    if (units.size() < queries) {
                        throw framingMismatch(query + ";" + render(Command.ERROR_QUERY), queries, units, what);
                    }
                    throw e;
                }
                units.remove(units.size() - 1);
                if (error.code() != 0) {
                    // IEEE 488.2 §6.3.2.3: a query that fails sends no response, so only the error came back
                    forget();
                    resync = true;
                    throw errors(error, what);
                }
            }
            if (queries > 1 && (units.size() < (twice ? 2 : 1) || units.stream().anyMatch(String::isBlank))) {
                throw framingMismatch(append ? query + ";" + render(Command.ERROR_QUERY) : query, queries,
                        units, what);
            }
            if (twice) {
                if (units.size() != 2) {
                    throw new ScpiProtocolException(session.address() + ": expected two results separated by ';'"
                            + " but got '" + abbreviate(String.join(";", units)) + "' while " + what);
                }
                results = new double[][] {parseNumbers(units.get(0), what), parseNumbers(units.get(1), what)};
                shown = abbreviate(String.join(";", units));
            } else {
                String data = String.join(",", units);
                shown = abbreviate(data);
                results = new double[][] {parseNumbers(data, what)};
            }
        } else {
            ByteOrder order = encodingNow() == ReplyShape.Encoding.REAL64_BIG ? ByteOrder.BIG_ENDIAN
                    : ByteOrder.LITTLE_ENDIAN;
            boolean append = m.errorCheck().afterMeasurement() && m.errorQueryJoined();
            int blocks = twice ? 2 : 1;
            ScpiSession.BlocksReply reply = null;
            if ((append || twice) && blocksJoinable) {
                try {
                    reply = session.queryBlocksThenText(append ? query + ";" + render(Command.ERROR_QUERY) : query,
                            blocks, work);
                } catch (UnsupportedOperationException e) {
                    if (twice) {
                        throw e;
                    }
                    blocksJoinable = false; // nothing was sent: the block alone, the error query after it
                }
            }
            if (reply != null) {
                appended = append;
                if (append) {
                    ScpiError error = parseError(reply.text(), what);
                    if (error.code() != 0) {
                        // IEEE 488.2 §6.3.2.3: a query that fails sends no response
                        forget();
                        resync = true;
                        throw errors(error, what);
                    }
                } else if (!reply.text().isEmpty()) {
                    throw new ScpiProtocolException(session.address() + ": unexpected '" + abbreviate(reply.text())
                            + "' after the blocks replying to '" + abbreviate(query) + "' while " + what);
                }
                if (reply.blocks().size() != blocks) {
                    throw new ScpiProtocolException(session.address() + ": expected " + blocks + " blocks replying to '"
                            + abbreviate(query) + "' but got " + reply.blocks().size() + " while " + what);
                }
                results = new double[blocks][];
                for (int i = 0; i < blocks; i++) {
                    results[i] = real64(reply.blocks().get(i), order, what);
                }
                shown = reply.blocks().get(0).length + " bytes";
            } else {
                byte[] block = session.queryBlock(query, work);
                results = new double[][] {real64(block, order, what)};
                shown = block.length + " bytes";
            }
        }
        boolean separate = m.errorCheck().afterMeasurement() && !appended;
        if (separate) {
            List<ScpiError> errors = readErrors(List.of(), Duration.ZERO, what);
            if (!errors.isEmpty()) {
                forget();
                resync = true;
                throw errors(errors, what);
            }
        }
        for (double[] values : results) {
            if (values.length != expected) {
                throw new ScpiProtocolException(session.address() + ": expected " + expected + " numbers (" + points
                        + " points of " + shape.fields().size() + " fields) but got " + values.length + " ('" + shown
                        + "') while " + what);
            }
        }
        return results;
    }

    private double[] real64(byte[] block, ByteOrder order, String what) {
        try {
            return ScpiValues.real64(block, order);
        } catch (IllegalArgumentException e) {
            throw new ScpiProtocolException(session.address() + ": " + e.getMessage() + " while " + what, e);
        }
    }

    /**
     * Sends {@code message}, which holds {@code queries} queries, and returns one reply per query,
     * read as the dialect's reply framing says. A reply that does not fit the framing is a
     * {@link ScpiProtocolException} that says what was expected and names the dialect's key.
     */
    private List<String> replies(String message, int queries, Duration work, String what) {
        Dialect.ReplyFraming framing = dialect.messages().replies();
        if (queries == 1 || framing == Dialect.ReplyFraming.SEMICOLON_JOINED) {
            return ScpiValues.splitUnits(session.query(message, work));
        }
        List<String> lines = new ArrayList<>(session.queryLines(message, queries, work));
        for (String line : lines) {
            if (ScpiValues.splitUnits(line).size() > 1) {
                throw new ScpiProtocolException(session.address() + ": expected " + queries + " replies to '"
                        + abbreviate(message) + "', each on a line of its own, but got '" + abbreviate(line)
                        + "' joined with ';' while " + what + " (the dialect says 'replies: one-line-per-query' in"
                        + " section 'messages'; a meter that joins them needs 'replies: semicolon-joined')");
            }
        }
        return lines;
    }

    /** A reply that does not fit the dialect's reply framing: what was expected, and the key to look at. */
    private ScpiProtocolException framingMismatch(String message, int queries, List<String> units, String what) {
        return new ScpiProtocolException(session.address() + ": expected " + queries + " replies joined with ';'"
                + " on one line to '" + abbreviate(message) + "' but got '" + abbreviate(String.join(";", units))
                + "' while " + what + " (the dialect says 'replies: semicolon-joined' in section 'messages'; a meter"
                + " that answers each query on a line of its own needs 'replies: one-line-per-query')");
    }

    private double[] parseNumbers(String data, String what) {
        try {
            return ScpiValues.parseNumbers(data);
        } catch (NumberFormatException e) {
            throw new ScpiProtocolException(session.address() + ": '" + abbreviate(e.getMessage())
                    + "' in the reply is not an NR1/NR2/NR3 number while " + what, e);
        }
    }

    private Reading reading(MeasurementSetting s, double[] values, int index, Instant t) {
        double[] z = dialect.reply().point(values, index);
        return z == null ? new Reading(s, Double.NaN, Double.NaN, ReadingStatus.NO_VALUE, t)
                : new Reading(s, z[0], z[1], ReadingStatus.OK, t);
    }

    private String render(Command c) {
        return dialect.command(c).orElseThrow(() -> new IllegalStateException(c.key())).render();
    }

    private String render(Command c, String placeholder, double value) {
        return dialect.command(c).orElseThrow(() -> new IllegalStateException(c.key())).render(Map.of(placeholder, value));
    }

    // ---- validation ---------------------------------------------------------------------------

    private void validate(MeasurementSetting s) {
        dialect.refusal(s).ifPresent(r -> {
            throw new InvalidInputException(r.message());
        });
    }

    private String meterName() {
        return "the meter (dialect " + dialect.name() + ")";
    }

    private static String describe(MeasurementSetting s) {
        return org.zweep.driver.impedance.Quantities.formatShort(s.frequencyHz(), org.zweep.driver.impedance.Unit.HERTZ, 6);
    }

    private static String abbreviate(String s) {
        return ScpiValues.abbreviate(s);
    }

    private void requireOpen() {
        if (closed) {
            throw new IllegalStateException("the meter has been shut down");
        }
    }

}
