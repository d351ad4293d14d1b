package org.zweep.driver.dialect;

import org.zweep.driver.impedance.Unit;
import org.zweep.driver.impedance.Quantities;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.zweep.config.BoundedYaml;
import org.zweep.config.ConfigException;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.Interval;
import org.zweep.driver.meter.SourceMode;
import org.zweep.driver.uncertainty.MeterAccuracy;

/**
 * A meter's dialect: its capabilities and the SCPI command template for each meter operation, as
 * loaded from a dialect file (format in README, section "Dialect files"). Immutable and thread-safe.
 *
 * <p>Load one with {@link #load(String)}: a built-in by name ({@link #builtInNames()}) or any file
 * by path. A malformed file gives an {@link InvalidInputException} whose one-line message starts
 * with {@code file:line:column}.
 */
public final class Dialect {
    private static final List<String> BUILT_INS = List.of("standard", "mz300");
    private static final String RESOURCE_DIR = "/org/zweep/driver/dialect/";
    /** The largest dialect file read, in bytes (and the longest dialect text, in characters). */
    public static final int MAX_FILE_BYTES = BoundedYaml.MAX_FILE_BYTES;

    /** How a meter frames the replies to a message that holds several queries. */
    public enum ReplyFraming {
        /** All replies on one line, separated by {@code ;} (IEEE 488.2 §8.4.1). */
        SEMICOLON_JOINED("semicolon-joined"),
        /** Each query's reply on a line of its own. */
        ONE_LINE_PER_QUERY("one-line-per-query");

        private final String word;

        ReplyFraming(String word) {
            this.word = word;
        }

        /** The value as written in a dialect file. */
        public String word() {
            return word;
        }
    }

    /** Where the meter's error query is asked. */
    public enum ErrorCheck {
        /** After every message of settings (and commands such as acquiring a standard), not after a measurement. */
        SETTINGS("settings"),
        /** After every measurement only. */
        MEASUREMENT("measurement"),
        /** After settings and after measurements. */
        BOTH("both"),
        /** Never: the meter has no error query (a {@code sync} command, when declared, waits for completion). */
        NONE("none");

        private final String word;

        ErrorCheck(String word) {
            this.word = word;
        }

        /** The value as written in a dialect file. */
        public String word() {
            return word;
        }

        boolean afterSettings() {
            return this == SETTINGS || this == BOTH;
        }

        boolean afterMeasurement() {
            return this == MEASUREMENT || this == BOTH;
        }
    }

    /**
     * How messages are put together: section {@code messages} of a dialect file.
     *
     * @param join whether several commands may share one message, separated by {@code ;}
     * @param replies how the replies to a message with several queries come back
     * @param errorCheck where the error query is asked
     * @param errorQueryJoined whether the error query ends the same message (else it is a message of its own)
     */
    public record Messages(boolean join, ReplyFraming replies, ErrorCheck errorCheck, boolean errorQueryJoined) {
    }

    private final String name;
    private final String description;
    private final String source;
    private final MeterCapabilities capabilities;
    private final Interval averagingCount;
    private final Interval integrationTimeS;
    private final Interval impedanceRangeOhm;
    private final Messages messages;
    private final boolean correctionListAcquisition;
    private final ReplyShape reply;
    private final MeterTiming timing;
    private final Map<Command, Template> commands;
    private final Map<FixtureState, Template> fixture;
    private final double fixtureSettleS;
    private final MeterAccuracy accuracy;

    Dialect(String name, String description, String source, MeterCapabilities capabilities, Interval averagingCount,
            Interval integrationTimeS, Interval impedanceRangeOhm, Messages messages, boolean correctionListAcquisition,
            ReplyShape reply, MeterTiming timing, Map<Command, Template> commands,
            Map<FixtureState, Template> fixture, double fixtureSettleS, MeterAccuracy accuracy) {
        this.name = name;
        this.description = description;
        this.source = source;
        this.capabilities = capabilities;
        this.averagingCount = averagingCount;
        this.integrationTimeS = integrationTimeS;
        this.impedanceRangeOhm = impedanceRangeOhm;
        this.messages = messages;
        this.correctionListAcquisition = correctionListAcquisition;
        this.reply = reply;
        this.timing = timing;
        this.commands = new EnumMap<>(commands);
        this.fixture = fixture.isEmpty() ? Map.of() : new EnumMap<>(fixture);
        this.fixtureSettleS = fixtureSettleS;
        this.accuracy = accuracy;
    }

