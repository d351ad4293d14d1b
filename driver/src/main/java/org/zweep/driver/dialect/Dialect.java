package org.zweep.driver.dialect;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.Range;
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
    public static final int MAX_FILE_BYTES = 1 << 20;

    private final String name;
    private final String description;
    private final String source;
    private final MeterCapabilities capabilities;
    private final Range averagingCount;
    private final Range integrationTimeS;
    private final Range impedanceRangeOhm;
    private final boolean compoundMessages;
    private final boolean appendErrorQuery;
    private final ReplyShape reply;
    private final Map<Command, Template> commands;
    private final MeterAccuracy accuracy;

    Dialect(String name, String description, String source, MeterCapabilities capabilities, Range averagingCount,
            Range integrationTimeS, Range impedanceRangeOhm, boolean compoundMessages, boolean appendErrorQuery,
            ReplyShape reply, Map<Command, Template> commands, MeterAccuracy accuracy) {
        this.name = name;
        this.description = description;
        this.source = source;
        this.capabilities = capabilities;
        this.averagingCount = averagingCount;
        this.integrationTimeS = integrationTimeS;
        this.impedanceRangeOhm = impedanceRangeOhm;
        this.compoundMessages = compoundMessages;
        this.appendErrorQuery = appendErrorQuery;
        this.reply = reply;
        this.commands = new EnumMap<>(commands);
        this.accuracy = accuracy;
    }

    /**
     * Loads a dialect. A string without a path separator and not ending in {@code .dialect} names a
     * built-in; anything else is a path to a dialect file.
     *
     * @throws InvalidInputException when no such built-in or file exists, or the file is malformed
     */
    public static Dialect load(String nameOrPath) {
        return isPath(nameOrPath) ? fromFile(Path.of(nameOrPath)) : builtIn(nameOrPath);
    }

    /**
     * Whether {@link #load} takes {@code nameOrPath} as a file path (it contains {@code /} or
     * {@code \} or ends in {@code .dialect}) rather than a built-in's name.
     */
    public static boolean isPath(String nameOrPath) {
        return nameOrPath.contains("/") || nameOrPath.contains("\\") || nameOrPath.endsWith(".dialect");
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
        if (text.length() > MAX_FILE_BYTES) {
            throw new InvalidInputException(source + ": larger than " + MAX_FILE_BYTES + " characters, the limit for a dialect file");
        }
        return new DialectParser(source, text).parse();
    }

    private static Dialect builtIn(String name) {
        if (!BUILT_INS.contains(name)) {
            throw new InvalidInputException("unknown dialect '" + name + "': the built-in dialects are "
                    + String.join(", ", BUILT_INS) + "; give a path to use a dialect file");
        }
        String file = name + ".dialect";
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
        byte[] bytes;
        try (InputStream in = Files.newInputStream(path)) {
            bytes = in.readNBytes(MAX_FILE_BYTES + 1); // bounded: a device such as /dev/zero is refused, not read whole
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(path + ": no such dialect file", e);
        } catch (IOException e) {
            throw new InvalidInputException(path + ": cannot read dialect file: " + e.getMessage(), e);
        }
        if (bytes.length > MAX_FILE_BYTES) {
            throw new InvalidInputException(path + ": larger than " + MAX_FILE_BYTES + " bytes, the limit for a dialect file");
        }
        try {
            return parse(path.toString(), StandardCharsets.UTF_8.newDecoder()
                    .onMalformedInput(java.nio.charset.CodingErrorAction.REPORT)
                    .decode(java.nio.ByteBuffer.wrap(bytes)).toString());
        } catch (java.nio.charset.CharacterCodingException e) {
            throw new InvalidInputException(path + ": the dialect file is not UTF-8 text", e);
        }
    }

    /** The dialect's name, from its {@code [meter]} section. */
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
    public Range averagingCount() {
        return averagingCount;
    }

    /** Integration (aperture) times the meter accepts, in seconds. */
    public Range integrationTimeS() {
        return integrationTimeS;
    }

    /** Upper limits of the impedance ranges the meter can hold, in ohms; {@code [0, 0]} when it cannot. */
    public Range impedanceRangeOhm() {
        return impedanceRangeOhm;
    }

    /** The meter's stated accuracy from the {@code [accuracy]} section; empty when the file states none. */
    public Optional<MeterAccuracy> accuracy() {
        return Optional.ofNullable(accuracy);
    }

    /** Where the dialect was loaded from, as used in messages. */
    public String source() {
        return source;
    }

    boolean compoundMessages() {
        return compoundMessages;
    }

    boolean appendErrorQuery() {
        return appendErrorQuery;
    }

    ReplyShape reply() {
        return reply;
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
}
