package org.zweep.runner.lot;

import com.fasterxml.jackson.core.JsonProcessingException;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.List;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.results.Json;

/**
 * {@code lot.json}: what a lot was started with, so that {@code zweep lot --resume DIR} needs only
 * the folder. The parts themselves are the run folders beside it.
 *
 * @param format {@link #FORMAT}
 * @param lot the lot's name
 * @param sequenceFile the sequence file every part runs (absolute)
 * @param sequenceSha256 its SHA-256 when the lot started (a resumed lot refuses a changed file)
 * @param meter the meter address given with {@code --meter}, or null for the sequence's
 * @param dialect the dialect given with {@code --dialect}, or null for the sequence's
 * @param seed the first part's noise seed for a {@code sim:} meter (part k gets seed + k − 1), or null
 * @param source where serials come from: {@code count}, {@code serials} or {@code scan}
 * @param count how many parts ({@code count}), else null
 * @param serials the serials in order ({@code serials}), else null
 * @param operator who measures, or null
 * @param station the station's name, or null
 * @param started when the lot started (ISO-8601, UTC)
 * @param index whether the parts are added to the results index ({@code false}: started with
 *     {@code --no-index}, and a resume without {@code --index} keeps to that); null in lots
 *     written before this was recorded (indexed)
 */
public record LotManifest(String format, String lot, String sequenceFile, String sequenceSha256, String meter,
        String dialect, Long seed, String source, Integer count, List<String> serials, String operator,
        String station, String started, Boolean index) {

    /** The format word. */
    public static final String FORMAT = "zweep-lot/1";
    /** The file's name in a lot folder. */
    public static final String FILE = "lot.json";

    /** Whether {@code dir} is a lot folder (it holds {@code lot.json}). */
    public static boolean isLot(Path dir) {
        return Files.isRegularFile(dir.resolve(FILE));
    }

    /** Writes {@code lot.json} into {@code dir} atomically (a temporary file moved over it). */
    public void write(Path dir) {
        Path file = dir.resolve(FILE);
        Path tmp = dir.resolve(FILE + ".tmp");
        try {
            Files.writeString(tmp, Json.text(this), StandardCharsets.UTF_8);
            try {
                Files.move(tmp, file, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Reads {@code dir/lot.json}.
     *
     * @throws InvalidInputException when it is missing, not JSON or not {@link #FORMAT}
     */
    public static LotManifest read(Path dir) {
        Path file = dir.resolve(FILE);
        if (!Files.isRegularFile(file)) {
            throw new InvalidInputException(dir + ": not a lot folder (no " + FILE + ")");
        }
        LotManifest m;
        try {
            m = Json.reader().forType(LotManifest.class).readValue(file.toFile());
        } catch (JsonProcessingException e) {
            throw new InvalidInputException(file + ": not a valid lot manifest: "
                    + e.getOriginalMessage().replace('\n', ' '), e);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + file + ": " + e.getMessage(), e);
        }
        if (!FORMAT.equals(m.format())) {
            throw new InvalidInputException(file + ": format is " + m.format() + ", expected " + FORMAT);
        }
        if (m.lot() == null || m.sequenceFile() == null || m.source() == null) {
            throw new InvalidInputException(file + ": not a valid lot manifest: lot, sequence_file and source are"
                    + " needed");
        }
        return m;
    }
}
