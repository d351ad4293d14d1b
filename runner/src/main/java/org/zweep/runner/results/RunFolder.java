package org.zweep.runner.results;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.time.Instant;
import java.time.ZoneId;
import java.time.format.DateTimeFormatter;
import java.util.HexFormat;
import java.util.stream.Stream;
import org.zweep.driver.InvalidInputException;

/**
 * A run folder on disk: {@code points.csv}, {@code run.json}, the copy of the sequence
 * ({@code sequence.yaml}) and host-side compensation data under {@code compensation/}.
 *
 * @param dir the folder
 */
public record RunFolder(Path dir) {
    /** The copy of the sequence inside the folder. */
    public static final String SEQUENCE_COPY = "sequence.yaml";
    /** The points file inside the folder. */
    public static final String POINTS = "points.csv";

    private static final DateTimeFormatter STAMP = DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss");

    /** {@code points.csv}. */
    public Path points() {
        return dir.resolve(POINTS);
    }

    /** {@code run.json}. */
    public Path manifest() {
        return dir.resolve(RunManifest.FILE);
    }

    /** {@code sequence.yaml}. */
    public Path sequenceCopy() {
        return dir.resolve(SEQUENCE_COPY);
    }

    /** {@code compensation/}, the host-side compensation data of this run. */
    public Path compensation() {
        return dir.resolve("compensation");
    }

    /**
     * Creates a fresh folder {@code <resultsDir>/<name>-<yyyyMMdd-HHmmss>} (with {@code -2},
     * {@code -3}, ... appended when that exists already) and copies {@code sequenceFile} into it.
     *
     * @param zone the time zone of the stamp in the name
     */
    public static RunFolder createUnder(Path resultsDir, String name, Instant now, ZoneId zone, Path sequenceFile) {
        String base = safeName(name) + "-" + STAMP.format(now.atZone(zone));
        try {
            Files.createDirectories(resultsDir);
            for (int i = 1;; i++) {
                Path dir = resultsDir.resolve(i == 1 ? base : base + "-" + i);
                try {
                    Files.createDirectory(dir);
                } catch (java.nio.file.FileAlreadyExistsException e) {
                    continue;
                }
                return populate(dir, sequenceFile);
            }
        } catch (IOException e) {
            throw new InvalidInputException("cannot create a run folder under " + resultsDir + ": "
                    + FolderLock.reason(e));
        }
    }

    /**
     * Uses {@code dir} as a fresh run folder (created when missing) and copies
     * {@code sequenceFile} into it. Call with the folder's {@link FolderLock} held (see
     * {@link #lockAt}), so that two runs cannot both find it empty.
     *
     * @throws InvalidInputException when {@code dir} exists and is not an empty folder (its lock
     *     file aside), or cannot be created or written (nothing has been measured yet)
     */
    public static RunFolder createAt(Path dir, Path sequenceFile) {
        try {
            if (Files.exists(dir)) {
                if (!Files.isDirectory(dir)) {
                    throw new InvalidInputException(dir + ": exists and is not a folder");
                }
                try (Stream<Path> s = Files.list(dir)) {
                    if (s.anyMatch(p -> !FolderLock.isLockFile(p))) {
                        throw new InvalidInputException(dir + ": folder is not empty (use --resume " + dir
                                + " to continue a run, or choose another --out)");
                    }
                }
            }
            Files.createDirectories(dir);
            return populate(dir, sequenceFile);
        } catch (IOException e) {
            throw new InvalidInputException("cannot create run folder " + dir + ": " + FolderLock.reason(e));
        }
    }

    /**
     * Creates {@code dir} when missing and takes its {@link FolderLock}.
     *
     * @throws InvalidInputException when it cannot be created (permissions, a file in the way) or
     *     another run holds it (naming the holder)
     */
    public static FolderLock lockAt(Path dir, Instant now) {
        if (Files.exists(dir) && !Files.isDirectory(dir)) {
            throw new InvalidInputException(dir + ": exists and is not a folder");
        }
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new InvalidInputException("cannot create run folder " + dir + ": " + FolderLock.reason(e));
        }
        return FolderLock.acquire(dir, now);
    }

    /**
     * An existing run folder, for resuming.
     *
     * @throws InvalidInputException when {@code dir} lacks {@code run.json} or {@code sequence.yaml}
     */
    public static RunFolder existing(Path dir) {
        RunFolder f = new RunFolder(dir);
        if (!Files.isDirectory(dir)) {
            throw new InvalidInputException(dir + ": no such run folder");
        }
        if (!Files.isRegularFile(f.manifest())) {
            throw new InvalidInputException(dir + ": not a run folder (no " + RunManifest.FILE + ")");
        }
        if (!Files.isRegularFile(f.sequenceCopy())) {
            throw new InvalidInputException(dir + ": not a run folder (no " + SEQUENCE_COPY + ")");
        }
        return f;
    }

    /** The SHA-256 of {@code file}'s bytes, in lower-case hex. */
    public static String sha256(Path file) {
        try {
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            return HexFormat.of().formatHex(md.digest(Files.readAllBytes(file)));
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + file + ": " + e.getMessage(), e);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is missing from this Java runtime", e);
        }
    }

    private static RunFolder populate(Path dir, Path sequenceFile) throws IOException {
        RunFolder f = new RunFolder(dir);
        Files.copy(sequenceFile, f.sequenceCopy());
        return f;
    }

    private static String safeName(String name) {
        String s = name.replaceAll("[^A-Za-z0-9._-]+", "-");
        return s.isEmpty() ? "run" : s;
    }
}
