package org.zweep.runner.sequence;

import java.nio.file.Path;
import org.zweep.config.BoundedYaml;
import org.zweep.config.ConfigException;
import org.zweep.config.YamlNode;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.plan.Plan;

/**
 * Reads a sequence file, validates it completely and expands it into a {@link Plan}. Nothing is
 * sent to any instrument: a sequence that would exceed its own safety limits, names an unknown
 * key or gives a value in the wrong unit is refused here with one line
 * {@code file:line:column: what was expected}.
 *
 * <p>Stateless and thread-safe. The schema is documented in README, section {@code formats-runner}.
 */
public final class SequenceLoader {
    private SequenceLoader() {
    }

    /**
     * Loads the sequence in {@code file} (UTF-8). Relative paths inside it (bench files,
     * compensation store) are resolved against the file's folder.
     *
     * @throws InvalidInputException when the file cannot be read or does not validate
     */
    public static Plan load(Path file) {
        return parse(read(file), file);
    }

    /**
     * Loads a sequence from {@code text} as if it were the contents of {@code source} (used in
     * messages and to resolve relative paths; the file itself is not read).
     *
     * @throws InvalidInputException when the text does not validate
     */
    public static Plan parse(String text, Path source) {
        return parse(text, source, null);
    }

    /**
     * {@link #load(Path)}, also checking every point against a meter's declared capabilities: the
     * dialect {@code dialect} names, or the sequence's own when {@code dialect} is {@code null}. A
     * point the meter cannot do is refused at the step key that asks for it ({@code file:line:column}).
     */
    public static Plan loadForMeter(Path file, String dialect) {
        return parse(read(file), file, dialect == null ? "" : dialect);
    }

    private static String read(Path file) {
        try {
            return BoundedYaml.read(file, "sequence file");
        } catch (InvalidInputException e) {
            throw e;
        } catch (ConfigException e) {
            throw new InvalidInputException(e.getMessage(), e);
        }
    }

    private static Plan parse(String text, Path source, String meterCheck) {
        String file = source.toString();
        try {
            YamlNode root = BoundedYaml.composeOne(text, file, "sequence file").orElseThrow(() ->
                    new InvalidInputException(file + ":1:1: empty file: expected a sequence (a mapping with "
                            + "format, meter, safety, part and steps)"));
            return new SequenceReader(source, meterCheck).read(root);
        } catch (InvalidInputException e) {
            throw e;
        } catch (ConfigException e) {
            throw new InvalidInputException(e.getMessage(), e);
        }
    }
}
