package org.zweep.runner.analysis;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import org.zweep.runner.verdict.CheckOutcome;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;

/**
 * The {@code analysis.json} format ({@code zweep-analysis/1}), the contract scripts read; see
 * README "formats-analysis". Non-finite numbers are written as {@code null}.
 */
public final class AnalysisJson {
    /** The format tag. */
    public static final String FORMAT = "zweep-analysis/1";
    /** The file name in a run folder. */
    public static final String FILE = "analysis.json";

    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
    /** For values taken over from {@code run.json}, whose field names are snake_case there too. */
    private static final ObjectMapper SNAKE = JSON.copy().setPropertyNamingStrategy(PropertyNamingStrategies.SNAKE_CASE);

    private AnalysisJson() {
    }

    /** The analysis as a JSON tree. */
    public static ObjectNode tree(AnalysisResult a) {
        ObjectNode root = JSON.createObjectNode();
        root.put("format", FORMAT);
        root.put("run", a.run().folder().dir().toString());
        if (a.run().manifest().sequence() != null) {
            root.put("sequence", a.run().manifest().sequence().name());
        }
        root.set("part", SNAKE.valueToTree(a.run().manifest().part()));
        root.put("verdict", a.verdict());
        ArrayNode steps = root.putArray("steps");
        for (StepResult s : a.steps()) {
            steps.add(step(s));
        }
        root.set("transformer", a.transformer() == null ? null : transformer(a.transformer()));
        ArrayNode checks = root.putArray("checks");
        for (CheckOutcome c : a.checks()) {
            ObjectNode n = checks.addObject();
            n.put("name", c.name());
            n.put("parameter", c.parameter());
            n.put("step", c.step());
            num(n, "frequency_hz", c.frequencyHz());
            num(n, "bias", c.limit().selection().bias());
            num(n, "level", c.limit().selection().level());
            num(n, "drop_percent", c.limit().dropPercent());
            num(n, "min", c.min());
            num(n, "max", c.max());
            ArrayNode vs = n.putArray("values");
            c.values().forEach(v -> num(vs, v));
            n.put("result", c.result());
            n.put("rule", c.limit().rule().text());
            num(n, "expanded_u", c.expandedU());
            num(n, "probability", c.probability());
            if (!c.note().isEmpty()) {
                n.put("note", c.note());
            }
        }
        root.set("bins", a.bins() == null ? null : bins(a.bins()));
        notes(root, a.notes());
        return root;
    }

