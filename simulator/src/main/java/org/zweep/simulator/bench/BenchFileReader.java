package org.zweep.simulator.bench;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.regex.Pattern;
import org.snakeyaml.engine.v2.common.ScalarStyle;
import org.snakeyaml.engine.v2.exceptions.Mark;
import org.snakeyaml.engine.v2.nodes.MappingNode;
import org.snakeyaml.engine.v2.nodes.Node;
import org.snakeyaml.engine.v2.nodes.NodeTuple;
import org.snakeyaml.engine.v2.nodes.ScalarNode;
import org.snakeyaml.engine.v2.nodes.SequenceNode;
import org.zweep.config.BoundedYaml;
import org.zweep.config.ConfigException;
import org.zweep.config.YamlNode;
import org.zweep.config.YamlSyntaxException;
import org.zweep.simulator.InputFiles;
import org.zweep.simulator.SimulatorInputException;
import org.zweep.simulator.netlist.Netlist;

/**
 * Reads a bench file (YAML) into a {@link BenchSpec}, from the node tree so that every error can
 * name its {@code file:line:column}. Numbers are plain decimal numbers in SI units, the unit in
 * the key's name.
 */
final class BenchFileReader {

    private static final Pattern NUMBER =
            Pattern.compile("[-+]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][-+]?\\d+)?");
    private static final Pattern INTEGER = Pattern.compile("[-+]?\\d+");

    private final String source;
    private final Path baseDir;
    private String[] rawLines = new String[0];

    /** The folders a netlist file must lie in, or null for anywhere. */
    private final List<Path> folders;

    BenchFileReader(String source, Path baseDir, List<Path> folders) {
        this.source = source;
        this.baseDir = baseDir;
        this.folders = folders;
    }

    BenchSpec read(String yaml) {
        rawLines = yaml.split("\r?\n|\r", -1);
        Node root;
        try {
            root = BoundedYaml.composeOne(yaml, source, "bench file").map(YamlNode::node).orElse(null);
        } catch (YamlSyntaxException e) {
            throw new SimulatorInputException(e.where() + ": not valid YAML: "
                    + SimulatorInputException.oneLine(e.problem()), e);
        } catch (ConfigException e) {
            throw new SimulatorInputException(e.getMessage(), e);
        }
        if (root == null) {
            throw SimulatorInputException.at(source, 1, 0, "the bench file is empty");
        }
        Section top = new Section("", root);
        top.allow("description", "seed", "meter", "fixture", "load", "device", "parts");
        String description = top.string("description", "bench " + source);
        long seed = top.integer("seed", 0);
        MeterSpec meter = meter(top.section("meter"));
        FixtureSpec fixture = fixture(top.section("fixture"), top.section("load"));
        Section deviceSection = top.section("device");
        if (deviceSection == null) {
            throw top.error("a bench file needs a 'device' section");
        }
        return new BenchSpec(description, meter, fixture, device(deviceSection), seed,
                parts(top.section("parts"), deviceSection));
    }

    /**
     * {@code parts}: serial → the device keys that differ for that part, over the bench's
     * {@code device} (a tray of parts of one kind; the address's {@code part=SERIAL} picks one).
     */
    private Map<String, Device> parts(Section s, Section deviceSection) {
        Map<String, Device> parts = new LinkedHashMap<>();
        if (s == null) {
            return parts;
        }
        if (deviceSection.entries.size() != 1) {
            throw deviceSection.error("the device section needs exactly one of capacitor, inductor, resistor,"
                    + " transformer, netlist, netlist_file");
        }
        String kind = deviceSection.entries.keySet().iterator().next();
        if (kind.startsWith("netlist")) {
            throw s.error("'parts' varies a capacitor, inductor, resistor or transformer device, not a netlist");
        }
        Section base = new Section("device." + kind, deviceSection.entries.get(kind).getValueNode());
        for (Map.Entry<String, NodeTuple> e : s.entries.entrySet()) {
            Section over = new Section("parts." + e.getKey(), e.getValue().getValueNode());
            Section merged = base.overriddenBy(over);
            parts.put(e.getKey(), device(kind, merged));
        }
        return parts;
    }

    private SimulatorInputException at(Optional<Mark> m, String what) {
        return SimulatorInputException.at(source, m.map(x -> x.getLine() + 1).orElse(1),
                m.map(x -> x.getColumn() + 1).orElse(0), what);
    }

