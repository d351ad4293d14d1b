package org.zweep.driver.dialect;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.EnumSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import org.snakeyaml.engine.v2.common.ScalarStyle;
import org.snakeyaml.engine.v2.nodes.ScalarNode;
import org.zweep.config.BoundedYaml;
import org.zweep.config.ConfigException;
import org.zweep.config.Schema;
import org.zweep.config.YamlNode;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.CorrectionStyle;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.Interval;
import org.zweep.driver.uncertainty.MeterAccuracy;

/**
 * Reads one dialect file (YAML, format {@code zweep-dialect/2}) and checks it; every problem names
 * {@code source:line:column}. The schema is data: one {@link Schema} per section.
 */
final class DialectReader {
    static final String FORMAT = "zweep-dialect/2";
    private static final Schema TOP = Schema.of("the dialect", "format", "meter", "capabilities", "messages",
            "reply", "correction", "timing", "commands", "fixture", "accuracy")
            .require("format", "meter", "capabilities", "commands");
    private static final Schema METER = Schema.of("section 'meter'", "name", "description").require("name");
    private static final Schema CAPABILITIES = Schema.of("section 'capabilities'", "frequency", "voltage-level",
            "current-level", "bias-voltage", "bias-current", "averaging", "integration-time", "impedance-range",
            "list-points", "voltage-ratio").require("frequency");
    private static final Schema MESSAGES = Schema.of("section 'messages'", "join", "replies", "error-query-after",
            "error-query-joined");
    private static final Schema REPLY = Schema.of("section 'reply'", "encoding", "fields", "list-encoding");
    private static final Schema CORRECTION = Schema.of("section 'correction'", "standards", "style",
            "list-acquisition").require("standards");
    private static final Schema TIMING = Schema.of("section 'timing'", "point-overhead", "min-periods",
            "bias-settle", "range-change", "correction-grid");
    private static final Schema FIXTURE = Schema.of("section 'fixture'", "part", "open", "short", "load",
            "secondary-open", "secondary-shorted", "settle");
    private static final Schema ACCURACY = Schema.of("section 'accuracy'", "distribution", "bands").require("bands");
    private static final Schema COMMANDS = new Schema("section 'commands'",
            java.util.Arrays.stream(Command.values()).map(Command::key).toList(), List.of("identify", "measure"));
    private static final Pattern NAME = Pattern.compile("[a-z0-9][a-z0-9-]*");
    private static final Interval NONE = new Interval(0, 0);

    /** One {@code key: value} scalar; lines and columns are 1-based. */
    private record Entry(String key, String value, int line, int keyColumn, int valueColumn) {
    }

    private final String source;
    private final String text;
    /** Section reply's {@code list-encoding}, when given (checked against the commands). */
    private Entry listEncodingEntry;

    DialectReader(String source, String text) {
        this.source = source;
        this.text = text;
    }

    Dialect read() {
        try {
            return readChecked();
        } catch (InvalidInputException e) {
            throw e;
        } catch (org.zweep.config.YamlSyntaxException e) {
            // a command such as *IDN? written bare is read by YAML as an alias
            boolean alias = e.problem() != null && e.problem().contains("undefined alias");
            throw new InvalidInputException(e.getMessage() + (alias
                    ? " (write commands in quotes: identify: '*IDN?'; a bare '*' starts a YAML alias)" : ""), e);
        } catch (ConfigException e) {
            throw new InvalidInputException(e.getMessage(), e);
        }
    }

