package org.zweep.runner.analysis;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import java.util.function.Consumer;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.PartKind;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.PointsCsv;
import org.zweep.runner.results.PointsCsvReader;
import org.zweep.runner.results.RunFolder;
import org.zweep.runner.results.RunManifest;

/**
 * A run folder as the analysis sees it: the manifest, and the rows of {@code points.csv} streamed
 * from the file each time they are asked for ({@link #forEachRow}), never all held, so a run of
 * millions of points is read in a small heap. Reading never changes the folder: a torn last line
 * of a run still going, or one that died, is skipped and noted (the one rule of
 * {@link PointsCsvReader}), not cut off.
 *
 * @param folder the run folder
 * @param manifest its {@code run.json}
 */
public record RunData(RunFolder folder, RunManifest manifest) {
    public RunData {
        Objects.requireNonNull(folder, "folder");
        Objects.requireNonNull(manifest, "manifest");
    }

    /**
     * Reads the manifest of the run folder {@code dir} and checks that {@code points.csv} is there
     * with its header.
     *
     * @throws InvalidInputException when {@code dir} is not a run folder or {@code points.csv} does
     *     not begin with the header ({@code file:line: what})
     */
    public static RunData read(Path dir) {
        if (!Files.isDirectory(dir)) {
            throw new InvalidInputException(dir + ": no such run folder");
        }
        RunFolder folder = new RunFolder(dir);
        RunManifest manifest = RunManifest.read(folder.manifest());
        Path points = folder.points();
        if (!Files.isRegularFile(points)) {
            throw new InvalidInputException(dir + ": not a run folder (no " + RunFolder.POINTS + ")");
        }
        RunData run = new RunData(folder, manifest);
        try (PointsCsvReader r = PointsCsvReader.open(points)) {
            r.next();
            if (!r.hasHeader()) {
                throw new InvalidInputException(points + ":1: expected the header " + PointsCsv.HEADER);
            }
        }
        return run;
    }

    /**
     * Gives every complete row of {@code points.csv}, in file order, to {@code sink}, reading the
     * file afresh.
     *
     * @return what was skipped while reading, for people (a torn last row)
     * @throws InvalidInputException when {@code points.csv} is malformed ({@code file:line: what})
     */
    public List<String> forEachRow(Consumer<PointRow> sink) {
        try (PointsCsvReader r = PointsCsvReader.open(folder.points())) {
            for (PointRow row = r.next(); row != null; row = r.next()) {
                sink.accept(row);
            }
            return r.notes();
        }
    }

    /**
     * This run, when it has at least one measured row.
     *
     * @throws InvalidInputException naming {@code points.csv} when it holds no row yet
     */
    public RunData requirePoints() {
        try (PointsCsvReader r = PointsCsvReader.open(folder.points())) {
            if (r.next() == null) {
                throw new InvalidInputException(folder.points() + ": no measured point in the run folder yet");
            }
        }
        return this;
    }

    /** The part kind the manifest names ({@code capacitor}, ... in any case); null when it names none zweep knows. */
    public PartKind partKind() {
        return PartKind.ofWord(partKindWord().toLowerCase(Locale.ROOT)).orElse(null);
    }

    /** The part kind as the manifest spells it, or empty. */
    String partKindWord() {
        return manifest.part() == null || manifest.part().kind() == null ? "" : manifest.part().kind();
    }
}