    private MeterSpec meter(Section s) {
        MeterSpec d = MeterSpec.defaults();
        if (s == null) {
            return d;
        }
        MeterLimits l = d.limits();
        s.allow("frequency_min_hz", "frequency_max_hz", "voltage_min_vrms", "voltage_max_vrms",
                "current_min_arms", "current_max_arms", "bias_voltage_max_v", "bias_current_max_a",
                "list_points_max", "ranges_ohm", "source_resistance_ohm", "noise", "timing",
                "point_overhead_s", "bias_settling_s", "accuracy");
        double fMin = s.positive("frequency_min_hz", l.minFrequencyHz());
        double fMax = s.above("frequency_max_hz", l.maxFrequencyHz(), fMin);
        double vMin = s.positive("voltage_min_vrms", l.minVoltageVrms());
        double vMax = s.above("voltage_max_vrms", l.maxVoltageVrms(), vMin);
        double iMin = s.positive("current_min_arms", l.minCurrentArms());
        double iMax = s.above("current_max_arms", l.maxCurrentArms(), iMin);
        double biasV = s.nonNegative("bias_voltage_max_v", l.maxBiasVoltageV());
        double biasI = s.nonNegative("bias_current_max_a", l.maxBiasCurrentA());
        long points = s.integer("list_points_max", l.maxListPoints());
        if (points < 1 || points > 100_000) {
            throw s.error("list_points_max", "must be between 1 and 100000");
        }
        double[] ranges = s.ranges("ranges_ohm", l.rangesOhm());
        double rs = s.positive("source_resistance_ohm", l.sourceResistanceOhm());
        double noise = s.nonNegative("noise", d.noiseRel());
        Timing timing = switch (s.choice("timing", "real", "real", "none")) {
            case "none" -> Timing.NONE;
            default -> Timing.REAL;
        };
        return new MeterSpec(new MeterLimits(fMin, fMax, vMin, vMax, iMin, iMax, biasV, biasI,
                (int) points, ranges, rs), noise, timing,
                s.nonNegative("point_overhead_s", d.pointOverheadS()),
                s.nonNegative("bias_settling_s", d.biasSettlingS()),
                s.entries.containsKey("accuracy") ? accuracy(s.section("accuracy")) : null);
    }

    /** {@code meter.accuracy}: a distribution and a list of bands (format in README). */
    private StatedAccuracy accuracy(Section s) {
        s.allow("distribution", "bands");
        boolean normal = s.choice("distribution", "rectangular", "rectangular", "normal-k2").equals("normal-k2");
        if (!s.entries.containsKey("bands")) {
            throw s.error("'" + s.path + "' needs 'bands', a list of accuracy bands");
        }
        Node list = s.entries.get("bands").getValueNode();
        if (!(list instanceof SequenceNode) || ((SequenceNode) list).getValue().isEmpty()) {
            throw at(list, "'" + s.name("bands") + "' must be a list of accuracy bands");
        }
        List<StatedAccuracy.Band> bands = new ArrayList<>();
        int i = 0;
        for (Node item : ((SequenceNode) list).getValue()) {
            Section b = new Section(s.name("bands") + "[" + i++ + "]", item);
            b.allow("frequency_hz", "level_vrms", "level_arms", "integration_min_s", "basic", "short_ohm", "open_s",
                    "phase_rad");
            double[] f = b.pair("frequency_hz");
            boolean current = b.entries.containsKey("level_arms");
            if (current == b.entries.containsKey("level_vrms")) {
                throw b.error("'" + b.path + "' needs one of level_vrms, level_arms");
            }
            double[] level = b.pair(current ? "level_arms" : "level_vrms");
            bands.add(new StatedAccuracy.Band(f[0], f[1], current, level[0], level[1],
                    b.nonNegative("integration_min_s", 0), b.nonNegative("basic", 0), b.nonNegative("short_ohm", 0),
                    b.nonNegative("open_s", 0), b.nonNegative("phase_rad", Double.NaN)));
        }
        return new StatedAccuracy(bands, normal);
    }

