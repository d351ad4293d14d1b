package org.zweep.driver.dialect;

import java.math.BigDecimal;
import java.time.Duration;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.function.Supplier;
import java.util.stream.Collectors;
import org.zweep.driver.MeterException;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.Drive;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.Interval;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.driver.scpi.ErrorQueue;
import org.zweep.driver.scpi.MeterErrorException;
import org.zweep.driver.scpi.ScpiError;
import org.zweep.driver.scpi.ScpiSession;
import org.zweep.driver.scpi.ScpiValues;

/**
 * Onboarding a meter: exercises every operation a dialect declares, one at a time and each
 * followed by the error query, at safe settings, and says which work.
 *
 * <p>Safe means: the lowest declared drive level, DC bias value 0 and never switched on at any
 * other value, the lowest averaging count and integration time, the highest held range, and 1 kHz
 * (or the declared frequency nearest it); nothing outside the dialect's own limits is sent. A
 * correction standard is acquired only where the dialect's fixture section can put that standard
 * in the fixture; otherwise it is skipped (an operator would have to fit it). The fixture ends at
 * {@code part}, and DC bias is switched off at the end whatever happened.
 *
 * <p>Blocking; one probe per session, not thread-safe.
 */
public final class DialectProbe {
    /** What became of one operation. */
    public enum Status {
        /** Sent, and the meter reported no error (and the reply, if any, read as expected). */
        OK,
        /** The meter reported an error, gave a reply that does not read, or did not answer. */
        FAILED,
        /** Declared but not exercised, for the reason given (e.g. a standard nobody can fit). */
        SKIPPED,
        /** The dialect does not declare it. */
        NOT_DECLARED
    }

    /**
     * One row of the probe's table.
     *
     * @param operation the dialect key ({@code frequency}, {@code fixture part}, {@code measure once})
     * @param status what became of it
     * @param detail what was sent and read, the meter's own error text, or why it was skipped
     */
    public record Outcome(String operation, Status status, String detail) {
    }

    private static final double SAFE_FREQUENCY_HZ = 1e3;

    private final ScpiSession session;
    private final Dialect dialect;
    private final DialectMeter meter;
    private final List<Outcome> outcomes = new ArrayList<>();
    private final Set<Command> tried = EnumSet.noneOf(Command.class);

    private DialectProbe(ScpiSession session, Dialect dialect) {
        this.session = session;
        this.dialect = dialect;
        this.meter = new DialectMeter(session, dialect);
    }

    /**
     * Probes the meter on {@code session} with {@code dialect}, then shuts it down safely (DC bias
     * off, session closed).
     *
     * @return one outcome per operation: those exercised in the order they were, then the ones the
     *     dialect does not declare
     */
    public static List<Outcome> run(ScpiSession session, Dialect dialect) {
        DialectProbe p = new DialectProbe(session, dialect);
        try {
            p.probe();
        } finally {
            p.emptyErrorQueue();
            boolean off = p.meter.safeShutdown();
            if (!off && p.dialect.has(Command.BIAS_OFF)) {
                p.outcomes.add(new Outcome("bias-off at the end", Status.FAILED,
                        "the meter did not confirm DC bias off: check it before touching the fixture"));
            }
        }
        for (Command c : Command.values()) {
            if (!p.dialect.has(c)) {
                p.outcomes.add(new Outcome(c.key(), Status.NOT_DECLARED, ""));
            }
        }
        for (FixtureState s : FixtureState.values()) {
            if (!p.dialect.fixtureStates().contains(s)) {
                p.outcomes.add(new Outcome(fixtureKey(s), Status.NOT_DECLARED, ""));
            }
        }
        return p.outcomes;
    }

    /** Reads away what failures left in the error queue, so that the final bias-off is judged on its own. */
    private void emptyErrorQueue() {
        if (dialect.has(Command.ERROR_QUERY)) {
            try {
                ErrorQueue.read(session, render(Command.ERROR_QUERY), Duration.ZERO, List.of(), "emptying the error queue");
            } catch (RuntimeException e) {
                // the bias-off that follows is still sent, and says whether it was confirmed
            }
        }
    }

    /** Whether every declared operation that was exercised worked (skipped ones do not count). */
    public static boolean allOk(List<Outcome> outcomes) {
        return outcomes.stream().noneMatch(o -> o.status() == Status.FAILED);
    }