    private Dialect readChecked() {
        YamlNode root = BoundedYaml.composeOne(text, source, "dialect file").orElseThrow(() ->
                new InvalidInputException(source + ":1:1: empty file: expected a dialect (a mapping with format, "
                        + "meter, capabilities and commands)"));
        YamlNode.YamlMap top = root.map(TOP);
        YamlNode format = top.required("format");
        if (!format.text("the format").equals(FORMAT)) {
            throw format.error("expected format '" + FORMAT + "', got '" + format.text("the format") + "'");
        }
        Map<String, Entry> meter = entries(top.required("meter"), METER);
        Entry nameEntry = meter.get("name");
        if (!NAME.matcher(nameEntry.value).matches()) {
            throw fail(nameEntry.line, nameEntry.valueColumn,
                    "dialect name '" + nameEntry.value + "' must be lower-case letters, digits and '-'");
        }
        Entry description = meter.get("description");

        YamlNode capsNode = top.required("capabilities");
        Map<String, Entry> caps = entries(capsNode, CAPABILITIES);
        Interval frequency = interval(caps.get("frequency"), "Hz", true);
        Interval voltage = optionalInterval(caps, "voltage-level", "V", true);
        Interval current = optionalInterval(caps, "current-level", "A", true);
        Interval biasV = optionalInterval(caps, "bias-voltage", "V", false);
        Interval biasA = optionalInterval(caps, "bias-current", "A", false);
        Interval averaging = caps.containsKey("averaging") ? countInterval(caps.get("averaging")) : new Interval(1, 1);
        Interval integration = optionalInterval(caps, "integration-time", "s", true);
        Interval impedanceRange = optionalInterval(caps, "impedance-range", "ohm", true);
        int listPoints = caps.containsKey("list-points") ? nonNegativeInt(caps.get("list-points")) : 0;
        boolean ratio = caps.containsKey("voltage-ratio") && yesNo(caps.get("voltage-ratio"));

        Map<String, Entry> messages = top.optional("messages").map(n -> entries(n, MESSAGES)).orElse(Map.of());
        boolean join = !messages.containsKey("join") || yesNo(messages.get("join"));
        Dialect.ReplyFraming framing = messages.containsKey("replies")
                ? word(messages.get("replies"), Dialect.ReplyFraming.values(), Dialect.ReplyFraming::word)
                : Dialect.ReplyFraming.SEMICOLON_JOINED;
        Dialect.ErrorCheck errorCheck = messages.containsKey("error-query-after")
                ? word(messages.get("error-query-after"), Dialect.ErrorCheck.values(), Dialect.ErrorCheck::word)
                : Dialect.ErrorCheck.SETTINGS;
        boolean errorJoined = messages.containsKey("error-query-joined") && yesNo(messages.get("error-query-joined"));
        if (errorJoined && !join) {
            Entry e = messages.get("error-query-joined");
            throw fail(e.line, e.valueColumn, "error-query-joined: yes needs join: yes");
        }
        if (errorJoined && errorCheck == Dialect.ErrorCheck.NONE) {
            Entry e = messages.get("error-query-joined");
            throw fail(e.line, e.valueColumn, "error-query-joined: yes needs an error query (error-query-after is none)");
        }

        ReplyShape reply = top.optional("reply").map(this::reply)
                .orElse(new ReplyShape(ReplyShape.Encoding.ASCII, List.of(ReplyShape.Field.REAL, ReplyShape.Field.IMAG)));

        Set<CorrectionStandard> corrections = EnumSet.noneOf(CorrectionStandard.class);
        CorrectionStyle style = CorrectionStyle.WHOLE_RANGE;
        boolean listAcquisition = false;
        Entry listAcquisitionKey = null;
        YamlNode correctionNode = top.optional("correction").orElse(null);
        Entry correctionKey = null;
        if (correctionNode != null) {
            YamlNode.YamlMap c = correctionNode.map(CORRECTION);
            corrections = corrections(c.required("standards"));
            Map<String, Entry> ce = scalars(c, "style", "list-acquisition");
            if (ce.containsKey("style")) {
                style = word(ce.get("style"), CorrectionStyle.values(), DialectReader::styleWord);
            }
            if (ce.containsKey("list-acquisition")) {
                listAcquisition = yesNo(ce.get("list-acquisition"));
                listAcquisitionKey = ce.get("list-acquisition");
                if (listAcquisition && style != CorrectionStyle.AT_ACQUIRED_FREQUENCY) {
                    throw fail(listAcquisitionKey.line, listAcquisitionKey.valueColumn,
                            "list-acquisition: yes needs style: at-acquired-frequency (a meter correcting its whole"
                            + " range acquires each standard once)");
                }
            }
            correctionKey = keyEntry(top, "correction");
        }

        MeterTiming timing = timing(top.optional("timing").map(n -> entries(n, TIMING)).orElse(Map.of()));
        YamlNode commandsNode = top.required("commands");
        Map<Command, Template> commands = commands(commandsNode, join);
        Map<String, Entry> cmdEntries = entries(commandsNode, COMMANDS);

        requireFor(commands, caps.get("voltage-level"), Command.DRIVE_VOLTAGE);
        requireFor(commands, caps.get("current-level"), Command.DRIVE_CURRENT);
        requireFor(commands, caps.get("bias-voltage"), Command.BIAS_VOLTAGE, Command.BIAS_VOLTAGE_ON,
                Command.BIAS_VOLTAGE_OFF, Command.BIAS_OFF);
        requireFor(commands, caps.get("bias-current"), Command.BIAS_CURRENT, Command.BIAS_CURRENT_ON,
                Command.BIAS_CURRENT_OFF, Command.BIAS_OFF);
        requireFor(commands, caps.get("averaging"), Command.AVERAGING);
        requireFor(commands, caps.get("integration-time"), Command.INTEGRATION_TIME);
        requireFor(commands, caps.get("impedance-range"), Command.RANGE_AUTO, Command.RANGE_HOLD);
        requireFor(commands, caps.get("frequency"), Command.FREQUENCY);
        if (listPoints > 0) {
            requireFor(commands, caps.get("list-points"), Command.LIST_FREQUENCY, Command.LIST_MEASURE);
        }
        if (listEncodingEntry != null && reply.listsSwitchEncoding()) {
            requireFor(commands, listEncodingEntry, Command.LIST_FORMAT, Command.POINT_FORMAT);
        }
        if (ratio) {
            requireFor(commands, caps.get("voltage-ratio"), Command.FUNCTION_IMPEDANCE,
                    Command.FUNCTION_VOLTAGE_RATIO);
        }
        if (errorCheck != Dialect.ErrorCheck.NONE && !commands.containsKey(Command.ERROR_QUERY)) {
            Entry e = messages.get("error-query-after");
            if (e == null) {
                throw fail(commandsNode.line(), commandsNode.column(), "section 'commands' has no 'error-query':"
                        + " give the meter's error query, or say 'error-query-after: none' in section 'messages'");
            }
            throw fail(e.line, e.valueColumn, "error-query-after: " + e.value
                    + " needs the command 'error-query' in section 'commands'");
        }
        if (!corrections.isEmpty()) {
            requireFor(commands, correctionKey, Command.CORRECTION_ON, Command.CORRECTION_OFF);
            for (CorrectionStandard s : corrections) {
                requireFor(commands, correctionKey, Command.acquiring(s));
                if (listAcquisition) {
                    requireFor(commands, listAcquisitionKey, Command.acquiringList(s));
                }
            }
            if (corrections.contains(CorrectionStandard.LOAD)) {
                requireFor(commands, correctionKey, Command.LOAD_STANDARD);
            }
        }
        rejectUnneeded(cmdEntries, "current-level", caps, Command.DRIVE_CURRENT, Command.LIST_CURRENT,
                Command.LIMIT_CURRENT_LEVEL_MIN, Command.LIMIT_CURRENT_LEVEL_MAX);
        rejectUnneeded(cmdEntries, "voltage-level", caps, Command.DRIVE_VOLTAGE, Command.LIST_VOLTAGE,
                Command.LIMIT_VOLTAGE_LEVEL_MIN, Command.LIMIT_VOLTAGE_LEVEL_MAX);
        rejectUnneeded(cmdEntries, "bias-voltage", caps, Command.BIAS_VOLTAGE, Command.BIAS_VOLTAGE_ON,
                Command.BIAS_VOLTAGE_OFF, Command.LIST_BIAS_VOLTAGE);
        rejectUnneeded(cmdEntries, "bias-current", caps, Command.BIAS_CURRENT, Command.BIAS_CURRENT_ON,
                Command.BIAS_CURRENT_OFF, Command.LIST_BIAS_CURRENT);
        rejectUnneeded(cmdEntries, "averaging", caps, Command.AVERAGING);
        rejectUnneeded(cmdEntries, "integration-time", caps, Command.INTEGRATION_TIME);
        rejectUnneeded(cmdEntries, "impedance-range", caps, Command.RANGE_AUTO, Command.RANGE_HOLD);
        if (listPoints == 0) {
            rejectUnneeded(cmdEntries, "list-points", Map.of(), Command.LIST_FREQUENCY, Command.LIST_VOLTAGE,
                    Command.LIST_CURRENT, Command.LIST_BIAS_VOLTAGE, Command.LIST_BIAS_CURRENT,
                    Command.LIST_MODE_ON, Command.LIST_MODE_OFF, Command.LIST_MEASURE);
        }
        if (!ratio) {
            rejectUnneeded(cmdEntries, "voltage-ratio", Map.of(), Command.FUNCTION_VOLTAGE_RATIO);
        }
        for (CorrectionStandard s : CorrectionStandard.values()) {
            if (!corrections.contains(s)) {
                rejectUnneededCorrection(cmdEntries, Command.acquiring(s));
            }
            if (!corrections.contains(s) || !listAcquisition) {
                rejectUnneededListCorrection(cmdEntries, Command.acquiringList(s));
            }
        }
        if (!corrections.contains(CorrectionStandard.LOAD)) {
            rejectUnneededCorrection(cmdEntries, Command.LOAD_STANDARD);
        }
        if (corrections.isEmpty()) {
            rejectUnneededCorrection(cmdEntries, Command.CORRECTION_ON);
            rejectUnneededCorrection(cmdEntries, Command.CORRECTION_OFF);
        }

        Map<FixtureState, Template> fixture = new EnumMap<>(FixtureState.class);
        double fixtureSettleS = 0;
        if (top.has("fixture")) {
            Map<String, Entry> fe = entries(top.required("fixture"), FIXTURE);
            for (Entry e : fe.values()) {
                if (e.key.equals("settle")) {
                    fixtureSettleS = seconds(e);
                    continue;
                }
                FixtureState state = FixtureState.valueOf(e.key.toUpperCase(java.util.Locale.ROOT).replace('-', '_'));
                Template t = Template.parse(e.value, e.key, List.of(), (index, message) -> fail(e.line, e.valueColumn + index,
                        message));
                if (!join && t.compound()) {
                    throw fail(e.line, e.valueColumn, "'" + e.key + "' joins commands with ';' but join is no");
                }
                fixture.put(state, t);
            }
            if (fixture.isEmpty()) {
                YamlNode f = top.required("fixture");
                throw fail(f.line(), f.column(), "section 'fixture' names no state (part, open, short, load, "
                        + "secondary-open, secondary-shorted)");
            }
        }

        MeterCapabilities capabilities = new MeterCapabilities(frequency, voltage, current, biasV, biasA,
                listPoints, corrections, ratio, style);
        MeterAccuracy accuracy = top.optional("accuracy").map(this::accuracy).orElse(null);
        return new Dialect(nameEntry.value, description == null ? "" : description.value, source, capabilities,
                averaging, integration, impedanceRange,
                new Dialect.Messages(join, framing, errorCheck, errorJoined), listAcquisition, reply, timing,
                commands, fixture, fixtureSettleS, accuracy);
    }