    private FixtureSpec fixture(Section s, Section load) {
        FixtureSpec d = FixtureSpec.defaults();
        TerminalConfiguration terminals = d.terminals();
        double rs = d.residualResistanceOhm();
        double ls = d.residualInductanceH();
        double g = d.strayConductanceS();
        double c = d.strayCapacitanceF();
        double lead = d.leadResistanceOhm();
        if (s != null) {
            s.allow("connection", "residual_resistance_ohm", "residual_inductance_h",
                    "stray_conductance_s", "stray_capacitance_f", "lead_resistance_ohm");
            terminals = s.choice("connection", "4-terminal", "2-terminal", "4-terminal")
                    .equals("2-terminal") ? TerminalConfiguration.TWO_TERMINAL : TerminalConfiguration.FOUR_TERMINAL;
            rs = s.nonNegative("residual_resistance_ohm", rs);
            ls = s.nonNegative("residual_inductance_h", ls);
            g = s.nonNegative("stray_conductance_s", g);
            c = s.nonNegative("stray_capacitance_f", c);
            lead = s.nonNegative("lead_resistance_ohm", lead);
        }
        double loadR = d.loadResistanceOhm();
        double loadL = d.loadInductanceH();
        if (load != null) {
            load.allow("resistance_ohm", "inductance_h");
            loadR = load.positive("resistance_ohm", loadR);
            loadL = load.nonNegative("inductance_h", loadL);
        }
        return new FixtureSpec(terminals, rs, ls, g, c, lead, loadR, loadL);
    }

    private Device device(Section s) {
        Set<String> kinds = Set.of("capacitor", "inductor", "resistor", "transformer", "netlist",
                "netlist_file");
        s.allow(kinds.toArray(new String[0]));
        if (s.entries.size() != 1) {
            throw s.error("the device section needs exactly one of capacitor, inductor, resistor,"
                    + " transformer, netlist, netlist_file");
        }
        String kind = s.entries.keySet().iterator().next();
        Node value = s.entries.get(kind).getValueNode();
        switch (kind) {
            case "netlist":
                return inlineNetlist(s.scalar("netlist"));
            case "netlist_file":
                return netlistFile(s.scalar("netlist_file"));
            default:
                break;
        }
        return device(kind, new Section("device." + kind, value));
    }

    /** A capacitor, inductor, resistor or transformer from its keys. */
    private Device device(String kind, Section p) {
        switch (kind) {
            case "capacitor": {
                p.allow("capacitance_f", "esr_ohm", "esl_h", "tan_delta", "bias_half_voltage_v",
                        "bias_exponent", "level_coefficient_per_vrms");
                return new Capacitor(p.required("capacitance_f"), p.nonNegative("esr_ohm", 0),
                        p.nonNegative("esl_h", 0), p.nonNegative("tan_delta", 0),
                        p.positive("bias_half_voltage_v", Double.POSITIVE_INFINITY),
                        p.positive("bias_exponent", 2),
                        p.nonNegative("level_coefficient_per_vrms", 0));
            }
            case "inductor": {
                p.allow("inductance_h", "winding_resistance_ohm", "parallel_capacitance_f",
                        "core_loss_resistance_ohm", "saturation_current_a", "saturation_exponent");
                return new Inductor(p.required("inductance_h"),
                        p.nonNegative("winding_resistance_ohm", 0),
                        p.nonNegative("parallel_capacitance_f", 0),
                        p.positive("core_loss_resistance_ohm", Double.POSITIVE_INFINITY),
                        p.positive("saturation_current_a", Double.POSITIVE_INFINITY),
                        p.positive("saturation_exponent", 2));
            }
            case "resistor": {
                p.allow("resistance_ohm", "series_inductance_h", "parallel_capacitance_f");
                return new Resistor(p.required("resistance_ohm"),
                        p.nonNegative("series_inductance_h", 0),
                        p.nonNegative("parallel_capacitance_f", 0));
            }
            default: {
                p.allow("primary_inductance_h", "secondary_inductance_h", "turns_ratio",
                        "coupling", "primary_resistance_ohm", "secondary_resistance_ohm");
                double l1 = p.required("primary_inductance_h");
                boolean hasL2 = p.entries.containsKey("secondary_inductance_h");
                if (hasL2 == p.entries.containsKey("turns_ratio")) {
                    throw p.error("give exactly one of secondary_inductance_h and turns_ratio");
                }
                double l2 = hasL2 ? p.required("secondary_inductance_h")
                        : l1 / Math.pow(p.required("turns_ratio"), 2);
                double k = p.required("coupling");
                if (k > 1) {
                    throw p.error("coupling", "must be at most 1");
                }
                return new Transformer(l1, l2, k, p.nonNegative("primary_resistance_ohm", 0),
                        p.nonNegative("secondary_resistance_ohm", 0));
            }
        }
    }