    private void probe() {
        MeterCapabilities caps = dialect.capabilities();
        if (dialect.has(Command.ERROR_QUERY)) {
            attempt("error-query", Command.ERROR_QUERY, () -> {
                List<ScpiError> old = ErrorQueue.read(session, render(Command.ERROR_QUERY), Duration.ZERO, List.of(),
                        "emptying the error queue");
                return old.isEmpty() ? "the queue is empty" : "emptied " + old.size() + " old entries: " + joined(old);
            });
        }
        query(Command.IDENTIFY, r -> {
            if (r.split(",", -1).length < 2) {
                throw new IllegalArgumentException("'" + ScpiValues.abbreviate(r) + "' is not maker,model,serial,firmware");
            }
        });
        write(Command.RESET, Map.of());
        write(Command.SETUP, Map.of());
        query(Command.SYNC, r -> { });
        write(Command.FUNCTION_VOLTAGE_RATIO, Map.of());
        write(Command.FUNCTION_IMPEDANCE, Map.of());
        double f = clamp(SAFE_FREQUENCY_HZ, caps.frequencyHz());
        write(Command.FREQUENCY, Map.of("frequency", f));
        write(Command.DRIVE_CURRENT, Map.of("level", caps.currentLevelArms().min()));
        write(Command.DRIVE_VOLTAGE, Map.of("level", caps.voltageLevelVrms().min()));
        write(Command.AVERAGING, Map.of("count", (int) dialect.averagingCount().min()));
        write(Command.INTEGRATION_TIME, Map.of("seconds", dialect.integrationTimeS().min()));
        write(Command.RANGE_HOLD, Map.of("ohms", dialect.impedanceRangeOhm().max()));
        write(Command.RANGE_AUTO, Map.of());
        bias(Command.BIAS_VOLTAGE, Command.BIAS_VOLTAGE_ON, Command.BIAS_VOLTAGE_OFF, caps.biasVoltageV(), "V");
        bias(Command.BIAS_CURRENT, Command.BIAS_CURRENT_ON, Command.BIAS_CURRENT_OFF, caps.biasCurrentA(), "A");
        write(Command.BIAS_OFF, Map.of());
        query(Command.BIAS_VOLTAGE_QUERY, DialectProbe::oneNumber);
        query(Command.BIAS_VOLTAGE_STATE_QUERY, DialectProbe::onOff);
        query(Command.BIAS_CURRENT_QUERY, DialectProbe::oneNumber);
        query(Command.BIAS_CURRENT_STATE_QUERY, DialectProbe::onOff);
        for (Command c : List.of(Command.LIMIT_FREQUENCY_MIN, Command.LIMIT_FREQUENCY_MAX,
                Command.LIMIT_VOLTAGE_LEVEL_MIN, Command.LIMIT_VOLTAGE_LEVEL_MAX, Command.LIMIT_CURRENT_LEVEL_MIN,
                Command.LIMIT_CURRENT_LEVEL_MAX, Command.LIMIT_BIAS_VOLTAGE_MIN, Command.LIMIT_BIAS_VOLTAGE_MAX,
                Command.LIMIT_BIAS_CURRENT_MIN, Command.LIMIT_BIAS_CURRENT_MAX)) {
            query(c, DialectProbe::oneNumber);
        }
        listSweep(caps, f);
        write(Command.LOAD_STANDARD, Map.of("resistance", 100.0, "reactance", 0.0));
        fixtureAndStandards();
        // after the standards: a meter may refuse to correct with no data acquired
        write(Command.CORRECTION_ON, Map.of());
        write(Command.CORRECTION_OFF, Map.of());
        measureOnce(f, caps);
    }

    /** The bias value 0 (only when 0 is within the declared range), then on at 0 and off again. */
    private void bias(Command value, Command on, Command off, Interval range, String unit) {
        if (!dialect.has(value)) {
            return;
        }
        if (!(range.min() <= 0 && 0 <= range.max())) {
            skip(value, "0 " + unit + " is outside the declared range, and the probe never applies any other bias");
            skip(on, "the bias value was not set to 0 " + unit);
            write(off, Map.of());
            return;
        }
        boolean zero = write(value, Map.of("bias", 0.0));
        if (zero) {
            write(on, Map.of());
        } else {
            skip(on, "the bias value 0 " + unit + " was refused, so the source is not switched on");
        }
        write(off, Map.of());
    }

