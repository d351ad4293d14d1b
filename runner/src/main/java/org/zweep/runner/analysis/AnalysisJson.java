package org.zweep.runner.analysis;

import com.fasterxml.jackson.annotation.JsonInclude;
import com.fasterxml.jackson.annotation.JsonUnwrapped;
import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.zweep.runner.results.Json;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.verdict.CheckOutcome;

/**
 * The {@code analysis.json} format ({@code zweep-analysis/1}), the contract scripts read; see
 * README "formats-analysis". The document is a tree of records ({@link Document}) written by
 * the one JSON configuration ({@link Json}: snake_case names, non-finite numbers as {@code null}).
 */
public final class AnalysisJson {
    /** The format tag. */
    public static final String FORMAT = "zweep-analysis/1";
    /** The file name in a run folder. */
    public static final String FILE = "analysis.json";

    private AnalysisJson() {
    }

    /** The analysis as the records of its JSON document. */
    public static Document document(AnalysisResult a) {
        RunManifest m = a.run().manifest();
        return new Document(FORMAT, a.run().folder().dir().toString(),
                m.sequence() == null ? null : m.sequence().name(), m.part(), a.verdict(),
                a.steps().stream().map(AnalysisJson::step).toList(),
                a.transformer() == null ? null : transformer(a.transformer()),
                a.checks().stream().map(AnalysisJson::check).toList(),
                a.bins() == null ? null : bins(a.bins()), a.notes());
    }

    /** The analysis as a JSON tree. */
    public static JsonNode tree(AnalysisResult a) {
        return Json.tree(document(a));
    }