    private static String styleWord(CorrectionStyle s) {
        return s == CorrectionStyle.WHOLE_RANGE ? "whole-range" : "at-acquired-frequency";
    }

    /** The mapping {@code node} read against {@code schema}, each value a scalar entry. */
    private Map<String, Entry> entries(YamlNode node, Schema schema) {
        YamlNode.YamlMap m = node.map(schema);
        return scalars(m, schema.keys().toArray(new String[0]));
    }

    /** The scalar entries of {@code m} among {@code keys}. */
    private Map<String, Entry> scalars(YamlNode.YamlMap m, String... keys) {
        Map<String, Entry> out = new LinkedHashMap<>();
        for (Map.Entry<String, YamlNode> kv : m.values().entrySet()) {
            if (!List.of(keys).contains(kv.getKey())) {
                continue;
            }
            YamlNode key = m.keys().get(kv.getKey());
            YamlNode value = m.required(kv.getKey());
            String what = "a value for '" + kv.getKey() + "'";
            value.text(what);
            ScalarNode scalar = (ScalarNode) value.node();
            boolean quoted = scalar.getScalarStyle() == ScalarStyle.SINGLE_QUOTED
                    || scalar.getScalarStyle() == ScalarStyle.DOUBLE_QUOTED;
            out.put(kv.getKey(), new Entry(kv.getKey(), scalar.getValue().strip(), value.line(), key.column(),
                    value.column() + (quoted ? 1 : 0)));
        }
        return out;
    }