    private void listSweep(MeterCapabilities caps, double f) {
        if (!dialect.has(Command.LIST_FREQUENCY)) {
            return;
        }
        double f2 = clamp(10 * f, caps.frequencyHz());
        if (f2 == f) {
            f2 = clamp(f / 10, caps.frequencyHz());
        }
        List<Double> frequencies = List.of(f, f2);
        write(Command.LIST_FREQUENCY, Map.of("frequencies", frequencies));
        write(Command.LIST_VOLTAGE, Map.of("levels", List.of(caps.voltageLevelVrms().min(),
                caps.voltageLevelVrms().min())));
        write(Command.LIST_CURRENT, Map.of("levels", List.of(caps.currentLevelArms().min(),
                caps.currentLevelArms().min())));
        if (caps.biasVoltageV().min() <= 0 && 0 <= caps.biasVoltageV().max()) {
            write(Command.LIST_BIAS_VOLTAGE, Map.of("biases", List.of(0.0, 0.0)));
        } else if (dialect.has(Command.LIST_BIAS_VOLTAGE)) {
            skip(Command.LIST_BIAS_VOLTAGE, "0 V is outside the declared range");
        }
        if (caps.biasCurrentA().min() <= 0 && 0 <= caps.biasCurrentA().max()) {
            write(Command.LIST_BIAS_CURRENT, Map.of("biases", List.of(0.0, 0.0)));
        } else if (dialect.has(Command.LIST_BIAS_CURRENT)) {
            skip(Command.LIST_BIAS_CURRENT, "0 A is outside the declared range");
        }
        write(Command.LIST_MODE_ON, Map.of());
        MeasurementSetting s = MeasurementSetting.at(f).withDrive(lowestDrive(caps))
                .withIntegrationTimeS(dialect.hasIntegrationTime() ? dialect.integrationTimeS().min()
                        : MeasurementSetting.DEFAULT_INTEGRATION_TIME_S);
        Duration work = seconds(dialect.timing().sweepS(List.of(s, s.withFrequencyHz(f2)), null));
        int numbers = 2 * dialect.reply().fields().size();
        attempt(Command.LIST_MEASURE.key(), Command.LIST_MEASURE, () -> {
            String detail = readNumbers(render(Command.LIST_MEASURE), numbers, work);
            return detail + errorsAfter(Command.LIST_MEASURE);
        });
        write(Command.LIST_MODE_OFF, Map.of());
    }

    /** Each fixture state the dialect can reach, acquiring each standard while it is in the fixture; part last. */
    private void fixtureAndStandards() {
        Set<FixtureState> states = dialect.fixtureStates();
        for (FixtureState s : FixtureState.values()) {
            if (s == FixtureState.PART || !states.contains(s)) {
                continue;
            }
            boolean there = hold(s);
            CorrectionStandard standard = switch (s) {
                case OPEN -> CorrectionStandard.OPEN;
                case SHORT -> CorrectionStandard.SHORT;
                case LOAD -> CorrectionStandard.LOAD;
                default -> null;
            };
            if (standard != null && dialect.capabilities().corrections().contains(standard)) {
                Command c = Command.acquiring(standard);
                Command list = Command.acquiringList(standard);
                if (there) {
                    attempt(c.key(), c, () -> {
                        meter.acquireCorrection(standard);
                        return "acquired with the fixture at " + fixtureKey(s).substring("fixture ".length());
                    });
                    if (dialect.has(list)) {
                        attempt(list.key(), list, () -> {
                            List<MeasurementSetting> at = twoSafeSettings();
                            meter.acquireCorrection(standard, at);
                            return "acquired at " + plain(at.get(0).frequencyHz()) + " and "
                                    + plain(at.get(1).frequencyHz()) + " Hz in one message";
                        });
                    }
                } else {
                    skip(c, "the fixture did not switch to " + s.name().toLowerCase(Locale.ROOT));
                }
            }
        }
        if (states.contains(FixtureState.PART)) {
            hold(FixtureState.PART);
        } else if (!states.isEmpty()) {
            outcomes.add(new Outcome("fixture part", Status.FAILED,
                    "the fixture section cannot put the part back (no 'part' command): it was left switched"));
        }
        for (CorrectionStandard standard : dialect.capabilities().corrections()) {
            for (Command c : List.of(Command.acquiring(standard), Command.acquiringList(standard))) {
                if (dialect.has(c) && !tried.contains(c)) {
                    skip(c, "needs the " + standard.name().toLowerCase(Locale.ROOT)
                            + " standard in the fixture, and the dialect's fixture section cannot put it there");
                }
            }
        }
    }

