package org.zweep.runner.results;

import com.fasterxml.jackson.annotation.JsonPropertyOrder;
import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonMappingException;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.List;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.plan.CheckLimit;

/**
 * The {@code run.json} manifest of a run folder (format {@code zweep-run/1}): what was run, on
 * which meter, with what compensation and software, when, and how it ended. Numbers that do not
 * apply are {@code null}. Instants are ISO-8601 strings.
 *
 * @param format always {@link #FORMAT}
 * @param sequence the sequence and its copy in the folder
 * @param part the component under test
 * @param steps the steps and their point counts
 * @param checks the pass/fail limits
 * @param meter the meter used
 * @param compensation the fixture compensation used
 * @param software the program that wrote the folder
 * @param host the computer's name
 * @param seed the simulator's noise seed; {@code null} on a real meter
 * @param started when the run started
 * @param ended when the run ended; {@code null} while running or after a crash
 * @param counts planned and measured points
 * @param outcome {@code running}, {@code completed}, {@code aborted} or {@code failed}
 * @param verdict {@code pass}, {@code fail} or {@code none}
 * @param id the run's globally unique, time-sortable id ({@link RunId}); {@code null} in folders
 *     written before ids existed (unknown)
 * @param identity which part was measured, where and by whom; {@code null} when unknown
 * @param index whether the run is added to the results index when it ends ({@code false}: started
 *     with {@code --no-index}, and a resume without {@code --index} keeps to that); {@code null} in
 *     folders written before this was recorded (indexed)
 */
@JsonPropertyOrder({"format", "id", "sequence", "part", "identity", "steps", "checks", "meter", "compensation",
        "software", "host", "seed", "started", "ended", "counts", "outcome", "verdict", "index"})