    /** The entry of a key itself (for messages about a whole section). */
    private static Entry keyEntry(YamlNode.YamlMap m, String key) {
        YamlNode k = m.keys().get(key);
        return new Entry(key, key, k.line(), k.column(), k.column());
    }

    private <T extends Enum<T>> T word(Entry e, T[] values, java.util.function.Function<T, String> word) {
        for (T v : values) {
            if (word.apply(v).equals(e.value)) {
                return v;
            }
        }
        List<String> words = java.util.Arrays.stream(values).map(word).toList();
        throw fail(e.line, e.valueColumn, "unknown " + e.key + " '" + e.value + "'"
                + org.zweep.config.Suggest.didYouMean(e.value, words) + "; expected one of: " + String.join(", ", words));
    }

    private Set<CorrectionStandard> corrections(YamlNode node) {
        Set<CorrectionStandard> set = EnumSet.noneOf(CorrectionStandard.class);
        for (YamlNode item : node.items("a list of correction standards such as [open, short]")) {
            String t = item.text("a correction standard");
            CorrectionStandard s = switch (t) {
                case "open" -> CorrectionStandard.OPEN;
                case "short" -> CorrectionStandard.SHORT;
                case "load" -> CorrectionStandard.LOAD;
                default -> throw item.error("unknown correction standard '" + t + "'"
                        + org.zweep.config.Suggest.didYouMean(t, List.of("open", "short", "load"))
                        + "; expected open, short or load");
            };
            if (!set.add(s)) {
                throw item.error("correction standard '" + t + "' is listed twice");
            }
        }
        return set;
    }