    /**
     * Loads a dialect. A string without a path separator and not ending in {@code .yaml} or
     * {@code .yml} names a built-in; anything else is a path to a dialect file.
     *
     * @throws InvalidInputException when no such built-in or file exists, or the file is malformed
     */
    public static Dialect load(String nameOrPath) {
        return isPath(nameOrPath) ? fromFile(Path.of(nameOrPath)) : builtIn(nameOrPath);
    }

    /**
     * Whether {@link #load} takes {@code nameOrPath} as a file path (it contains {@code /} or
     * {@code \} or ends in {@code .yaml} or {@code .yml}) rather than a built-in's name.
     */
    public static boolean isPath(String nameOrPath) {
        return nameOrPath.contains("/") || nameOrPath.contains("\\") || nameOrPath.endsWith(".yaml")
                || nameOrPath.endsWith(".yml");
    }

    /** How long the meter works on what it is asked (section {@code timing}, or its defaults). */
    public MeterTiming timing() {
        return timing;
    }

    /** The names of the dialects shipped with zweep, in the order they are documented. */
    public static List<String> builtInNames() {
        return BUILT_INS;
    }

    /**
     * Parses dialect text.
     *
     * @param source what to call the text in error messages (a file name)
     * @param text the dialect file's content
     * @throws InvalidInputException naming {@code source:line:column} and the problem
     */
    public static Dialect parse(String source, String text) {
        return new DialectReader(source, text).read();
    }

    private static Dialect builtIn(String name) {
        if (!BUILT_INS.contains(name)) {
            throw new InvalidInputException("unknown dialect '" + name + "': the built-in dialects are "
                    + String.join(", ", BUILT_INS) + "; give a path to use a dialect file");
        }
        String file = name + ".yaml";
        try (InputStream in = Dialect.class.getResourceAsStream(RESOURCE_DIR + file)) {
            if (in == null) {
                throw new IllegalStateException("built-in dialect missing from the classpath: " + file);
            }
            return parse(file, new String(in.readAllBytes(), StandardCharsets.UTF_8));
        } catch (IOException e) {
            throw new IllegalStateException("cannot read built-in dialect " + file, e);
        }
    }

    private static Dialect fromFile(Path path) {
        String text;
        try {
            text = BoundedYaml.read(path, "dialect file");
        } catch (InvalidInputException e) {
            throw e;
        } catch (ConfigException e) {
            throw new InvalidInputException(e.getMessage(), e);
        }
        return parse(path.toString(), text);
    }

    /** The dialect's name, from its section {@code meter}. */
    public String name() {
        return name;
    }

    /** A one-line description of the meter, empty when the file gives none. */
    public String description() {
        return description;
    }

    /** What the meter can do. Ranges the dialect leaves out are {@code [0, 0]} (not supported). */
    public MeterCapabilities capabilities() {
        return capabilities;
    }

    /** Averaging counts the meter accepts. */
    public Interval averagingCount() {
        return averagingCount;
    }

    /** Integration (aperture) times the meter accepts, in seconds. */
    public Interval integrationTimeS() {
        return integrationTimeS;
    }

    /** Upper limits of the impedance ranges the meter can hold, in ohms; {@code [0, 0]} when it cannot. */
    public Interval impedanceRangeOhm() {
        return impedanceRangeOhm;
    }

    /** The meter's stated accuracy from section {@code accuracy}; empty when the file states none. */
    public Optional<MeterAccuracy> accuracy() {
        return Optional.ofNullable(accuracy);
    }

    /** Where the dialect was loaded from, as used in messages. */
    public String source() {
        return source;
    }

    /** How messages are put together and where the error query goes. */
    public Messages messages() {
        return messages;
    }

