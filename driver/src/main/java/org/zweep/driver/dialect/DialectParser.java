package org.zweep.driver.dialect;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.EnumSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.Range;
import org.zweep.driver.uncertainty.MeterAccuracy;

/** Reads the text of one dialect file and checks it; every problem names {@code source:line:column}. */
final class DialectParser {
    private static final String HEADER = "zweep-dialect 1";
    private static final List<String> SECTIONS = List.of("meter", "capabilities", "reply", "commands", "accuracy");
    private static final Pattern KEY = Pattern.compile("[a-z][a-z0-9-]*");
    private static final Pattern NAME = Pattern.compile("[a-z0-9][a-z0-9-]*");
    private static final Range NONE = new Range(0, 0);

    /** One {@code key = value} line; columns are 1-based. */
    private record Entry(String key, String value, int line, int keyColumn, int valueColumn) {
    }

    private final String source;
    private final String text;
    private final Map<String, Map<String, Entry>> sections = new LinkedHashMap<>();
    private final Map<String, Integer> sectionLines = new LinkedHashMap<>();
    private int lastLine;

    DialectParser(String source, String text) {
        this.source = source;
        this.text = text;
    }

    Dialect parse() {
        readLines();
        for (String s : List.of("meter", "capabilities", "commands")) {
            if (!sections.containsKey(s)) {
                throw fail(lastLine, 0, "end of file: missing section [" + s + "]");
            }
        }
        rejectUnknownKeys();
        Map<String, Entry> meter = sections.get("meter");
        Entry nameEntry = required(meter, "meter", "name");
        if (!NAME.matcher(nameEntry.value).matches()) {
            throw fail(nameEntry.line, nameEntry.valueColumn,
                    "dialect name '" + nameEntry.value + "' must be lower-case letters, digits and '-'");
        }
        Entry description = meter.get("description");

        Map<String, Entry> caps = sections.get("capabilities");
        Range frequency = range(required(caps, "capabilities", "frequency"), "Hz", true);
        Range voltage = optionalRange(caps, "voltage-level", "V", true);
        Range current = optionalRange(caps, "current-level", "A", true);
        Range biasV = optionalRange(caps, "bias-voltage", "V", false);
        Range biasA = optionalRange(caps, "bias-current", "A", false);
        Range averaging = caps.containsKey("averaging") ? countRange(caps.get("averaging")) : new Range(1, 1);
        Range integration = optionalRange(caps, "integration-time", "s", true);
        Range impedanceRange = optionalRange(caps, "impedance-range", "ohm", true);
        int listPoints = caps.containsKey("list-points") ? nonNegativeInt(caps.get("list-points")) : 0;
        Set<CorrectionStandard> corrections = caps.containsKey("corrections")
                ? corrections(caps.get("corrections")) : EnumSet.noneOf(CorrectionStandard.class);
        boolean ratio = caps.containsKey("voltage-ratio") && yesNo(caps.get("voltage-ratio"));
        boolean compound = !caps.containsKey("compound-messages") || yesNo(caps.get("compound-messages"));
        boolean append = caps.containsKey("append-error-query") && yesNo(caps.get("append-error-query"));
        if (voltage == NONE && current == NONE) {
            throw fail(sectionLines.get("capabilities"), 0,
                    "[capabilities] must declare voltage-level or current-level (or both)");
        }
        if (append && !compound) {
            Entry e = caps.get("append-error-query");
            throw fail(e.line, e.valueColumn, "append-error-query = yes needs compound-messages = yes");
        }

        ReplyShape reply = reply(sections.getOrDefault("reply", Map.of()));
        Map<Command, Template> commands = commands(sections.get("commands"), compound);

        requireFor(commands, caps.get("frequency"), Command.FREQUENCY);
        requireFor(commands, caps.get("voltage-level"), Command.DRIVE_VOLTAGE);
        requireFor(commands, caps.get("current-level"), Command.DRIVE_CURRENT);
        requireFor(commands, caps.get("bias-voltage"), Command.BIAS_VOLTAGE, Command.BIAS_VOLTAGE_ON,
                Command.BIAS_VOLTAGE_OFF);
        requireFor(commands, caps.get("bias-current"), Command.BIAS_CURRENT, Command.BIAS_CURRENT_ON,
                Command.BIAS_CURRENT_OFF);
        requireFor(commands, caps.get("averaging"), Command.AVERAGING);
        requireFor(commands, caps.get("integration-time"), Command.INTEGRATION_TIME);
        requireFor(commands, caps.get("impedance-range"), Command.RANGE_AUTO, Command.RANGE_HOLD);
        if (listPoints > 0) {
            requireFor(commands, caps.get("list-points"), Command.LIST_FREQUENCY, Command.LIST_MEASURE);
        }
        if (ratio) {
            requireFor(commands, caps.get("voltage-ratio"), Command.FUNCTION_IMPEDANCE,
                    Command.FUNCTION_VOLTAGE_RATIO);
        }
        if (append) {
            requireFor(commands, caps.get("append-error-query"), Command.ERROR_QUERY);
        }
        if (!corrections.isEmpty()) {
            Entry e = caps.get("corrections");
            requireFor(commands, e, Command.CORRECTION_ON, Command.CORRECTION_OFF);
            for (CorrectionStandard s : corrections) {
                requireFor(commands, e, correctionCommand(s));
            }
            if (corrections.contains(CorrectionStandard.LOAD)) {
                requireFor(commands, e, Command.LOAD_STANDARD);
            }
        }
        for (Command c : List.of(Command.IDENTIFY, Command.RESET, Command.MEASURE, Command.BIAS_OFF)) {
            if (!commands.containsKey(c)) {
                throw fail(sectionLines.get("commands"), 0, "[commands] must have '" + c.key() + "'");
            }
        }
        Map<String, Entry> cmdEntries = sections.get("commands");
        rejectUnneeded(cmdEntries, "current-level", caps, Command.DRIVE_CURRENT, Command.LIST_CURRENT);
        rejectUnneeded(cmdEntries, "voltage-level", caps, Command.DRIVE_VOLTAGE, Command.LIST_VOLTAGE);
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
                rejectUnneeded(cmdEntries, "corrections", Map.of(), correctionCommand(s));
            }
        }
        if (!corrections.contains(CorrectionStandard.LOAD)) {
            rejectUnneeded(cmdEntries, "corrections", Map.of(), Command.LOAD_STANDARD);
        }

        if (!caps.containsKey("integration-time")) {
            // every MeasurementSetting carries one; a dialect that cannot send it could apply none
            throw fail(sectionLines.get("capabilities"), 0, "[capabilities] must have 'integration-time'");
        }
        MeterCapabilities capabilities = new MeterCapabilities(frequency, voltage, current, biasV, biasA,
                listPoints, corrections, ratio);
        MeterAccuracy accuracy = sections.containsKey("accuracy") ? accuracy(sections.get("accuracy")) : null;
        return new Dialect(nameEntry.value, description == null ? "" : description.value, source, capabilities,
                averaging, integration, impedanceRange, compound, append, reply, commands, accuracy);
    }

    private static Command correctionCommand(CorrectionStandard s) {
        return switch (s) {
            case OPEN -> Command.CORRECTION_OPEN;
            case SHORT -> Command.CORRECTION_SHORT;
            case LOAD -> Command.CORRECTION_LOAD;
        };
    }

    private void readLines() {
        String[] lines = text.split("\r?\n", -1);
        lastLine = text.endsWith("\n") ? lines.length - 1 : lines.length;
        boolean headerSeen = false;
        Map<String, Entry> current = null;
        String currentName = null;
        for (int n = 1; n <= lines.length; n++) {
            String line = stripComment(lines[n - 1]);
            if (line.isBlank()) {
                continue;
            }
            int indent = firstNonBlank(line);
            String content = line.trim();
            if (!headerSeen) {
                if (!content.equals(HEADER)) {
                    throw fail(n, indent + 1, "expected '" + HEADER + "' as the first line that is not a comment");
                }
                headerSeen = true;
                continue;
            }
            if (content.startsWith("[")) {
                if (!content.endsWith("]")) {
                    throw fail(n, indent + content.length(), "section header must end with ']'");
                }
                currentName = content.substring(1, content.length() - 1).trim();
                if (!SECTIONS.contains(currentName)) {
                    throw fail(n, indent + 2, "unknown section [" + currentName + "] (expected one of "
                            + String.join(", ", SECTIONS) + ")");
                }
                if (sections.containsKey(currentName)) {
                    throw fail(n, indent + 1, "section [" + currentName + "] appears twice (first at line "
                            + sectionLines.get(currentName) + ")");
                }
                current = new LinkedHashMap<>();
                sections.put(currentName, current);
                sectionLines.put(currentName, n);
                continue;
            }
            int eq = line.indexOf('=');
            if (eq < 0) {
                throw fail(n, indent + 1, "expected 'key = value', a [section] or a # comment");
            }
            String key = line.substring(0, eq).trim();
            if (!KEY.matcher(key).matches()) {
                throw fail(n, indent + 1, "invalid key '" + key + "' (lower-case letters, digits and '-')");
            }
            if (current == null) {
                throw fail(n, indent + 1, "'" + key + "' is outside any section; start one with [meter]");
            }
            int valueStart = eq + 1;
            while (valueStart < line.length() && Character.isWhitespace(line.charAt(valueStart))) {
                valueStart++;
            }
            String value = line.substring(valueStart).strip();
            if (value.isEmpty()) {
                throw fail(n, eq + 2, "missing value for '" + key + "'");
            }
            Entry old = current.get(key);
            if (old != null) {
                throw fail(n, indent + 1, "'" + key + "' appears twice in [" + currentName + "] (first at line "
                        + old.line + ")");
            }
            current.put(key, new Entry(key, value, n, indent + 1, valueStart + 1));
        }
        if (!headerSeen) {
            throw fail(Math.max(lastLine, 1), 0, "end of file: expected '" + HEADER + "'");
        }
    }

    /** A whole-line comment starts with '#'; a trailing one is '#' after white space, then white space. */
    private static String stripComment(String line) {
        if (line.strip().startsWith("#")) {
            return "";
        }
        for (int i = 1; i < line.length(); i++) {
            if (line.charAt(i) == '#' && Character.isWhitespace(line.charAt(i - 1))
                    && (i + 1 == line.length() || Character.isWhitespace(line.charAt(i + 1)))) {
                return line.substring(0, i);
            }
        }
        return line;
    }

    private static int firstNonBlank(String s) {
        int i = 0;
        while (i < s.length() && Character.isWhitespace(s.charAt(i))) {
            i++;
        }
        return i;
    }

    private static final Map<String, Set<String>> KEYS = Map.of(
            "meter", Set.of("name", "description"),
            "capabilities", Set.of("frequency", "voltage-level", "current-level", "bias-voltage", "bias-current",
                    "averaging", "integration-time", "impedance-range", "list-points", "corrections",
                    "voltage-ratio", "compound-messages", "append-error-query"),
            "reply", Set.of("encoding", "fields"));

    private void rejectUnknownKeys() {
        for (Map.Entry<String, Map<String, Entry>> s : sections.entrySet()) {
            for (Entry e : s.getValue().values()) {
                boolean known = switch (s.getKey()) {
                    case "commands" -> Command.byKey(e.key).isPresent();
                    case "accuracy" -> e.key.equals("distribution") || e.key.startsWith("band-");
                    default -> KEYS.get(s.getKey()).contains(e.key);
                };
                if (!known) {
                    throw fail(e.line, e.keyColumn, "unknown key '" + e.key + "' in [" + s.getKey() + "]");
                }
            }
        }
    }

    private Entry required(Map<String, Entry> section, String sectionName, String key) {
        Entry e = section.get(key);
        if (e == null) {
            throw fail(sectionLines.get(sectionName), 0, "[" + sectionName + "] must have '" + key + "'");
        }
        return e;
    }

    private Range optionalRange(Map<String, Entry> caps, String key, String unit, boolean positive) {
        return caps.containsKey(key) ? range(caps.get(key), unit, positive) : NONE;
    }

    /** {@code MIN .. MAX UNIT}, plain decimal numbers in the SI unit without a prefix. */
    private Range range(Entry e, String unit, boolean positive) {
        List<int[]> spans = tokens(e.value);
        String shape = "'" + e.key + " = MIN .. MAX " + unit + "'";
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
        return new Range(min, max);
    }

    private Range countRange(Entry e) {
        List<int[]> spans = tokens(e.value);
        if (spans.size() != 3 || !token(e, spans, 1).equals("..")) {
            throw fail(e.line, e.valueColumn, "expected 'averaging = MIN .. MAX' (whole numbers)");
        }
        int min = integer(e, spans, 0);
        int max = integer(e, spans, 2);
        if (min < 1) {
            throw fail(e.line, column(e, spans, 0), "averaging must start at 1 or more, found " + min);
        }
        if (max < min) {
            throw fail(e.line, column(e, spans, 2), "maximum " + max + " is below minimum " + min);
        }
        return new Range(min, max);
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

    private Set<CorrectionStandard> corrections(Entry e) {
        Set<CorrectionStandard> set = EnumSet.noneOf(CorrectionStandard.class);
        List<int[]> spans = tokens(e.value);
        if (spans.size() == 1 && token(e, spans, 0).equals("none")) {
            return set;
        }
        for (int i = 0; i < spans.size(); i++) {
            String t = token(e, spans, i);
            CorrectionStandard s = switch (t) {
                case "open" -> CorrectionStandard.OPEN;
                case "short" -> CorrectionStandard.SHORT;
                case "load" -> CorrectionStandard.LOAD;
                default -> throw fail(e.line, column(e, spans, i),
                        "unknown correction '" + t + "' (expected open, short, load, or none)");
            };
            if (!set.add(s)) {
                throw fail(e.line, column(e, spans, i), "correction '" + t + "' is listed twice");
            }
        }
        return set;
    }

    private boolean yesNo(Entry e) {
        return switch (e.value) {
            case "yes" -> true;
            case "no" -> false;
            default -> throw fail(e.line, e.valueColumn, e.key + " must be yes or no, found '" + e.value + "'");
        };
    }

    private ReplyShape reply(Map<String, Entry> section) {
        ReplyShape.Encoding encoding = ReplyShape.Encoding.ASCII;
        Entry enc = section.get("encoding");
        if (enc != null) {
            encoding = null;
            for (ReplyShape.Encoding x : ReplyShape.Encoding.values()) {
                if (x.word.equals(enc.value)) {
                    encoding = x;
                }
            }
            if (encoding == null) {
                throw fail(enc.line, enc.valueColumn,
                        "unknown encoding '" + enc.value + "' (expected ascii, real64-big or real64-little)");
            }
        }
        List<ReplyShape.Field> fields = new ArrayList<>();
        Entry f = section.get("fields");
        if (f == null) {
            fields.add(ReplyShape.Field.REAL);
            fields.add(ReplyShape.Field.IMAG);
        } else {
            List<int[]> spans = tokens(f.value);
            for (int i = 0; i < spans.size(); i++) {
                String t = token(f, spans, i);
                ReplyShape.Field field = null;
                for (ReplyShape.Field x : ReplyShape.Field.values()) {
                    if (x.word.equals(t)) {
                        field = x;
                    }
                }
                if (field == null) {
                    throw fail(f.line, column(f, spans, i), "unknown field '" + t
                            + "' (expected real, imag, magnitude, phase-deg, phase-rad or skip)");
                }
                if (field != ReplyShape.Field.SKIP && fields.contains(field)) {
                    throw fail(f.line, column(f, spans, i), "field '" + t + "' is listed twice");
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
                throw fail(f.line, f.valueColumn,
                        "fields must hold either real and imag, or magnitude and one of phase-deg, phase-rad");
            }
        }
        return new ReplyShape(encoding, fields);
    }

    /**
     * {@code [accuracy]}: {@code distribution = rectangular | normal-k2} and rows
     * {@code band-NAME = F1 .. F2 Hz; L1 .. L2 V|A; T s; A %; ZS ohm; YO S[; phase P rad|deg]}.
     */
    private MeterAccuracy accuracy(Map<String, Entry> section) {
        MeterAccuracy.Distribution distribution = MeterAccuracy.Distribution.RECTANGULAR;
        Entry d = section.get("distribution");
        if (d != null) {
            distribution = MeterAccuracy.Distribution.byWord(d.value).orElseThrow(() -> fail(d.line, d.valueColumn,
                    "unknown distribution '" + d.value + "' (expected rectangular or normal-k2)"));
        }
        List<MeterAccuracy.Band> bands = new ArrayList<>();
        for (Entry e : section.values()) {
            if (e.key.startsWith("band-")) {
                bands.add(band(e));
            }
        }
        if (bands.isEmpty()) {
            throw fail(sectionLines.get("accuracy"), 0, "[accuracy] must have at least one 'band-NAME = ...' row");
        }
        return new MeterAccuracy(bands, distribution);
    }

    private static final String BAND_SHAPE =
            "'band-NAME = F1 .. F2 Hz; L1 .. L2 V; T s; A %; ZS ohm; YO S' and optionally '; phase P rad' (or deg)";

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
        Range freq = range(f, "Hz", true);
        Entry l = sub(e, parts[1], offsets[1]);
        List<int[]> ls = tokens(l.value);
        boolean current = ls.size() == 4 && token(l, ls, 3).equals("A");
        Range level = range(l, current ? "A" : "V", true);
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
            return new MeterAccuracy.Band(e.key.substring("band-".length()), freq.min(), freq.max(), level.min(),
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

    private Map<Command, Template> commands(Map<String, Entry> section, boolean compound) {
        Map<Command, Template> map = new EnumMap<>(Command.class);
        for (Entry e : section.values()) {
            Command c = Command.byKey(e.key).orElseThrow();
            Template t = Template.parse(e.value, c, (index, message) -> fail(e.line, e.valueColumn + index, message));
            if (!compound && t.compound()) {
                throw fail(e.line, e.valueColumn, "'" + e.key + "' joins commands with ';' but compound-messages = no");
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
                        "'" + capability.key + "' needs the command '" + c.key() + "' in [commands]");
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
                        + "' in [capabilities]");
            }
        }
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

    private InvalidInputException fail(int line, int column, String message) {
        return new InvalidInputException(source + ":" + line + (column > 0 ? ":" + column : "") + ": " + message);
    }
}