    private ReplyShape reply(YamlNode node) {
        YamlNode.YamlMap m = node.map(REPLY);
        ReplyShape.Encoding encoding = ReplyShape.Encoding.ASCII;
        Map<String, Entry> e = scalars(m, "encoding", "list-encoding");
        if (e.containsKey("encoding")) {
            encoding = word(e.get("encoding"), ReplyShape.Encoding.values(), x -> x.word);
        }
        ReplyShape.Encoding listEncoding = encoding;
        if (e.containsKey("list-encoding")) {
            listEncodingEntry = e.get("list-encoding");
            listEncoding = word(listEncodingEntry, ReplyShape.Encoding.values(), x -> x.word);
        }
        List<ReplyShape.Field> fields = new ArrayList<>();
        if (!m.has("fields")) {
            fields.add(ReplyShape.Field.REAL);
            fields.add(ReplyShape.Field.IMAG);
            return new ReplyShape(encoding, fields, listEncoding);
        }
        YamlNode list = m.required("fields");
        List<String> words = java.util.Arrays.stream(ReplyShape.Field.values()).map(x -> x.word).toList();
        for (YamlNode item : list.items("a list of reply fields such as [real, imag]")) {
            String t = item.text("a reply field");
            ReplyShape.Field field = null;
            for (ReplyShape.Field x : ReplyShape.Field.values()) {
                if (x.word.equals(t)) {
                    field = x;
                }
            }
            if (field == null) {
                throw item.error("unknown field '" + t + "'" + org.zweep.config.Suggest.didYouMean(t, words)
                        + "; expected real, imag, magnitude, phase-deg, phase-rad or skip");
            }
            if (field != ReplyShape.Field.SKIP && fields.contains(field)) {
                throw item.error("field '" + t + "' is listed twice");
            }
            fields.add(field);
        }
        boolean cartesian = fields.contains(ReplyShape.Field.REAL) && fields.contains(ReplyShape.Field.IMAG);
        long phases = fields.stream()
                .filter(x -> x == ReplyShape.Field.PHASE_DEG || x == ReplyShape.Field.PHASE_RAD).count();
        boolean polar = fields.contains(ReplyShape.Field.MAGNITUDE) && phases == 1;
        boolean mixed = (fields.contains(ReplyShape.Field.REAL) || fields.contains(ReplyShape.Field.IMAG))
                && (fields.contains(ReplyShape.Field.MAGNITUDE) || phases > 0);
        if (mixed || cartesian == polar) {
            throw list.error("fields must hold either real and imag, or magnitude and one of phase-deg, phase-rad");
        }
        return new ReplyShape(encoding, fields, listEncoding);
    }