    private boolean hold(FixtureState s) {
        String key = fixtureKey(s);
        try {
            meter.fixture().orElseThrow().hold(s);
            outcomes.add(new Outcome(key, Status.OK, "sent '" + ScpiValues.abbreviate(
                    dialect.fixtureCommand(s).orElseThrow().render()) + "'" + (dialect.has(Command.ERROR_QUERY)
                            ? "" : " (no error query to check)")));
            return true;
        } catch (RuntimeException e) {
            outcomes.add(new Outcome(key, Status.FAILED, failure(e)));
            return false;
        }
    }

    /** A fresh setting at safe values through the dialect's own measuring path, then measure-again raw. */
    /** Two frequencies (the safe one and twice it, within the declared range) at the lowest drive. */
    private List<MeasurementSetting> twoSafeSettings() {
        MeterCapabilities caps = dialect.capabilities();
        double f = clamp(SAFE_FREQUENCY_HZ, caps.frequencyHz());
        double g = clamp(2 * f, caps.frequencyHz()) > f ? clamp(2 * f, caps.frequencyHz()) : clamp(f / 2, caps.frequencyHz());
        MeasurementSetting s = MeasurementSetting.at(f).withDrive(lowestDrive(caps));
        return List.of(s, s.withFrequencyHz(g));
    }

    private void measureOnce(double f, MeterCapabilities caps) {
        String what = "measure once";
        if (caps.voltageLevelVrms().max() <= 0 && caps.currentLevelArms().max() <= 0) {
            outcomes.add(new Outcome(what, Status.SKIPPED, "the dialect declares no drive level to measure at"));
            return;
        }
        // the default integration time (within the declared range): the shortest gives a noisy reading
        MeasurementSetting s = MeasurementSetting.at(f).withDrive(lowestDrive(caps))
                .withIntegrationTimeS(dialect.hasIntegrationTime()
                        ? clamp(MeasurementSetting.DEFAULT_INTEGRATION_TIME_S, dialect.integrationTimeS())
                        : MeasurementSetting.DEFAULT_INTEGRATION_TIME_S)
                .withAveragingCount((int) dialect.averagingCount().min());
        tried.add(Command.MEASURE);
        try {
            meter.reset();
            meter.apply(s);
            Reading r = meter.measure();
            String value = r.status() == ReadingStatus.OK
                    ? String.format(Locale.ROOT, "%.6g %s j%.6g ohm", r.real(), r.imaginary() < 0 ? "-" : "+",
                            Math.abs(r.imaginary()))
                    : "no value (the meter sent its not-a-number)";
            outcomes.add(new Outcome(what, Status.OK, value + " at " + plain(f) + " Hz, " + drive(s.drive())));
        } catch (RuntimeException e) {
            outcomes.add(new Outcome(what, Status.FAILED, failure(e)));
            return;
        }
        if (dialect.has(Command.MEASURE_AGAIN)) {
            int numbers = dialect.reply().fields().size();
            attempt(Command.MEASURE_AGAIN.key(), Command.MEASURE_AGAIN,
                    () -> readNumbers(render(Command.MEASURE_AGAIN), numbers, Duration.ZERO)
                            + errorsAfter(Command.MEASURE_AGAIN));
        }
    }

    // ---- one operation ----

    /** Sends {@code c} (when declared) as a message of its own and checks the error queue; whether it worked. */
    private boolean write(Command c, Map<String, ?> values) {
        if (!dialect.has(c)) {
            return false;
        }
        return attempt(c.key(), c, () -> {
            String text = dialect.command(c).orElseThrow().render(values);
            session.write(text);
            return "sent '" + ScpiValues.abbreviate(text) + "'" + errorsAfter(c);
        });
    }