    /** The analysis as JSON text. */
    public static String text(AnalysisResult a) {
        try {
            return JSON.writeValueAsString(tree(a)) + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /** Writes {@code analysis.json} into the run folder and returns its path. */
    public static Path write(AnalysisResult a) {
        Path file = a.run().folder().dir().resolve(FILE);
        try {
            Files.writeString(file, text(a), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
        return file;
    }

    private static ObjectNode step(StepResult s) {
        ObjectNode n = JSON.createObjectNode();
        n.put("name", s.name());
        n.put("index", s.index());
        StepResult.SweepFit primary = s.primaryFit();
        if (primary != null) {
            fit(n, primary);
        } else {
            n.putNull("model");
            n.putNull("parameters");
            n.putNull("sigma");
            n.putNull("srf_hz");
            n.putNull("residual_rms");
        }
        ArrayNode fits = n.putArray("fits");
        for (StepResult.SweepFit f : s.fits()) {
            fit(fits.addObject(), f);
        }
        n.set("bias", s.derating().isEmpty() ? null : derating(s.derating().get(0)));
        ArrayNode groups = n.putArray("bias_groups");
        s.derating().forEach(d -> groups.add(derating(d)));
        ArrayNode repeats = n.putArray("repeats");
        for (RepeatStats r : s.repeats()) {
            ObjectNode o = repeats.addObject();
            num(o, "frequency_hz", r.frequencyHz());
            num(o, "level", r.level());
            num(o, "bias", r.bias());
            o.put("wiring", r.wiring());
            o.put("count", r.count());
            o.set("mean", map(r.mean()));
            o.set("std", map(r.std()));
            o.set("relative_spread", map(r.relativeSpread()));
        }
        notes(n, s.notes());
        return n;
    }

    private static void fit(ObjectNode n, StepResult.SweepFit sf) {
        CircuitFit f = sf.fit();
        Sweep s = sf.sweep();
        n.put("model", f.model().id());
        n.set("parameters", map(f.parameters()));
        n.set("sigma", map(f.sigma()));
        num(n, "srf_hz", f.srfHz() == null ? Double.NaN : f.srfHz());
        num(n, "srf_data_hz", f.srfDataHz() == null ? Double.NaN : f.srfDataHz());
        num(n, "u_srf_hz", f.srfHz() == null ? Double.NaN : f.srfU());
        num(n, "u_srf_data_hz", f.srfDataHz() == null ? Double.NaN : f.srfDataU());
        num(n, "residual_rms", f.residualRms());
        n.put("weighted", f.weighted());
        num(n, "reduced_chi_squared", f.reducedChiSquared());
        n.put("iterations", f.iterations());
        n.put("converged", f.converged());
        n.put("points", f.points());
        ObjectNode cond = n.putObject("conditions");
        cond.put("drive", s.drive());
        num(cond, "level", s.level());
        cond.put("bias_mode", s.biasMode());
        num(cond, "bias", s.bias());
        cond.put("wiring", s.wiring());
        notes(n, f.notes());
    }

    private static ObjectNode derating(Derating d) {
        ObjectNode n = JSON.createObjectNode();
        n.put("quantity", d.quantity());
        num(n, "frequency_hz", d.frequencyHz());
        n.put("bias_mode", d.biasMode());
        num(n, "reference_bias", d.referenceBias());
        num(n, "reference_value", d.referenceValue());
        ArrayNode pts = n.putArray("points");
        for (Derating.Point p : d.points()) {
            ObjectNode o = pts.addObject();
            num(o, "bias", p.bias());
            num(o, "value", p.value());
            num(o, "percent", p.percent());
        }
        ObjectNode drops = n.putObject("drop");
        d.drops().forEach((k, v) -> num(drops, String.valueOf(k), v == null ? Double.NaN : v));
        notes(n, d.notes());
        return n;
    }

    private static ObjectNode transformer(TransformerResult t) {
        ObjectNode n = JSON.createObjectNode();
        num(n, "turns_ratio", t.turnsRatio());
        num(n, "k", t.k());
        num(n, "leakage_h", t.leakageH());
        num(n, "mutual_h", t.mutualH());
        num(n, "magnetizing_h", t.magnetizingH());
        num(n, "open_circuit_h", t.openH());
        num(n, "short_circuit_h", t.shortH());
        num(n, "voltage_ratio", t.voltageRatio());
        num(n, "frequency_hz", t.frequencyHz());
        num(n, "u_turns_ratio", t.uTurnsRatio());
        num(n, "u_k", t.uK());
        num(n, "u_leakage_h", t.uLeakageH());
        num(n, "u_mutual_h", t.uMutualH());
        num(n, "u_open_circuit_h", t.uOpenH());
        notes(n, t.notes());
        return n;
    }

    private static ObjectNode bins(Bins b) {
        ObjectNode n = JSON.createObjectNode();
        num(n, "measured", b.measured());
        n.put("source", b.source());
        num(n, "nominal", b.nominal());
        n.put("unit", b.unit());
        num(n, "deviation_percent", b.deviationPercent());
        n.put("tolerance_letter", b.letter());
        if (b.withinTolerance() == null) {
            n.putNull("within_tolerance");
        } else {
            n.put("within_tolerance", b.withinTolerance());
        }
        num(n, "u_measured", b.measuredU());
        if (b.tolerance() != null) {
            n.put("tolerance_decision", b.tolerance().decision().word());
            n.put("tolerance_rule", b.tolerance().rule());
            num(n, "tolerance_expanded_u", b.tolerance().expandedU());
            num(n, "tolerance_probability", b.tolerance().probability());
        }
        n.set("nearest", map(b.nearest()));
        if (!b.versusChecks().isEmpty()) {
            n.put("versus_checks", b.versusChecks());
        }
        return n;
    }

    private static ObjectNode map(Map<String, Double> m) {
        ObjectNode n = JSON.createObjectNode();
        m.forEach((k, v) -> num(n, k, v == null ? Double.NaN : v));
        return n;
    }

    private static void notes(ObjectNode n, List<String> notes) {
        ArrayNode a = n.putArray("notes");
        notes.forEach(a::add);
    }

    private static void num(ObjectNode n, String key, double v) {
        if (Double.isFinite(v)) {
            n.put(key, v);
        } else {
            n.putNull(key);
        }
    }

    private static void num(ArrayNode n, double v) {
        if (Double.isFinite(v)) {
            n.add(v);
        } else {
            n.addNull();
        }
    }
}