    /**
     * Section {@code accuracy}: {@code distribution: rectangular | normal-k2} and {@code bands}, a
     * mapping of band names to {@code F1 .. F2 Hz; L1 .. L2 V|A; T s; A %; ZS ohm; YO S[; phase P rad|deg]}.
     */
    private MeterAccuracy accuracy(YamlNode node) {
        YamlNode.YamlMap m = node.map(ACCURACY);
        MeterAccuracy.Distribution distribution = MeterAccuracy.Distribution.RECTANGULAR;
        Map<String, Entry> e = scalars(m, "distribution");
        Entry d = e.get("distribution");
        if (d != null) {
            distribution = MeterAccuracy.Distribution.byWord(d.value).orElseThrow(() -> fail(d.line, d.valueColumn,
                    "unknown distribution '" + d.value + "' (expected rectangular or normal-k2)"));
        }
        YamlNode bandsNode = m.required("bands");
        if (!bandsNode.isMap()) {
            throw bandsNode.error("expected the bands (a mapping of band names to rows), got " + bandsNode.shape());
        }
        List<String> names = new ArrayList<>();
        for (org.snakeyaml.engine.v2.nodes.NodeTuple t
                : ((org.snakeyaml.engine.v2.nodes.MappingNode) bandsNode.node()).getValue()) {
            names.add(new YamlNode(t.getKeyNode(), source).text("a band name"));
        }
        Map<String, Entry> rows = entries(bandsNode, new Schema("the accuracy bands", names, List.of()));
        List<MeterAccuracy.Band> bands = new ArrayList<>();
        for (Entry row : rows.values()) {
            bands.add(band(row));
        }
        if (bands.isEmpty()) {
            throw bandsNode.error("section 'accuracy' must have at least one band ('NAME: F1 .. F2 Hz; ...')");
        }
        return new MeterAccuracy(bands, distribution);
    }

    private Map<Command, Template> commands(YamlNode node, boolean join) {
        Map<Command, Template> map = new EnumMap<>(Command.class);
        for (Entry e : entries(node, COMMANDS).values()) {
            Command c = Command.byKey(e.key).orElseThrow();
            Template t = Template.parse(e.value, c, (index, message) -> fail(e.line, e.valueColumn + index, message));
            if (!join && t.compound()) {
                throw fail(e.line, e.valueColumn, "'" + e.key + "' joins commands with ';' but join is no"
                        + " in section 'messages'");
            }
            map.put(c, t);
        }
        return map;
    }

    private void requireFor(Map<Command, Template> commands, Entry capability, Command... needed) {
        if (capability == null) {
            return;
        }
        for (Command c : needed) {
            if (!commands.containsKey(c)) {
                throw fail(capability.line, capability.keyColumn,
                        "'" + capability.key + "' needs the command '" + c.key() + "' in section 'commands'");
            }
        }
    }

    private void rejectUnneeded(Map<String, Entry> cmdEntries, String capability, Map<String, Entry> caps,
            Command... commands) {
        if (caps.containsKey(capability)) {
            return;
        }
        for (Command c : commands) {
            Entry e = cmdEntries.get(c.key());
            if (e != null) {
                throw fail(e.line, e.keyColumn, "command '" + c.key() + "' needs the capability '" + capability
                        + "' in section 'capabilities'");
            }
        }
    }

    private void rejectUnneededCorrection(Map<String, Entry> cmdEntries, Command c) {
        Entry e = cmdEntries.get(c.key());
        if (e != null) {
            throw fail(e.line, e.keyColumn, "command '" + c.key() + "' needs its standard in 'standards' of"
                    + " section 'correction'");
        }
    }

    private void rejectUnneededListCorrection(Map<String, Entry> cmdEntries, Command c) {
        Entry e = cmdEntries.get(c.key());
        if (e != null) {
            throw fail(e.line, e.keyColumn, "command '" + c.key() + "' needs 'list-acquisition: yes' and its"
                    + " standard in 'standards' of section 'correction'");
        }
    }

    private Interval optionalInterval(Map<String, Entry> caps, String key, String unit, boolean positive) {
        return caps.containsKey(key) ? interval(caps.get(key), unit, positive) : NONE;
    }

    /** {@code MIN .. MAX UNIT}, plain decimal numbers in the SI unit without a prefix. */
    private Interval interval(Entry e, String unit, boolean positive) {
        List<int[]> spans = tokens(e.value);
        String shape = "'" + e.key + ": MIN .. MAX " + unit + "'";
        if (spans.size() != 4 || !token(e, spans, 1).equals("..")) {
            throw fail(e.line, e.valueColumn, "expected " + shape);
        }
        double min = number(e, spans, 0);
        double max = number(e, spans, 2);
        String u = token(e, spans, 3);
        if (!u.equals(unit)) {
            throw fail(e.line, column(e, spans, 3), "unit must be " + unit + ", found '" + u + "'");
        }
        if (max < min) {
            throw fail(e.line, column(e, spans, 2), "maximum " + token(e, spans, 2) + " is below minimum "
                    + token(e, spans, 0));
        }
        if (positive && min <= 0) {
            throw fail(e.line, column(e, spans, 0), e.key + " must be positive, found " + token(e, spans, 0));
        }
        return new Interval(min, max);
    }

