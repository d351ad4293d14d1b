package org.zweep.config;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.snakeyaml.engine.v2.api.LoadSettings;
import org.snakeyaml.engine.v2.api.lowlevel.Compose;
import org.snakeyaml.engine.v2.api.lowlevel.Parse;
import org.snakeyaml.engine.v2.events.AliasEvent;
import org.snakeyaml.engine.v2.events.CollectionEndEvent;
import org.snakeyaml.engine.v2.events.CollectionStartEvent;
import org.snakeyaml.engine.v2.events.DocumentStartEvent;
import org.snakeyaml.engine.v2.events.Event;
import org.snakeyaml.engine.v2.exceptions.MarkedYamlEngineException;
import org.snakeyaml.engine.v2.exceptions.YamlEngineException;
import org.snakeyaml.engine.v2.nodes.Node;

/**
 * YAML from files nobody vouches for: bounded in size, nesting depth, document count and aliases,
 * so that a hostile file is refused with one line {@code file:line:column: what} within a second
 * and in bounded memory (no stack overflow in the recursive composer, no quadratic re-reading of
 * long lines). Limits in README, section "Limits on input files".
 */
public final class BoundedYaml {
    /**
     * The largest file read, in bytes: a hundred times a long sequence file, and small enough
     * that the two passes over it (limits, then nodes) stay well under a second on a cold JVM.
     */
    public static final int MAX_FILE_BYTES = 256 << 10;
    /** The deepest nesting of mappings and lists. */
    public static final int MAX_DEPTH = 64;
    /** The most aliases ({@code *name}) in one file. */
    public static final int MAX_ALIASES = 64;
    /**
     * SnakeYAML Engine re-copies its read window every buffer's length while one scalar is being
     * scanned, so its default of 1024 code points makes a long line cost the square of its length;
     * a buffer this size keeps a line of {@link #MAX_FILE_BYTES} linear.
     */
    private static final int READ_BUFFER = 1 << 16;

    private BoundedYaml() {
    }

    /**
     * Reads at most {@link #MAX_FILE_BYTES} bytes of UTF-8 text (a device such as {@code /dev/zero}
     * included).
     *
     * @param what what the file is, for the message ("sequence file")
     * @throws ConfigException naming the file and the limit or the reason it cannot be read
     */
    public static String read(Path file, String what) {
        byte[] bytes;
        try (InputStream in = Files.newInputStream(file)) {
            bytes = in.readNBytes(MAX_FILE_BYTES + 1);
        } catch (NoSuchFileException e) {
            throw new ConfigException(file + ": cannot read: no such file");
        } catch (AccessDeniedException e) {
            throw new ConfigException(file + ": cannot read: permission denied");
        } catch (IOException e) {
            throw new ConfigException(file + ": cannot read: "
                    + (e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage()));
        }
        if (bytes.length > MAX_FILE_BYTES) {
            throw new ConfigException(file + ": larger than " + MAX_FILE_BYTES + " bytes, the limit for a " + what);
        }
        try {
            return StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT).decode(ByteBuffer.wrap(bytes)).toString();
        } catch (CharacterCodingException e) {
            throw new ConfigException(file + ": not UTF-8 text");
        }
    }

    /**
     * Composes every document of {@code text} after checking the limits on the event stream.
     *
     * @param file the name used in messages
     * @param what what the text is, for the message ("sequence file")
     * @throws ConfigException with {@code file:line:column} for a limit exceeded, a
     *     {@link YamlSyntaxException} for a syntax error
     */
    public static List<Node> compose(String text, String file, String what) {
        if (text.length() > MAX_FILE_BYTES) {
            throw new ConfigException(file + ": larger than " + MAX_FILE_BYTES + " characters, the limit for a " + what);
        }
        LoadSettings settings = LoadSettings.builder().setLabel(file).setBufferSize(READ_BUFFER)
                .setCodePointLimit(MAX_FILE_BYTES).setMaxAliasesForCollections(MAX_ALIASES).build();
        List<Node> documents = new ArrayList<>();
        try {
            checkLimits(new Parse(settings).parseString(text), file);
            new Compose(settings).composeAllFromString(text).forEach(documents::add);
        } catch (MarkedYamlEngineException e) {
            String where = YamlNode.where(file, e.getProblemMark().isPresent() ? e.getProblemMark() : e.getContextMark());
            String context = e.getContext() != null && e.getContextMark().isPresent() && e.getProblemMark().isPresent()
                    ? " (" + e.getContext() + " at line " + (e.getContextMark().get().getLine() + 1) + ", column "
                            + (e.getContextMark().get().getColumn() + 1) + ")"
                    : "";
            throw new YamlSyntaxException(where, e.getProblem(), context, e);
        } catch (YamlEngineException e) {
            throw new YamlSyntaxException(file, e.getMessage(), "", e);
        }
        return documents;
    }

    /**
     * The one document of {@code text} as a located node, or empty when the text holds none.
     *
     * @see #compose(String, String, String)
     */
    public static java.util.Optional<YamlNode> composeOne(String text, String file, String what) {
        List<Node> documents = compose(text, file, what);
        return documents.isEmpty() ? java.util.Optional.empty() : java.util.Optional.of(new YamlNode(documents.get(0), file));
    }

    /**
     * The parser quotes the character it did not expect as it is ("found \n(10)"), so a line end
     * or another control character would break the one-line message: each is written as an escape.
     */
    public static String oneLine(String message) {
        StringBuilder b = new StringBuilder(message.length());
        message.codePoints().forEach(c -> {
            if (c == '\n') {
                b.append("\\n");
            } else if (c == '\r') {
                b.append("\\r");
            } else if (c == '\t') {
                b.append("\\t");
            } else if (c < 0x20 || c == 0x7F || (c >= 0x80 && c < 0xA0) || c == 0x2028 || c == 0x2029) {
                b.append(String.format("\\u%04x", c));
            } else {
                b.appendCodePoint(c);
            }
        });
        return b.toString();
    }

    /** Walks the events (the parser keeps its own stack, so any depth is safe here). */
    private static void checkLimits(Iterable<Event> events, String file) {
        int depth = 0;
        int documents = 0;
        int aliases = 0;
        for (Event e : events) {
            if (e instanceof CollectionStartEvent) {
                if (++depth > MAX_DEPTH) {
                    throw new ConfigException(YamlNode.where(file, e.getStartMark())
                            + ": nested deeper than " + MAX_DEPTH + " levels (the limit)");
                }
            } else if (e instanceof CollectionEndEvent) {
                depth--;
            } else if (e instanceof AliasEvent) {
                if (++aliases > MAX_ALIASES) {
                    throw new ConfigException(YamlNode.where(file, e.getStartMark())
                            + ": more than " + MAX_ALIASES + " aliases (the limit)");
                }
            } else if (e instanceof DocumentStartEvent && ++documents > 1) {
                throw new ConfigException(YamlNode.where(file, e.getStartMark())
                        + ": expected one YAML document, found another");
            }
        }
    }
}