public record RunManifest(String format, SequenceInfo sequence, PartInfo part, List<StepInfo> steps,
        List<CheckInfo> checks, MeterInfo meter, CompensationInfo compensation, SoftwareInfo software, String host,
        Long seed, String started, String ended, Counts counts, String outcome, String verdict, String id,
        Identity identity, Boolean index) {

    /** A manifest built field by field; unset fields are null ({@link #FORMAT} for the format). */
    public static Builder builder() {
        return new Builder();
    }

    /** A builder holding this manifest's fields, to change some of them. */
    public Builder toBuilder() {
        Builder b = new Builder();
        b.format = format;
        b.sequence = sequence;
        b.part = part;
        b.steps = steps;
        b.checks = checks;
        b.meter = meter;
        b.compensation = compensation;
        b.software = software;
        b.host = host;
        b.seed = seed;
        b.started = started;
        b.ended = ended;
        b.counts = counts;
        b.outcome = outcome;
        b.verdict = verdict;
        b.id = id;
        b.identity = identity;
        b.index = index;
        return b;
    }

    /** Builds a {@link RunManifest} by field name instead of by position; not thread-safe. */
    public static final class Builder {
        private String format = FORMAT;
        private SequenceInfo sequence;
        private PartInfo part;
        private List<StepInfo> steps;
        private List<CheckInfo> checks;
        private MeterInfo meter;
        private CompensationInfo compensation;
        private SoftwareInfo software;
        private String host;
        private Long seed;
        private String started;
        private String ended;
        private Counts counts;
        private String outcome;
        private String verdict;
        private String id;
        private Identity identity;
        private Boolean index;

        private Builder() {
        }

        /** The format tag. */
        public Builder format(String v) {
            format = v;
            return this;
        }

        /** The sequence run. */
        public Builder sequence(SequenceInfo v) {
            sequence = v;
            return this;
        }

        /** The component under test. */
        public Builder part(PartInfo v) {
            part = v;
            return this;
        }

        /** The steps. */
        public Builder steps(List<StepInfo> v) {
            steps = v;
            return this;
        }

        /** The checks. */
        public Builder checks(List<CheckInfo> v) {
            checks = v;
            return this;
        }

        /** The meter. */
        public Builder meter(MeterInfo v) {
            meter = v;
            return this;
        }

        /** The compensation. */
        public Builder compensation(CompensationInfo v) {
            compensation = v;
            return this;
        }

        /** The program that wrote the folder. */
        public Builder software(SoftwareInfo v) {
            software = v;
            return this;
        }

        /** The computer's name. */
        public Builder host(String v) {
            host = v;
            return this;
        }

        /** The simulator's seed, null on a real meter. */
        public Builder seed(Long v) {
            seed = v;
            return this;
        }

        /** When the run started (ISO-8601). */
        public Builder started(String v) {
            started = v;
            return this;
        }

        /** When it ended (ISO-8601), null while running. */
        public Builder ended(String v) {
            ended = v;
            return this;
        }

        /** Planned and measured points. */
        public Builder counts(Counts v) {
            counts = v;
            return this;
        }

        /** {@code running}, {@code completed}, {@code aborted} or {@code failed}. */
        public Builder outcome(String v) {
            outcome = v;
            return this;
        }

        /** {@code pass}, {@code fail} or {@code none}. */
        public Builder verdict(String v) {
            verdict = v;
            return this;
        }

        /** The run's id. */
        public Builder id(String v) {
            id = v;
            return this;
        }

        /** Who and what was measured. */
        public Builder identity(Identity v) {
            identity = v;
            return this;
        }

        /** Whether the run is indexed when it ends; {@code null} when not recorded. */
        public Builder index(Boolean v) {
            index = v;
            return this;
        }

        /** The manifest. */
        public RunManifest build() {
            return new RunManifest(format, sequence, part, steps, checks, meter, compensation, software, host, seed,
                    started, ended, counts, outcome, verdict, id, identity, index);
        }
    }

    /**
     * Which part was measured, where and by whom; each field {@code null} when not given.
     *
     * @param serial the part's serial number
     * @param lot the lot (batch) it belongs to
     * @param operator who measured it
     * @param station the test station's name
     */
    public record Identity(String serial, String lot, String operator, String station) {
        /** Nothing known. */
        public static final Identity NONE = new Identity(null, null, null, null);
    }

    /** The format tag this class reads and writes. */
    public static final String FORMAT = "zweep-run/1";
    /** The manifest's file name in a run folder. */
    public static final String FILE = "run.json";


    /**
     * The sequence run.
     *
     * @param name its name
     * @param file the original path
     * @param sha256 the SHA-256 of its bytes, in lower-case hex
     * @param copy the copy's name inside the folder ({@code sequence.yaml})
     */
    public record SequenceInfo(String name, String file, String sha256, String copy) {
    }

    /**
     * The component under test.
     *
     * @param kind {@code capacitor}, {@code inductor}, {@code resistor} or {@code transformer}
     * @param name its label
     * @param nominal the nominal value in {@code unit}
     * @param unit {@code F}, {@code H} or {@code Ω}
     * @param tolerancePercent the tolerance in percent, or {@code null}
     * @param turnsRatio a transformer's nominal turns ratio, or {@code null}
     */
    public record PartInfo(String kind, String name, Double nominal, String unit, Double tolerancePercent,
            Double turnsRatio) {
    }

    /**
     * One step: its index, name and number of planned points, and the derating drops (whole
     * percentages) it asks for; {@code null} for the defaults.
     */
    public record StepInfo(int index, String name, int points, List<Integer> deratingDrops) {
        /** A step with the default derating drops. */
        public StepInfo(int index, String name, int points) {
            this(index, name, points, null);
        }
    }

    /**
     * One check; {@code min}/{@code max} {@code null} when unbounded, {@code frequencyHz}
     * {@code null} for whole-sweep figures such as {@code srf_hz}; {@code bias}/{@code level}
     * {@code null} when the check selects any; {@code dropPercent} only for {@code saturation}.
     */
    public record CheckInfo(String name, String parameter, String step, Double frequencyHz, Double min, Double max,
            Double bias, Double level, Double dropPercent, String rule, String result, Double expandedU,
            Double probability) {

        /** Before it is judged. */
        public CheckInfo(String name, String parameter, String step, Double frequencyHz, Double min, Double max,
                Double bias, Double level, Double dropPercent, String rule) {
            this(name, parameter, step, frequencyHz, min, max, bias, level, dropPercent, rule, null, null, null);
        }

        /**
         * This check with its outcome: the decision ({@code pass}, {@code conditional pass},
         * {@code conditional fail}, {@code fail}, {@code not evaluated}), the expanded uncertainty U
         * (k = 2) and the probability of conformance of the value that decided it (null when unknown).
         */
        public CheckInfo judged(String newResult, double newExpandedU, double newProbability) {
            return new CheckInfo(name, parameter, step, frequencyHz, min, max, bias, level, dropPercent, rule,
                    newResult, finite(newExpandedU), finite(newProbability));
        }

        /** A check at one frequency (or a whole-sweep one), any bias and level, under the simple rule. */
        public CheckInfo(String name, String parameter, String step, Double frequencyHz, Double min, Double max) {
            this(name, parameter, step, frequencyHz, min, max, null, null, null, null);
        }

        /** Under the simple rule. */
        public CheckInfo(String name, String parameter, String step, Double frequencyHz, Double min, Double max,
                Double bias, Double level, Double dropPercent) {
            this(name, parameter, step, frequencyHz, min, max, bias, level, dropPercent, null);
        }

        /** The record of {@code c}. */
        public static CheckInfo of(CheckLimit c) {
            return new CheckInfo(c.name(), c.parameter(), c.step(), finite(c.frequencyHz()), finite(c.min()),
                    finite(c.max()), finite(c.selection().bias()), finite(c.selection().level()),
                    finite(c.dropPercent()), c.rule().text());
        }

        /** The check this records. */
        public CheckLimit toLimit() {
            return new CheckLimit(name, parameter, step,
                    new CheckLimit.Selection(nan(frequencyHz), nan(bias), nan(level)),
                    new CheckLimit.Bounds(min == null ? Double.NEGATIVE_INFINITY : min,
                            max == null ? Double.POSITIVE_INFINITY : max),
                    nan(dropPercent), rule == null ? org.zweep.runner.conformance.DecisionRule.SIMPLE
                            : org.zweep.runner.conformance.DecisionRule.parse(rule));
        }

        private static Double finite(double v) {
            return Double.isFinite(v) ? v : null;
        }

        private static double nan(Double v) {
            return v == null ? Double.NaN : v;
        }
    }

    /** The meter: address, dialect and its {@code *IDN?} identity. */
    public record MeterInfo(String address, String dialect, String identity) {
    }

    /**
     * The compensation used.
     *
     * @param mode {@code none}, {@code meter} or {@code host}
     * @param standards the standards, e.g. {@code ["OPEN","SHORT"]}
     * @param data the host-side data file, relative to the folder when inside it; {@code null} otherwise
     * @param openOverRangeHz the frequencies where the OPEN read beyond the meter's range (its
     *     admittance taken as 0); {@code null} when none
     * @param source {@code measured} (for this run) or {@code reused} (stored data of an earlier
     *     run); {@code null} without compensation or when unknown (older folders)
     * @param reusedFrom the file the reused data was copied from (absolute); {@code null} unless reused
     * @param measuredAt when the standards were measured (ISO-8601); {@code null} when unknown
     * @param load the load standard's stated value and standard uncertainty (an error common to every
     *     corrected point, which a fit must treat as common); {@code null} without LOAD or in older folders
     */
    public record CompensationInfo(String mode, List<String> standards, String data, List<Double> openOverRangeHz,
            String source, String reusedFrom, String measuredAt, LoadStandard load) {
        /** A compensation record with the OPEN readable everywhere. */
        public CompensationInfo(String mode, List<String> standards, String data) {
            this(mode, standards, data, null);
        }

        /** A compensation record whose origin is unknown. */
        public CompensationInfo(String mode, List<String> standards, String data, List<Double> openOverRangeHz) {
            this(mode, standards, data, openOverRangeHz, null, null, null, null);
        }

        /** This record saying where the data came from. */
        public CompensationInfo from(String newSource, String newReusedFrom, String newMeasuredAt) {
            return new CompensationInfo(mode, standards, data, openOverRangeHz, newSource, newReusedFrom,
                    newMeasuredAt, load);
        }

        /** This record with the load standard as stated ({@code null}: none). */
        public CompensationInfo withLoad(org.zweep.driver.uncertainty.UncertainImpedance stated) {
            return new CompensationInfo(mode, standards, data, openOverRangeHz, source, reusedFrom, measuredAt,
                    stated == null ? null : new LoadStandard(stated.value().resistanceOhm(),
                            stated.value().reactanceOhm(), stated.uROhm(), stated.uXOhm(), stated.correlation()));
        }
    }

    /**
     * The load standard as the sequence states it.
     *
     * @param rOhm its resistance, Ω
     * @param xOhm its reactance, Ω
     * @param uROhm the standard uncertainty of R, Ω
     * @param uXOhm the standard uncertainty of X, Ω
     * @param correlation r(R, X)
     */
    public record LoadStandard(double rOhm, double xOhm, double uROhm, double uXOhm, double correlation) {
        /** As an uncertain impedance (its frequency NaN: the value is held constant). */
        public org.zweep.driver.uncertainty.UncertainImpedance stated() {
            return new org.zweep.driver.uncertainty.UncertainImpedance(
                    new org.zweep.driver.impedance.Impedance(Double.NaN, rOhm, xOhm), uROhm, uXOhm, correlation);
        }
    }

    /** The program that wrote the folder. */
    public record SoftwareInfo(String name, String version) {
    }

    /** Planned and measured point counts. */
    public record Counts(int planned, int measured) {
    }

    /** This manifest with a new outcome, end time, counts and verdict. */
    public RunManifest finished(String newOutcome, String newEnded, Counts newCounts, String newVerdict) {
        return toBuilder().outcome(newOutcome).ended(newEnded).counts(newCounts).verdict(newVerdict).build();
    }

    /** This manifest with each check's outcome (same order as {@link #checks()}). */
    public RunManifest withChecks(List<CheckInfo> judged) {
        return toBuilder().checks(List.copyOf(judged)).build();
    }

    /** This manifest with another meter and compensation record (after a resume reconnects). */
    public RunManifest withMeter(MeterInfo newMeter) {
        return toBuilder().meter(newMeter).build();
    }

    /** This manifest with another compensation record. */
    public RunManifest withCompensation(CompensationInfo newCompensation) {
        return toBuilder().compensation(newCompensation).build();
    }

    /** This manifest with another run id and identity. */
    public RunManifest identified(String newId, Identity newIdentity) {
        return toBuilder().id(newId).identity(newIdentity).build();
    }

    /** The identity, {@link Identity#NONE} when unknown. */
    public Identity identityOrNone() {
        return identity == null ? Identity.NONE : identity;
    }

    /**
     * This manifest, when it holds what resuming a run needs: the sequence (file and SHA-256),
     * the meter (address and dialect) and the counts.
     *
     * @param file where it was read from, for the message
     * @throws InvalidInputException naming the first missing field
     */
    public RunManifest requireResumable(Path file) {
        String missing = sequence == null ? "sequence" : sequence.file() == null ? "sequence.file"
                : sequence.sha256() == null ? "sequence.sha256"
                : meter == null ? "meter" : meter.address() == null ? "meter.address"
                : meter.dialect() == null ? "meter.dialect" : counts == null ? "counts" : null;
        if (missing != null) {
            throw new InvalidInputException(file + ": not a valid run manifest: \"" + missing
                    + "\" is missing (a run folder's run.json records it when the run starts); cannot resume");
        }
        return this;
    }

    /** The manifest as JSON text. */
    public String toJson() {
        try {
            return Json.writer().writeValueAsString(this);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot write run.json: " + e.getMessage(), e);
        }
    }

    /**
     * Writes the manifest to {@code file} atomically: to a temporary file in the same folder,
     * synced, then moved over the old one, so a crash leaves either the old or the new manifest.
     */
    public void write(Path file) {
        Path tmp = file.resolveSibling(file.getFileName() + ".tmp");
        try {
            try (FileChannel ch = FileChannel.open(tmp, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                    StandardOpenOption.TRUNCATE_EXISTING)) {
                ByteBuffer b = ByteBuffer.wrap((toJson() + "\n").getBytes(StandardCharsets.UTF_8));
                while (b.hasRemaining()) {
                    ch.write(b);
                }
                ch.force(true);
            }
            try {
                Files.move(tmp, file, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING);
            }
        } catch (IOException e) {
            try {
                Files.deleteIfExists(tmp);
            } catch (IOException ignored) {
                // the failure below is what the user must see
            }
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Reads a manifest.
     *
     * @throws InvalidInputException when the file is missing, not JSON or not {@link #FORMAT}
     */
    public static RunManifest read(Path file) {
        if (!Files.isRegularFile(file)) {
            throw new InvalidInputException(file + ": no run manifest here (is this a run folder?)");
        }
        RunManifest m;
        try {
            m = Json.reader().forType(RunManifest.class).readValue(file.toFile());
        } catch (JsonProcessingException e) {
            throw new InvalidInputException(problem(file, e), e);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + file + ": " + e.getMessage(), e);
        }
        if (!FORMAT.equals(m.format())) {
            throw new InvalidInputException(file + ": format is " + m.format() + ", expected " + FORMAT);
        }
        return m;
    }

    /**
     * {@code file:line:column: not a valid run manifest: what} (the field's path first when the
     * value is the problem), from the parser's own location rather than its message, which names
     * no position once the source is redacted.
     */
    static String problem(Path file, JsonProcessingException e) {
        JsonLocation loc = e.getLocation();
        String at = loc == null || loc.getLineNr() < 1 ? file + ": "
                : file + ":" + loc.getLineNr() + ":" + loc.getColumnNr() + ": ";
        String what = e.getOriginalMessage();
        int nl = what.indexOf('\n');
        if (nl >= 0) {
            what = what.substring(0, nl);
        }
        if (e instanceof JsonMappingException m && !m.getPath().isEmpty()) {
            StringBuilder path = new StringBuilder();
            for (JsonMappingException.Reference r : m.getPath()) {
                if (r.getFieldName() != null) {
                    path.append(path.length() == 0 ? "" : ".").append(r.getFieldName());
                } else if (r.getIndex() >= 0) {
                    path.append('[').append(r.getIndex()).append(']');
                }
            }
            what = path + ": " + what;
        }
        return at + "not a valid run manifest: " + what;
    }
}