    private Device inlineNetlist(ScalarNode node) {
        Mark m = node.getStartMark().orElseThrow();
        ScalarStyle style = node.getScalarStyle();
        if (style == ScalarStyle.FOLDED) {
            throw at(node, "write an inline netlist as a literal block (netlist: |), not folded");
        }
        boolean block = style == ScalarStyle.LITERAL;
        int firstLine = m.getLine() + 1 + (block ? 1 : 0);
        int indent = block ? indentOf(firstLine, node.getValue()) : m.getColumn()
                + (style == ScalarStyle.PLAIN ? 0 : 1);
        return new NetlistDevice(Netlist.parse(node.getValue(), source, firstLine, indent));
    }

    /** Columns the block's content is indented by in the raw file (its first non-blank line). */
    private int indentOf(int firstLine, String value) {
        String[] content = value.split("\n", -1);
        for (int i = 0; i < content.length; i++) {
            if (!content[i].isBlank() && firstLine - 1 + i < rawLines.length) {
                String raw = rawLines[firstLine - 1 + i];
                return Math.max(0, raw.length() - content[i].length());
            }
        }
        return 0;
    }

    private Device netlistFile(ScalarNode node) {
        Path file = baseDir == null ? Path.of(node.getValue()) : baseDir.resolve(node.getValue());
        if (folders != null) {
            file = InputFiles.inside(file.toString(), folders);
            if (file == null) {
                throw at(node, "netlist file '" + node.getValue() + "' not found in the bench folders");
            }
        }
        String text;
        try {
            text = InputFiles.read(file, "netlist file", InputFiles.MAX_NETLIST_BYTES);
        } catch (SimulatorInputException e) {
            throw at(node, e.getMessage());
        }
        return new NetlistDevice(Netlist.parse(text, file.toString()));
    }

    private SimulatorInputException at(Node node, String what) {
        Optional<Mark> m = node.getStartMark();
        return SimulatorInputException.at(source, m.map(x -> x.getLine() + 1).orElse(1),
                m.map(x -> x.getColumn() + 1).orElse(0), what);
    }

    /** A mapping in the file, with typed, checked access to its entries. */
    private final class Section {
        final String path;
        final Node node;
        final Map<String, NodeTuple> entries = new LinkedHashMap<>();

        private Section(String path, Node node, Map<String, NodeTuple> entries) {
            this.path = path;
            this.node = node;
            this.entries.putAll(entries);
        }

        /** These keys with {@code over}'s replacing or adding to them (errors still name each key's own place). */
        Section overriddenBy(Section over) {
            Map<String, NodeTuple> all = new LinkedHashMap<>(entries);
            all.putAll(over.entries);
            return new Section(over.path, over.node, all);
        }

        Section(String path, Node node) {
            this.path = path;
            this.node = node;
            if (!(node instanceof MappingNode)) {
                throw at(node, (path.isEmpty() ? "the bench file" : "'" + path + "'")
                        + " must be a mapping of keys to values");
            }
            for (NodeTuple t : ((MappingNode) node).getValue()) {
                if (!(t.getKeyNode() instanceof ScalarNode)) {
                    throw at(t.getKeyNode(), "keys must be plain words");
                }
                String key = ((ScalarNode) t.getKeyNode()).getValue();
                if (entries.put(key, t) != null) {
                    throw at(t.getKeyNode(), "'" + name(key) + "' is given twice");
                }
            }
        }

        String name(String key) {
            return path.isEmpty() ? key : path + "." + key;
        }

        void allow(String... keys) {
            List<String> allowed = List.of(keys);
            for (Map.Entry<String, NodeTuple> e : entries.entrySet()) {
                if (!allowed.contains(e.getKey())) {
                    throw at(e.getValue().getKeyNode(), "unknown key '" + name(e.getKey())
                            + "'; expected one of " + String.join(", ", allowed));
                }
            }
        }

        SimulatorInputException error(String what) {
            return at(node, what);
        }

        SimulatorInputException error(String key, String what) {
            return at(entries.get(key).getValueNode(), "'" + name(key) + "' " + what);
        }

        Section section(String key) {
            NodeTuple t = entries.get(key);
            return t == null ? null : new Section(name(key), t.getValueNode());
        }