    /** The {@code [timing]} section; a missing key takes {@link MeterTiming#DEFAULT}'s value. */
    private MeterTiming timing(Map<String, Entry> section) {
        MeterTiming d = MeterTiming.DEFAULT;
        double overhead = section.containsKey("point-overhead") ? seconds(section.get("point-overhead"))
                : d.pointOverheadS();
        double periods = d.minPeriods();
        if (section.containsKey("min-periods")) {
            Entry e = section.get("min-periods");
            List<int[]> spans = tokens(e.value);
            if (spans.size() != 1) {
                throw fail(e.line, e.valueColumn, "expected one number for 'min-periods'");
            }
            periods = number(e, spans, 0);
            if (periods < 0) {
                throw fail(e.line, e.valueColumn, "min-periods must be 0 or more, found " + token(e, spans, 0));
            }
        }
        double settle = section.containsKey("bias-settle") ? seconds(section.get("bias-settle")) : d.biasSettleS();
        double range = section.containsKey("range-change") ? seconds(section.get("range-change")) : d.rangeChangeS();
        int grid = d.correctionPointsPerDecade();
        if (section.containsKey("correction-grid")) {
            Entry e = section.get("correction-grid");
            List<int[]> spans = tokens(e.value);
            if (spans.size() != 3 || !token(e, spans, 1).equals("per") || !token(e, spans, 2).equals("decade")) {
                throw fail(e.line, e.valueColumn, "expected 'correction-grid: N per decade'");
            }
            grid = integer(e, spans, 0);
            if (grid < 1) {
                throw fail(e.line, e.valueColumn, "correction-grid must be 1 or more points per decade, found " + grid);
            }
        }
        return new MeterTiming(overhead, periods, settle, range, grid);
    }

    /** {@code N s}: a plain decimal number of seconds, not negative. */
    private double seconds(Entry e) {
        List<int[]> spans = tokens(e.value);
        if (spans.size() != 2 || !token(e, spans, 1).equals("s")) {
            throw fail(e.line, e.valueColumn, "expected '" + e.key + ": SECONDS s'");
        }
        double v = number(e, spans, 0);
        if (v < 0) {
            throw fail(e.line, e.valueColumn, e.key + " must be 0 s or more, found " + token(e, spans, 0));
        }
        return v;
    }

    private Interval countInterval(Entry e) {
        List<int[]> spans = tokens(e.value);
        if (spans.size() != 3 || !token(e, spans, 1).equals("..")) {
            throw fail(e.line, e.valueColumn, "expected 'averaging: MIN .. MAX' (whole numbers)");
        }
        int min = integer(e, spans, 0);
        int max = integer(e, spans, 2);
        if (min < 1) {
            throw fail(e.line, column(e, spans, 0), "averaging must start at 1 or more, found " + min);
        }
        if (max < min) {
            throw fail(e.line, column(e, spans, 2), "maximum " + max + " is below minimum " + min);
        }
        return new Interval(min, max);
    }

    private int nonNegativeInt(Entry e) {
        List<int[]> spans = tokens(e.value);
        if (spans.size() != 1) {
            throw fail(e.line, e.valueColumn, "expected one whole number for '" + e.key + "'");
        }
        int v = integer(e, spans, 0);
        if (v < 0) {
            throw fail(e.line, e.valueColumn, e.key + " must be 0 or more, found " + v);
        }
        return v;
    }

    private boolean yesNo(Entry e) {
        return switch (e.value) {
            case "yes", "true" -> true;
            case "no", "false" -> false;
            default -> throw fail(e.line, e.valueColumn, e.key + " must be yes or no, found '" + e.value + "'");
        };
    }

    private static final String BAND_SHAPE =
            "'NAME: F1 .. F2 Hz; L1 .. L2 V; T s; A %; ZS ohm; YO S' and optionally '; phase P rad' (or deg)";