    /**
     * Whether a point measured right after its setting travels as one message, one round trip: the
     * settings that changed, the trigger (and {@code measure-again}) and the error query joined,
     * with ASCII replies. {@link DialectMeter#measureAt} sends it so exactly when this holds (and
     * nothing must be sent again after a failure); run estimates count its round trips from here.
     */
    public boolean measuresAtInOneMessage() {
        return messages.join() && messages.errorQueryJoined() && messages.errorCheck().afterMeasurement()
                && reply.encoding() == ReplyShape.Encoding.ASCII;
    }

    /**
     * The round trips (messages that wait for an answer) {@link DialectMeter} takes to measure one
     * point, for run estimates: one when {@link #measuresAtInOneMessage()}; otherwise the settings
     * message when a setting changed (answered by its joined error query, a separate error query
     * or the {@code sync} query; none when the meter confirms nothing), the trigger (with
     * {@code measure-again} joined where messages join and replies are ASCII, else a second
     * read) and a separate error query after it.
     *
     * @param settingChanged whether anything of the setting differs from what the meter holds
     */
    public int roundTripsPerPoint(boolean settingChanged) {
        if (measuresAtInOneMessage()) {
            return 1;
        }
        int n = 0;
        if (settingChanged && (messages.errorCheck().afterSettings() || has(Command.SYNC))) {
            n++;
        }
        n++;
        if (has(Command.MEASURE_AGAIN) && !(messages.join() && reply.encoding() == ReplyShape.Encoding.ASCII)) {
            n++;
        }
        if (messages.errorCheck().afterMeasurement() && !messages.errorQueryJoined()) {
            n++;
        }
        return n;
    }

    /**
     * Whether a standard acquired at each frequency of a plan ({@link
     * org.zweep.driver.meter.CorrectionStyle#AT_ACQUIRED_FREQUENCY}) is acquired over a list of
     * those frequencies in one message (the {@code correction-<standard>-list} commands, at most
     * {@code list-points} frequencies a message when the dialect declares list sweeps) instead of one
     * frequency at a time.
     */
    public boolean correctionListAcquisition() {
        return correctionListAcquisition;
    }

    /** The fixture states the meter can switch itself (section {@code fixture}); empty when it has none. */
    public Set<FixtureState> fixtureStates() {
        return fixture.keySet();
    }

    /** How long a fixture switch takes to settle after its command, in s (0 when the dialect states none). */
    public double fixtureSettleS() {
        return fixtureSettleS;
    }

    /** Whether the dialect declares integration time (section {@code capabilities}, key {@code integration-time}). */
    public boolean hasIntegrationTime() {
        return has(Command.INTEGRATION_TIME);
    }

    Optional<Template> fixtureCommand(FixtureState state) {
        return Optional.ofNullable(fixture.get(state));
    }

    boolean compoundMessages() {
        return messages.join();
    }

    boolean appendErrorQuery() {
        return messages.errorQueryJoined();
    }

    ReplyShape reply() {
        return reply;
    }

    /**
     * Whether the meter takes IEEE 488.2 common commands: its dialect identifies it with
     * {@code *IDN?} (IEEE 488.2 §10.14). Only such a meter is sent {@code *CLS} when zweep connects;
     * any other meter hears nothing but what its dialect declares.
     */
    public boolean takesCommonCommands() {
        return command(Command.IDENTIFY).map(t -> t.text().strip().equalsIgnoreCase("*IDN?")).orElse(false);
    }

    Optional<Template> command(Command c) {
        return Optional.ofNullable(commands.get(c));
    }

    boolean has(Command c) {
        return commands.containsKey(c);
    }

    @Override
    public String toString() {
        return "dialect " + name + " (" + source + ")";
    }

    /**
     * Why this dialect's meter cannot do {@code s}: which part of the setting ({@code quantity},
     * {@code frequency}, {@code level}, {@code bias}, {@code averaging}, {@code integration},
     * {@code range}) and a one-line message naming the value and the limit.
     *
     * @param setting the part of the setting refused
     * @param message what is wrong, e.g. {@code frequency 1E7 Hz is above the maximum 5000000 Hz of ...}
     */
    public record Refusal(String setting, String message) {
    }