        ScalarNode scalar(String key) {
            Node v = entries.get(key).getValueNode();
            if (!(v instanceof ScalarNode)) {
                throw at(v, "'" + name(key) + "' must be a single value");
            }
            return (ScalarNode) v;
        }

        String string(String key, String fallback) {
            return entries.containsKey(key) ? scalar(key).getValue() : fallback;
        }

        String choice(String key, String fallback, String... options) {
            if (!entries.containsKey(key)) {
                return fallback;
            }
            String v = scalar(key).getValue();
            if (!List.of(options).contains(v)) {
                throw error(key, "must be one of " + String.join(", ", options) + ", not '" + v
                        + "'");
            }
            return v;
        }

        long integer(String key, long fallback) {
            if (!entries.containsKey(key)) {
                return fallback;
            }
            String v = scalar(key).getValue().strip();
            if (!INTEGER.matcher(v).matches()) {
                throw error(key, "must be a whole number, not '" + v + "'");
            }
            try {
                return Long.parseLong(v);
            } catch (NumberFormatException e) {
                throw error(key, "is too large: '" + v + "'");
            }
        }

        double number(Node v, String key) {
            if (!(v instanceof ScalarNode)) {
                throw at(v, "'" + name(key) + "' must be a number");
            }
            String text = ((ScalarNode) v).getValue().strip();
            if (!NUMBER.matcher(text).matches()) {
                throw at(v, "'" + name(key) + "' must be a plain number in SI units (e.g. 100e-9),"
                        + " not '" + text + "'");
            }
            return Double.parseDouble(text);
        }

        double required(String key) {
            if (!entries.containsKey(key)) {
                throw error("'" + path + "' needs '" + key + "'");
            }
            double v = number(entries.get(key).getValueNode(), key);
            if (!(v > 0)) {
                throw error(key, "must be greater than 0");
            }
            return v;
        }

        double positive(String key, double fallback) {
            if (!entries.containsKey(key)) {
                return fallback;
            }
            double v = number(entries.get(key).getValueNode(), key);
            if (!(v > 0)) {
                throw error(key, "must be greater than 0");
            }
            return v;
        }

        double above(String key, double fallback, double lower) {
            double v = positive(key, fallback);
            if (!(v > lower)) {
                throw entries.containsKey(key) ? error(key, "must be greater than " + lower)
                        : error("'" + name(key) + "' (default " + fallback
                                + ") must be greater than " + lower + "; give it explicitly");
            }
            return v;
        }

        double nonNegative(String key, double fallback) {
            if (!entries.containsKey(key)) {
                return fallback;
            }
            double v = number(entries.get(key).getValueNode(), key);
            if (!(v >= 0)) {
                throw error(key, "must not be negative");
            }
            return v;
        }

        /** {@code [low, high]}: two numbers, not negative, low not above high. */
        double[] pair(String key) {
            if (!entries.containsKey(key)) {
                throw error("'" + path + "' needs '" + key + "'");
            }
            Node v = entries.get(key).getValueNode();
            if (!(v instanceof SequenceNode) || ((SequenceNode) v).getValue().size() != 2) {
                throw at(v, "'" + name(key) + "' must be [low, high]");
            }
            double lo = number(((SequenceNode) v).getValue().get(0), key);
            double hi = number(((SequenceNode) v).getValue().get(1), key);
            if (!(lo >= 0) || !(hi >= lo)) {
                throw at(v, "'" + name(key) + "' must be [low, high] with 0 <= low <= high");
            }
            return new double[] {lo, hi};
        }

        double[] ranges(String key, double[] fallback) {
            if (!entries.containsKey(key)) {
                return fallback;
            }
            Node v = entries.get(key).getValueNode();
            if (!(v instanceof SequenceNode) || ((SequenceNode) v).getValue().isEmpty()) {
                throw at(v, "'" + name(key) + "' must be a list of range limits in ohms");
            }
            List<Double> values = new ArrayList<>();
            for (Node item : ((SequenceNode) v).getValue()) {
                double r = number(item, key);
                if (!(r > 0) || (!values.isEmpty() && r <= values.get(values.size() - 1))) {
                    throw at(item, "'" + name(key) + "' must be positive and ascending");
                }
                values.add(r);
            }
            return values.stream().mapToDouble(Double::doubleValue).toArray();
        }
    }
}
