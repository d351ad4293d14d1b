package org.zweep.runner.export;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.ObjectWriter;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisJson;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.Sweep;
import org.zweep.runner.results.Csv;
import org.zweep.runner.results.Derived;
import org.zweep.runner.results.Json;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;

/**
 * Writes a run folder's data as CSV, JSON or Touchstone files. Blocking file I/O; stateless.
 */
public final class Exports {
    /** The columns of the CSV export, in order. */
    public static final List<String> CSV_COLUMNS = List.of("step", "repeat", "quantity", "wiring", "frequency_hz",
            "drive_mode", "level", "bias_mode", "bias", "r_ohm", "x_ohm", "z_ohm", "theta_deg", "cs_f", "cp_f", "ls_h",
            "lp_h", "rs_ohm", "rp_ohm", "d", "q", "ratio", "run_id", "serial", "lot", "verdict");

    private Exports() {
    }

    /**
     * Writes one Touchstone file per frequency sweep (step, level, bias, wiring; repeats averaged)
     * into {@code outDir}, named {@code <step>_<level>_<bias>[_<wiring>].s1p}, e.g.
     * {@code sweep_1V_0V.s1p}. Sweeps of a single frequency are skipped.
     *
     * @return the files written
     */
    public static List<Path> touchstone(RunData run, Path outDir, Touchstone.Version version, double referenceOhm) {
        List<Path> written = new ArrayList<>();
        for (Sweep s : Analysis.sweeps(run)) {
            if (s.frequencies() < 2) {
                continue;
            }
            List<String> comments = new ArrayList<>();
            comments.add("one-port impedance (Z) written by zweep, Touchstone " + version.label()
                    + (version == Touchstone.Version.V2_0 ? ", Z in ohms (not normalised)"
                            : ", Z normalised to R = " + referenceOhm + " ohm"));
            if (run.manifest().part() != null) {
                comments.add("part: " + run.manifest().part().name() + " (" + run.manifest().part().kind() + ")");
            }
            RunManifest.Identity id = run.manifest().identityOrNone();
            if (id.serial() != null || id.lot() != null) {
                comments.add("serial: " + orEmpty(id.serial()) + ", lot: " + orEmpty(id.lot()));
            }
            comments.add("step: " + s.step() + ", " + s.describe()
                    + (s.repeats() > 1 ? ", mean of " + s.repeats() + " repeats" : ""));
            comments.add("run: " + run.folder().dir().toAbsolutePath().normalize());
            String name = Sweep.fileStem(s.step()) + "_" + s.conditionLabel() + ".s1p";
            Path file = outDir.resolve(name);
            write(file, Touchstone.write(version, s.points(), comments, referenceOhm));
            written.add(file);
        }
        return written;
    }

    /** Writes every measured row (points with a value) as CSV to {@code file}, streamed from {@code points.csv}. */
    public static void csv(RunData run, Path file) {
        RunManifest m = run.manifest();
        RunManifest.Identity id = m.identityOrNone();
        // the same for every row: which run and part, and the run's verdict (empty when unknown)
        List<String> whose = List.of(orEmpty(m.id()), orEmpty(id.serial()), orEmpty(id.lot()), orEmpty(m.verdict()));
        try (Writer w = open(file)) {
            w.write(Csv.record(CSV_COLUMNS));
            w.write('\n');
            StringBuilder line = new StringBuilder(256);
            List<String> cells = new ArrayList<>(CSV_COLUMNS.size());
            run.forEachRow(r -> {
                if (!"ok".equals(r.status())) {
                    return;
                }
                cells.clear();
                cells.add(r.step());
                cells.add(String.valueOf(r.repeat()));
                cells.add(r.quantity());
                cells.add(r.wiring());
                cells.add(Csv.number(r.frequencyHz()));
                cells.add(r.driveMode());
                cells.add(Csv.number(r.level()));
                cells.add(r.biasMode());
                cells.add(Csv.number(r.bias()));
                cells.add(Csv.number(r.rOhm()));
                cells.add(Csv.number(r.xOhm()));
                for (String d : Derived.NAMES) {
                    cells.add(Csv.number(r.value(d)));
                }
                cells.add(Csv.number(r.ratio()));
                cells.addAll(whose);
                line.setLength(0);
                Csv.append(line, cells).append('\n');
                try {
                    w.append(line);
                } catch (IOException e) {
                    throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
                }
            });
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Writes the manifest, every measured row and the analysis as one JSON document to
     * {@code file} (format {@code zweep-export/1}, the names of {@code run.json},
     * {@code points.csv} and {@code analysis.json}); the rows are streamed from {@code points.csv}
     * into the file, never all held.
     */
    public static void json(RunData run, AnalysisResult analysis, Path file) {
        ObjectWriter json = Json.writer();
        try (Writer w = open(file); JsonGenerator g = json.createGenerator(w)) {
            g.writeStartObject();
            g.writeStringField("format", "zweep-export/1");
            g.writeFieldName("run");
            json.writeValue(g, run.manifest());
            g.writeArrayFieldStart("points");
            run.forEachRow(r -> {
                if (!"ok".equals(r.status())) {
                    return;
                }
                try {
                    json.writeValue(g, ExportPoint.of(r));
                } catch (IOException e) {
                    throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
                }
            });
            g.writeEndArray();
            g.writeFieldName("analysis");
            json.writeValue(g, AnalysisJson.document(analysis));
            g.writeEndObject();
            g.flush();
            w.write('\n');
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }

    /** One measured point of the JSON export: the columns of {@code points.csv} that hold values. */
    record ExportPoint(String step, int repeat, String quantity, String wiring, double frequencyHz, String driveMode,
            double level, String biasMode, double bias, double rOhm, double xOhm, double zOhm, double thetaDeg,
            double csF, double cpF, double lsH, double lpH, double rsOhm, double rpOhm, double d, double q,
            double ratio, String time) {
        static ExportPoint of(PointRow r) {
            Derived v = r.derived();
            return new ExportPoint(r.step(), r.repeat(), r.quantity(), r.wiring(), r.frequencyHz(), r.driveMode(),
                    r.level(), r.biasMode(), r.bias(), r.rOhm(), r.xOhm(), v.zOhm(), v.thetaDeg(), v.csF(), v.cpF(),
                    v.lsH(), v.lpH(), v.rsOhm(), v.rpOhm(), v.d(), v.q(), r.ratio(), r.time().toString());
        }
    }

    private static String orEmpty(String s) {
        return s == null ? "" : s;
    }

    private static Writer open(Path file) throws IOException {
        Path parent = file.toAbsolutePath().getParent();
        if (parent != null) {
            Files.createDirectories(parent);
        }
        return Files.newBufferedWriter(file, StandardCharsets.UTF_8);
    }

    private static void write(Path file, String text) {
        try {
            Path parent = file.toAbsolutePath().getParent();
            if (parent != null) {
                Files.createDirectories(parent);
            }
            Files.writeString(file, text, StandardCharsets.US_ASCII.newEncoder().canEncode(text)
                    ? StandardCharsets.US_ASCII : StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }
}
