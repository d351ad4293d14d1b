package org.zweep.runner.analysis;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.PointsCsv;
import org.zweep.runner.results.PointsCsvReader;
import org.zweep.runner.results.RunFolder;
import org.zweep.runner.results.RunManifest;

/**
 * A run folder as the analysis sees it: the manifest and every complete row of {@code points.csv}.
 * Reading never changes the folder (a torn last line of a run still going, or one that died, is
 * skipped and noted, not cut off).
 *
 * @param folder the run folder
 * @param manifest its {@code run.json}
 * @param rows every complete row, in file order
 * @param notes what was skipped while reading, for people
 */
public record RunData(RunFolder folder, RunManifest manifest, List<PointRow> rows, List<String> notes) {
    public RunData {
        rows = List.copyOf(rows);
        notes = List.copyOf(notes);
    }

    /**
     * Reads the run folder {@code dir}.
     *
     * @throws InvalidInputException when {@code dir} is not a run folder or {@code points.csv} is
     *     malformed ({@code file:line: what})
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
        List<String> lines;
        try {
            lines = Files.readAllLines(points, StandardCharsets.UTF_8);
        } catch (java.nio.charset.MalformedInputException e) {
            throw new InvalidInputException(points + ": not UTF-8 text");
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + points + ": " + e.getMessage(), e);
        }
        if (lines.isEmpty() || !lines.get(0).equals(PointsCsv.HEADER)) {
            throw new InvalidInputException(points + ":1: expected the header " + PointsCsv.HEADER);
        }
        List<PointRow> rows = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        PointsCsvReader.UniquePoints unique = new PointsCsvReader.UniquePoints(points);
        for (int i = 1; i < lines.size(); i++) {
            String line = lines.get(i);
            if (line.isEmpty()) {
                continue;
            }
            PointRow row;
            try {
                row = PointsCsv.parse(line);
            } catch (IllegalArgumentException e) {
                if (i == lines.size() - 1) {
                    notes.add(points.getFileName() + ":" + (i + 1) + ": incomplete last row skipped");
                } else {
                    throw new InvalidInputException(points + ":" + (i + 1) + ": malformed row: " + e.getMessage());
                }
                continue;
            }
            unique.add(row.point(), i + 1);
            rows.add(row);
        }
        return new RunData(folder, manifest, rows, notes);
    }

    /**
     * This run, when it has at least one measured row.
     *
     * @throws InvalidInputException naming {@code points.csv} when it holds no row yet
     */
    public RunData requirePoints() {
        if (rows.isEmpty()) {
            throw new InvalidInputException(folder.points() + ": no measured point in the run folder yet");
        }
        return this;
    }

    /** The part kind from the manifest in lower case ({@code capacitor}, ...), or empty. */
    public String partKind() {
        return manifest.part() == null || manifest.part().kind() == null ? "" : manifest.part().kind();
    }
}
