package org.zweep.runner.export;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ObjectNode;
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
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;

/**
 * Writes a run folder's data as CSV, JSON or Touchstone files. Blocking file I/O; stateless.
 */
public final class Exports {
    /** The columns of the CSV export, in order. */
    public static final List<String> CSV_COLUMNS = List.of("step", "repeat", "quantity", "wiring", "frequency_hz",
            "drive", "level", "bias_mode", "bias", "r_ohm", "x_ohm", "z_ohm", "theta_deg", "cs_f", "cp_f", "ls_h",
            "lp_h", "rs_ohm", "rp_ohm", "d", "q", "ratio", "run_id", "serial", "lot", "verdict");

    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

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
                cells.add(r.drive());
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

    private static com.fasterxml.jackson.databind.JsonNode manifestTree(RunData run) {
        try {
            return JSON.readTree(run.manifest().toJson());
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException("run.json does not read back: " + e.getMessage(), e);
        }
    }

    /**
     * Writes the manifest, every measured row and the analysis as one JSON document to
     * {@code file}; the rows are streamed from {@code points.csv} into the file, never all held.
     */
    public static void json(RunData run, AnalysisResult analysis, Path file) {
        try (Writer w = open(file); JsonGenerator g = JSON.createGenerator(w)) {
            g.writeStartObject();
            g.writeStringField("format", "zweep-export/1");
            g.writeFieldName("run");
            g.writeTree(manifestTree(run)); // run.json's own snake_case keys
            g.writeArrayFieldStart("points");
            run.forEachRow(r -> {
                if (!"ok".equals(r.status())) {
                    return;
                }
                ObjectNode p = JSON.createObjectNode();
                p.put("step", r.step());
                p.put("repeat", r.repeat());
                p.put("quantity", r.quantity());
                p.put("wiring", r.wiring());
                put(p, "frequency_hz", r.frequencyHz());
                p.put("drive", r.drive());
                put(p, "level", r.level());
                p.put("bias_mode", r.biasMode());
                put(p, "bias", r.bias());
                put(p, "r_ohm", r.rOhm());
                put(p, "x_ohm", r.xOhm());
                for (String d : Derived.NAMES) {
                    put(p, d, r.value(d));
                }
                put(p, "ratio", r.ratio());
                p.put("time", r.time().toString());
                try {
                    g.writeTree(p);
                } catch (IOException e) {
                    throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
                }
            });
            g.writeEndArray();
            g.writeFieldName("analysis");
            g.writeTree(AnalysisJson.tree(analysis));
            g.writeEndObject();
            g.flush();
            w.write('\n');
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }

    private static void put(ObjectNode n, String key, double v) {
        if (Double.isFinite(v)) {
            n.put(key, v);
        } else {
            n.putNull(key);
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