    /** The analysis as JSON text. */
    public static String text(AnalysisResult a) {
        return Json.text(document(a));
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

    /**
     * The whole document.
     *
     * @param sequence the sequence's name; left out when the manifest has none
     */
    public record Document(String format, String run, @JsonInclude(JsonInclude.Include.NON_NULL) String sequence,
            RunManifest.PartInfo part, String verdict, List<Step> steps, Transformer transformer, List<Check> checks,
            BinsDocument bins, List<String> notes) {
    }

    /** One step: its first fit's figures inline (all null without a fit), every fit, bias sweeps, repeats. */
    public record Step(String name, int index, @JsonUnwrapped FitFigures primary, List<Fit> fits, DeratingDocument bias,
            List<DeratingDocument> biasGroups, List<Repeat> repeats, List<String> notes) {
    }

    /** One fit with its notes. */
    public record Fit(@JsonUnwrapped FitFigures figures, List<String> notes) {
    }

    /** What a fit found, and the sweep's conditions. */
    public record FitFigures(String model, Map<String, Double> parameters, Map<String, Double> sigma, Double srfHz,
            Double srfDataHz, Double uSrfHz, Double uSrfDataHz, Double residualRms, Boolean weighted,
            Double reducedChiSquared, Integer iterations, Boolean converged, Integer points, Conditions conditions) {
        /** A step without a fit. */
        static final FitFigures NONE = new FitFigures(null, null, null, null, null, null, null, null, null, null, null,
                null, null, null);
    }

    /** A sweep's drive, bias and wiring. */
    public record Conditions(String driveMode, double level, String biasMode, double bias, String wiring) {
    }

    /** A bias sweep of the part's main value. */
    public record DeratingDocument(String quantity, double frequencyHz, String biasMode, double referenceBias,
            double referenceValue, List<Derating.Point> points, Map<String, Double> drop, List<String> notes,
            Map<String, Double> dropU) {
    }

    /** The spread of the repeats of one point. */
    public record Repeat(double frequencyHz, double level, double bias, String wiring, int count,
            Map<String, Double> mean, Map<String, Double> std, Map<String, Double> relativeSpread) {
    }

    /** Transformer figures and their uncertainties. */
    public record Transformer(double turnsRatio, double k, double leakageH, double mutualH, double magnetizingH,
            double openCircuitH, double shortCircuitH, double voltageRatio, double frequencyHz, double uTurnsRatio,
            double uK, double uLeakageH, double uMutualH, double uOpenCircuitH, List<String> notes) {
    }

    /**
     * One check and its outcome.
     *
     * @param note left out when empty
     */
    public record Check(String name, String parameter, String step, double frequencyHz, double bias, double level,
            double dropPercent, double min, double max, List<Double> values, String result, String rule,
            double expandedU, double probability, @JsonInclude(JsonInclude.Include.NON_EMPTY) String note) {
    }

    /**
     * The measured value against the nominal.
     *
     * @param toleranceDecision and the three after it: left out without a stated tolerance
     * @param versusChecks left out when empty
     */
    public record BinsDocument(double measured, String source, double nominal, String unit, double deviationPercent,
            String toleranceLetter, Boolean withinTolerance, double uMeasured,
            @JsonInclude(JsonInclude.Include.NON_NULL) String toleranceDecision,
            @JsonInclude(JsonInclude.Include.NON_NULL) String toleranceRule,
            @JsonInclude(JsonInclude.Include.NON_NULL) Double toleranceExpandedU,
            @JsonInclude(JsonInclude.Include.NON_NULL) Double toleranceProbability,
            Map<String, Double> nearest, @JsonInclude(JsonInclude.Include.NON_EMPTY) String versusChecks) {
    }

    private static Step step(StepResult s) {
        StepResult.SweepFit primary = s.primaryFit();
        return new Step(s.name(), s.index(), primary == null ? FitFigures.NONE : figures(primary),
                s.fits().stream().map(f -> new Fit(figures(f), f.fit().notes())).toList(),
                s.derating().isEmpty() ? null : derating(s.derating().get(0)),
                s.derating().stream().map(AnalysisJson::derating).toList(),
                s.repeats().stream().map(r -> new Repeat(r.frequencyHz(), r.level(), r.bias(), r.wiring(), r.count(),
                        r.mean(), r.std(), r.relativeSpread())).toList(),
                s.notes());
    }

    private static FitFigures figures(StepResult.SweepFit sf) {
        CircuitFit f = sf.fit();
        Sweep s = sf.sweep();
        return new FitFigures(f.model().id(), f.parameters(), f.sigma(), f.srfHz(), f.srfDataHz(),
                f.srfHz() == null ? null : f.srfU(), f.srfDataHz() == null ? null : f.srfDataU(), f.residualRms(),
                f.weighted(), f.reducedChiSquared(), f.iterations(), f.converged(), f.points(),
                new Conditions(s.driveMode(), s.level(), s.biasMode(), s.bias(), s.wiring()));
    }

    private static DeratingDocument derating(Derating d) {
        Map<String, Double> drop = new LinkedHashMap<>();
        d.drops().forEach((k, v) -> drop.put(String.valueOf(k), v));
        Map<String, Double> dropU = new LinkedHashMap<>();
        d.dropsU().forEach((k, v) -> dropU.put(String.valueOf(k), v));
        return new DeratingDocument(d.quantity(), d.frequencyHz(), d.biasMode(), d.referenceBias(), d.referenceValue(),
                d.points(), drop, d.notes(), dropU);
    }

    private static Transformer transformer(TransformerResult t) {
        return new Transformer(t.turnsRatio(), t.k(), t.leakageH(), t.mutualH(), t.magnetizingH(), t.openH(),
                t.shortH(), t.voltageRatio(), t.frequencyHz(), t.uTurnsRatio(), t.uK(), t.uLeakageH(), t.uMutualH(),
                t.uOpenH(), t.notes());
    }

    private static Check check(CheckOutcome c) {
        return new Check(c.name(), c.parameter(), c.step(), c.frequencyHz(), c.limit().selection().bias(),
                c.limit().selection().level(), c.limit().dropPercent(), c.min(), c.max(), c.values(), c.result(),
                c.limit().rule().text(), c.expandedU(), c.probability(), c.note());
    }

    private static BinsDocument bins(Bins b) {
        boolean t = b.tolerance() != null;
        return new BinsDocument(b.measured(), b.source(), b.nominal(), b.unit(), b.deviationPercent(), b.letter(),
                b.withinTolerance(), b.measuredU(), t ? b.tolerance().decision().word() : null,
                t ? b.tolerance().rule() : null, t ? b.tolerance().expandedU() : null,
                t ? b.tolerance().probability() : null, b.nearest(), b.versusChecks());
    }
}