    /** Sends query {@code c} (when declared), checks its reply with {@code check}, then the error queue. */
    private void query(Command c, java.util.function.Consumer<String> check) {
        if (!dialect.has(c)) {
            return;
        }
        attempt(c.key(), c, () -> {
            String text = render(c);
            String reply = session.query(text);
            check.accept(reply);
            return "'" + ScpiValues.abbreviate(text) + "' answered '" + ScpiValues.abbreviate(reply.strip()) + "'"
                    + errorsAfter(c);
        });
    }

    /**
     * Runs one operation; a {@link MeterErrorException} is the meter's own words, anything else
     * the reason it failed.
     */
    private boolean attempt(String key, Command c, Supplier<String> action) {
        tried.add(c);
        try {
            String detail = action.get();
            outcomes.add(new Outcome(key, Status.OK, detail));
            return true;
        } catch (RuntimeException e) {
            outcomes.add(new Outcome(key, Status.FAILED, failure(e)));
            return false;
        }
    }

    private void skip(Command c, String why) {
        tried.add(c);
        outcomes.add(new Outcome(c.key(), Status.SKIPPED, why));
    }

    /** The error queue after {@code c}: empty, or a {@link MeterErrorException} with every entry. */
    private String errorsAfter(Command c) {
        if (!dialect.has(Command.ERROR_QUERY)) {
            return " (no error query to check)";
        }
        ErrorQueue.check(session, render(Command.ERROR_QUERY), Duration.ZERO, "probing " + c.key());
        return "";
    }

    private String readNumbers(String query, int expected, Duration work) {
        String reply = session.query(query, work);
        double[] v;
        try {
            v = ScpiValues.parseNumbers(reply);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("'" + ScpiValues.abbreviate(e.getMessage())
                    + "' in the reply is not a number");
        }
        if (v.length != expected) {
            throw new IllegalArgumentException("expected " + expected + " numbers (reply fields "
                    + dialect.reply().fields().stream().map(x -> x.word).collect(Collectors.joining(", "))
                    + "), got " + v.length + ": '" + ScpiValues.abbreviate(reply) + "'");
        }
        return "'" + ScpiValues.abbreviate(query) + "' answered " + v.length + " numbers";
    }

    private static void oneNumber(String reply) {
        try {
            ScpiValues.parseNumber(reply);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("'" + ScpiValues.abbreviate(reply.strip()) + "' is not one number");
        }
    }

    private static void onOff(String reply) {
        String r = reply.strip().toUpperCase(Locale.ROOT);
        if (!List.of("0", "1", "ON", "OFF").contains(r)) {
            throw new IllegalArgumentException("'" + ScpiValues.abbreviate(reply.strip()) + "' is not 1, 0, ON or OFF");
        }
    }

    private static String failure(RuntimeException e) {
        if (e instanceof MeterErrorException m) {
            return "the meter reported " + joined(m.errors());
        }
        if (e instanceof MeterException || e instanceof IllegalArgumentException) {
            return e.getMessage();
        }
        return e.getClass().getSimpleName() + ": " + e.getMessage();
    }

    private static String joined(List<ScpiError> errors) {
        return errors.stream().map(ScpiError::toString).collect(Collectors.joining("; "));
    }

    private String render(Command c) {
        return dialect.command(c).orElseThrow().render();
    }

    static String fixtureKey(FixtureState s) {
        return "fixture " + s.name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    private static Drive lowestDrive(MeterCapabilities caps) {
        return caps.voltageLevelVrms().max() > 0 ? Drive.voltage(caps.voltageLevelVrms().min())
                : Drive.current(caps.currentLevelArms().min());
    }

    private static String drive(Drive d) {
        return plain(d.levelRms()) + (d.mode() == org.zweep.driver.meter.SourceMode.VOLTAGE ? " V" : " A") + " rms";
    }

    private static double clamp(double v, Interval r) {
        return Math.max(r.min(), Math.min(r.max(), v));
    }

    private static Duration seconds(double s) {
        return s > 0 ? Duration.ofNanos((long) Math.ceil(s * 1e9)) : Duration.ZERO;
    }

    private static String plain(double v) {
        return new BigDecimal(Double.toString(v)).stripTrailingZeros().toPlainString();
    }
}