    /** The first reason this dialect's meter cannot do {@code s}, or empty when it can. */
    public Optional<Refusal> refusal(MeasurementSetting s) {
        MeterCapabilities caps = capabilities;
        if (s.quantity() == MeasuredQuantity.VOLTAGE_RATIO && !caps.voltageRatio()) {
            return Optional.of(new Refusal("quantity", "quantity: " + meterName() + " cannot measure a voltage ratio"));
        }
        Optional<Refusal> r = within("frequency", "frequency", s.frequencyHz(), caps.frequencyHz(), "Hz");
        if (r.isEmpty()) {
            r = s.drive().mode() == SourceMode.VOLTAGE
                    ? supported("level", "voltage drive", Command.DRIVE_VOLTAGE)
                            .or(() -> within("level", "drive level", s.drive().levelRms(), caps.voltageLevelVrms(),
                                    "V rms"))
                    : supported("level", "current drive", Command.DRIVE_CURRENT)
                            .or(() -> within("level", "drive level", s.drive().levelRms(), caps.currentLevelArms(),
                                    "A rms"));
        }
        if (r.isEmpty() && s.bias().on()) {
            r = s.bias().mode() == SourceMode.VOLTAGE
                    ? supported("bias", "voltage bias", Command.BIAS_VOLTAGE)
                            .or(() -> within("bias", "DC bias", s.bias().value(), caps.biasVoltageV(), "V"))
                    : supported("bias", "current bias", Command.BIAS_CURRENT)
                            .or(() -> within("bias", "DC bias", s.bias().value(), caps.biasCurrentA(), "A"));
        }
        return r.or(() -> within("averaging", "averaging count", s.averagingCount(), averagingCount, ""))
                .or(() -> has(Command.INTEGRATION_TIME)
                        ? within("integration", "integration time", s.integrationTimeS(), integrationTimeS, "s")
                        : s.integrationTimeS() == MeasurementSetting.DEFAULT_INTEGRATION_TIME_S ? Optional.empty()
                        : Optional.of(new Refusal("integration", "integration time " + plain(s.integrationTimeS(), "s")
                                + ": " + meterName() + " has no integration-time setting (leave 'integration'"
                                + " out of the step to use the meter's own)")))
                .or(() -> s.range().auto() ? Optional.empty()
                        : supported("range", "held impedance range", Command.RANGE_HOLD)
                                .or(() -> within("range", "impedance range", s.range().upperOhm(),
                                        impedanceRangeOhm, "ohm")));
    }

    private Optional<Refusal> supported(String key, String what, Command c) {
        return has(c) ? Optional.empty() : Optional.of(new Refusal(key, what + ": " + meterName() + " cannot set it"));
    }

    private Optional<Refusal> within(String key, String setting, double value, Interval r, String unit) {
        if (Double.isNaN(value)) {
            return Optional.of(new Refusal(key, setting + " is not a number"));
        }
        if (value < r.min()) {
            return Optional.of(new Refusal(key, setting + " " + plain(value, unit) + " is below the minimum "
                    + plain(r.min(), unit) + " of " + meterName()));
        }
        if (value > r.max()) {
            return Optional.of(new Refusal(key, setting + " " + plain(value, unit) + " is above the maximum "
                    + plain(r.max(), unit) + " of " + meterName()));
        }
        return Optional.empty();
    }

    private String meterName() {
        return "the meter (dialect " + name + ")";
    }

    /** {@code v} for people, with the SI prefix of its unit ({@code 2 MHz}, {@code 100 kΩ}, {@code 25 V}). */
    private static String plain(double v, String unit) {
        if (!Double.isFinite(v)) {
            return Double.toString(v) + (unit.isEmpty() ? "" : " " + unit);
        }
        Unit u = "ohm".equals(unit) ? Unit.OHM : Unit.ofSymbol(unit).orElse(Unit.NONE);
        return u == Unit.NONE && !unit.isEmpty() ? Quantities.formatShort(v, Unit.NONE, 6) + " " + unit
                : Quantities.formatShort(v, u, 6);
    }
}