    private MeterAccuracy.Band band(Entry e) {
        String[] parts = e.value.split(";", -1);
        if (parts.length != 6 && parts.length != 7) {
            throw fail(e.line, e.valueColumn, "expected " + BAND_SHAPE);
        }
        int[] offsets = new int[parts.length];
        for (int i = 1; i < parts.length; i++) {
            offsets[i] = offsets[i - 1] + parts[i - 1].length() + 1;
        }
        Entry f = sub(e, parts[0], offsets[0]);
        Interval freq = interval(f, "Hz", true);
        Entry l = sub(e, parts[1], offsets[1]);
        List<int[]> ls = tokens(l.value);
        boolean current = ls.size() == 4 && token(l, ls, 3).equals("A");
        Interval level = interval(l, current ? "A" : "V", true);
        double t = quantity(sub(e, parts[2], offsets[2]), "s");
        double a = quantity(sub(e, parts[3], offsets[3]), "%") / 100;
        double zs = quantity(sub(e, parts[4], offsets[4]), "ohm");
        double yo = quantity(sub(e, parts[5], offsets[5]), "S");
        double phase = Double.NaN;
        if (parts.length == 7) {
            Entry p = sub(e, parts[6], offsets[6]);
            List<int[]> ps = tokens(p.value);
            if (ps.size() != 3 || !token(p, ps, 0).equals("phase")
                    || !(token(p, ps, 2).equals("rad") || token(p, ps, 2).equals("deg"))) {
                throw fail(p.line, p.valueColumn, "expected 'phase P rad' or 'phase P deg'");
            }
            phase = number(p, ps, 1);
            if (token(p, ps, 2).equals("deg")) {
                phase = Math.toRadians(phase);
            }
        }
        try {
            return new MeterAccuracy.Band(e.key, freq.min(), freq.max(), level.min(),
                    level.max(), current, t, a, zs, yo, phase);
        } catch (InvalidInputException ex) {
            throw fail(e.line, e.valueColumn, ex.getMessage());
        }
    }

    /** A part of an entry's value as an entry of its own, keeping its columns. */
    private static Entry sub(Entry e, String part, int offset) {
        int lead = firstNonBlank(part);
        return new Entry(e.key, part.strip(), e.line, e.keyColumn, e.valueColumn + offset + lead);
    }

    /** {@code NUMBER UNIT}, the number plain decimal and not negative. */
    private double quantity(Entry e, String unit) {
        List<int[]> spans = tokens(e.value);
        if (spans.size() != 2 || !token(e, spans, 1).equals(unit)) {
            throw fail(e.line, e.valueColumn, "expected 'NUMBER " + unit + "' in " + BAND_SHAPE);
        }
        double v = number(e, spans, 0);
        if (v < 0) {
            throw fail(e.line, e.valueColumn, "'" + token(e, spans, 0) + "' must not be negative");
        }
        return v;
    }

    /** White-space separated tokens of {@code s} as [start, end) index pairs. */
    private static List<int[]> tokens(String s) {
        List<int[]> spans = new ArrayList<>();
        int i = 0;
        while (i < s.length()) {
            while (i < s.length() && Character.isWhitespace(s.charAt(i))) {
                i++;
            }
            int start = i;
            while (i < s.length() && !Character.isWhitespace(s.charAt(i))) {
                i++;
            }
            if (i > start) {
                spans.add(new int[] {start, i});
            }
        }
        return spans;
    }

    private static String token(Entry e, List<int[]> spans, int i) {
        return e.value.substring(spans.get(i)[0], spans.get(i)[1]);
    }

    private static int column(Entry e, List<int[]> spans, int i) {
        return e.valueColumn + spans.get(i)[0];
    }

    private static final Pattern DECIMAL = Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");

    private double number(Entry e, List<int[]> spans, int i) {
        String t = token(e, spans, i);
        if (!DECIMAL.matcher(t).matches()) {
            throw fail(e.line, column(e, spans, i), "'" + t + "' is not a number (write plain decimals such as 10e6)");
        }
        return Double.parseDouble(t);
    }

    private int integer(Entry e, List<int[]> spans, int i) {
        String t = token(e, spans, i);
        try {
            return Integer.parseInt(t);
        } catch (NumberFormatException ex) {
            throw fail(e.line, column(e, spans, i), "'" + t + "' is not a whole number");
        }
    }

    private static int firstNonBlank(String s) {
        int i = 0;
        while (i < s.length() && Character.isWhitespace(s.charAt(i))) {
            i++;
        }
        return i;
    }

    private InvalidInputException fail(int line, int column, String message) {
        return new InvalidInputException(source + ":" + line + (column > 0 ? ":" + column : "") + ": " + message);
    }
}
