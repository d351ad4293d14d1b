package org.zweep.runner.sequence;

import org.zweep.config.Suggest;
import org.zweep.config.YamlNode;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.address.Address;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.impedance.ToleranceCode;
import org.zweep.driver.impedance.Unit;
import org.zweep.driver.uncertainty.UncertainImpedance;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.ImpedanceRange;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.conformance.DecisionRule;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.TerminalConfiguration;
import org.zweep.runner.plan.FixturePlan;
import org.zweep.runner.plan.MeterChoice;
import org.zweep.runner.plan.Part;
import org.zweep.driver.impedance.PartKind;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedStep;
import org.zweep.runner.plan.SafetyLimits;
import org.zweep.runner.plan.Wiring;

/** Turns the node tree of one sequence file into a validated {@link Plan}. Not thread-safe; one per file. */
final class SequenceReader {
    static final String FORMAT = "zweep-sequence/1";
    static final String DEFAULT_DIALECT = "standard";
    /** The most points one sequence may expand to. */
    static final int MAX_POINTS = 1_000_000;

    static final List<String> TOP_KEYS =
            List.of("format", "name", "description", "meter", "safety", "fixture", "part", "steps", "checks",
                    "decision_rule");
    static final List<String> METER_KEYS = List.of("address", "bench", "dialect");
    static final List<String> SAFETY_KEYS =
            List.of("max_bias_voltage", "max_bias_current", "max_level_voltage", "max_level_current");
    static final List<String> FIXTURE_KEYS = List.of("terminals", "compensation", "standards", "load", "reuse", "store");
    static final List<String> LOAD_KEYS = List.of("r", "x", "u_r", "u_x", "k");
    static final List<String> PART_KEYS = List.of("kind", "name", "nominal", "tolerance", "turns_ratio");
    static final List<String> STEP_KEYS = List.of("name", "prompt", "quantity", "wiring", "frequency", "level", "bias",
            "order", "averaging", "integration", "repeats", "delay", "range", "derating");
    static final List<String> BIAS_KEYS =
            List.of("values", "start", "stop", "points", "per_decade", "spacing", "ramp", "settle");
    static final List<String> CHECK_KEYS =
            List.of("name", "step", "parameter", "at", "bias", "level", "drop", "min", "max", "within", "rule");

    /**
     * Check parameters measured at one point, with the unit of their limits: the impedance core's
     * contract parameters (the result column names) except the frequency, and {@code ratio}.
     */
    static final Map<String, Unit> POINT_PARAMETERS = new LinkedHashMap<>();

    static {
        for (DerivedParameter p : DerivedParameter.contract()) {
            if (p != DerivedParameter.FREQUENCY) {
                POINT_PARAMETERS.put(p.key(), p.unit());
            }
        }
        POINT_PARAMETERS.put("ratio", Unit.NONE);
    }

    /** Parameters a {@code within} limit may compare with the nominal value, by part kind. */
    static final Map<PartKind, List<String>> NOMINAL_PARAMETERS = Map.of(
            PartKind.CAPACITOR, List.of("cs_f", "cp_f"),
            PartKind.INDUCTOR, List.of("ls_h", "lp_h"),
            PartKind.TRANSFORMER, List.of("ls_h", "lp_h", "ratio"),
            PartKind.RESISTOR, List.of("rs_ohm", "rp_ohm", "r_ohm", "z_ohm"));

    /**
     * Whole-sweep figures a check may name besides {@code srf_hz} and {@code saturation}: the
     * values of the equivalent circuit fitted to the step's first sweep (the part kind's default
     * model) and the transformer figures, with their units.
     */
    static final Map<PartKind, Map<String, Unit>> SWEEP_FIGURES = Map.of(
            PartKind.CAPACITOR, Map.of("c_f", Unit.FARAD, "esr_ohm", Unit.OHM, "esl_h", Unit.HENRY),
            PartKind.INDUCTOR, Map.of("l_h", Unit.HENRY),
            PartKind.TRANSFORMER, Map.of("l_h", Unit.HENRY, "turns_ratio", Unit.NONE, "k", Unit.NONE,
                    "leakage_h", Unit.HENRY, "mutual_h", Unit.HENRY),
            PartKind.RESISTOR, Map.of());

    /** The fitted value of each part kind that {@code within} compares with the nominal. */
    static final Map<PartKind, String> FITTED_NOMINAL = Map.of(PartKind.CAPACITOR, "c_f", PartKind.INDUCTOR, "l_h",
            PartKind.TRANSFORMER, "l_h");

    static final String SRF = CheckLimit.SRF;
    static final String SATURATION = CheckLimit.SATURATION;
    private static final Pattern NAME = Pattern.compile("[A-Za-z0-9._-]+");

    private final Path source;
    private final String file;

    /** When not null, every point is checked against this dialect (empty: the sequence's own). */
    private final String meterCheck;

    SequenceReader(Path source) {
        this(source, null);
    }

    /**
     * A reader that also checks every point against a meter's declared capabilities.
     *
     * @param dialect a dialect name or file to check against; {@code ""} for the sequence's own
     *     dialect; {@code null} for no check
     */
    SequenceReader(Path source, String dialect) {
        this.source = source;
        this.file = source.toString();
        this.meterCheck = dialect;
    }

    Plan read(YamlNode root) {
        YamlNode.YamlMap top = root.map("the sequence", TOP_KEYS);
        YamlNode format = top.required("format");
        if (!format.text("a format").equals(FORMAT)) {
            throw format.error("unsupported format '" + format.text("") + "': expected " + FORMAT);
        }
        String name = top.optional("name").map(n -> name(n, "a sequence name")).orElseGet(this::defaultName);
        top.optional("description").ifPresent(d -> d.text("a description"));
        MeterChoice meter = meter(top.required("meter"));
        SafetyLimits safety = safety(top.required("safety"));
        FixturePlan fixture = top.optional("fixture").map(this::fixture)
                .orElse(new FixturePlan(TerminalConfiguration.TWO_TERMINAL, CompensationMode.NONE, List.of(), null,
                        Duration.ZERO, null));
        Part part = part(top.required("part"));
        List<StepSpec> specs = steps(top.required("steps"), part, safety);
        DecisionRule defaultRule = top.optional("decision_rule").map(SequenceReader::rule).orElse(DecisionRule.SIMPLE);
        List<CheckLimit> checks = top.optional("checks").map(c -> checks(c, specs, part, defaultRule))
                .orElse(List.of());
        List<PlannedStep> steps = PlanExpander.expand(specs);
        if (meterCheck != null) {
            checkMeter(specs, steps, Dialect.load(meterCheck.isEmpty() ? meter.dialect() : meterCheck));
        }
        return Plan.builder().name(name).source(source).meter(meter).safety(safety).fixture(fixture).part(part)
                .steps(steps).checks(checks).build();
    }

    /**
     * Refuses the first point the meter cannot do, at the step's key that asks for it (the step
     * itself when the value is a default).
     */
    private static void checkMeter(List<StepSpec> specs, List<PlannedStep> steps, Dialect dialect) {
        for (int i = 0; i < specs.size(); i++) {
            StepSpec spec = specs.get(i);
            for (var p : steps.get(i).points()) {
                Optional<Dialect.Refusal> r = dialect.refusal(p.setting());
                if (r.isPresent()) {
                    YamlNode at = spec.node().child(r.get().setting()).orElse(spec.node());
                    throw at.error("step '" + spec.name() + "': " + r.get().message());
                }
            }
        }
    }

    private String defaultName() {
        String f = source.getFileName() == null ? "sequence" : source.getFileName().toString();
        return f.replaceFirst("\\.ya?ml$", "");
    }

    private static String name(YamlNode node, String kind) {
        String text = node.text(kind);
        if (!NAME.matcher(text).matches()) {
            throw node.error("expected " + kind + " of letters, digits, '.', '_' or '-', got '" + text + "'");
        }
        return text;
    }

    private static String word(YamlNode node, String kind, List<String> choices) {
        String text = node.text(kind);
        if (!choices.contains(text)) {
            throw node.error("expected " + kind + " " + String.join(", ", choices.subList(0, choices.size() - 1))
                    + (choices.size() > 1 ? " or " : "") + choices.get(choices.size() - 1) + ", got '" + text + "'"
                    + Suggest.didYouMean(text, choices));
        }
        return text;
    }

    // ---- meter ----

    private MeterChoice meter(YamlNode node) {
        YamlNode.YamlMap m = node.map("meter", METER_KEYS);
        String dialect = m.optional("dialect").map(this::dialect).orElse(DEFAULT_DIALECT);
        Optional<YamlNode> address = m.optional("address");
        Optional<YamlNode> bench = m.optional("bench");
        if (address.isPresent() && bench.isPresent()) {
            throw bench.get().error("give either address or bench, not both");
        }
        if (bench.isPresent()) {
            return simMeter(bench.get(), bench.get().text("a bench file"), dialect);
        }
        if (address.isEmpty()) {
            throw node.error("missing key 'address' or 'bench' in meter");
        }
        String a = address.get().text("a meter address");
        if (a.startsWith("sim:")) {
            return simMeter(address.get(), a.substring(4), dialect);
        }
        try {
            Address.parse(a);
        } catch (InvalidInputException e) {
            throw address.get().error(e.getMessage());
        }
        return new MeterChoice(a, dialect);
    }

    /**
     * A built-in dialect's name, or a dialect file resolved against the sequence's folder; either is
     * loaded now, so that a wrong name or a malformed file is refused before anything is measured
     * (unless a dialect given by the user replaces it).
     */
    private String dialect(YamlNode node) {
        String d = node.text("a dialect");
        // replaced by the user's dialect (--dialect): the sequence's own is not looked at, so a
        // sequence copied away from its dialect file still runs
        boolean replaced = meterCheck != null && !meterCheck.isEmpty();
        if (!Dialect.isPath(d)) {
            if (!replaced) {
                try {
                    Dialect.load(d);
                } catch (InvalidInputException e) {
                    throw node.error(e.getMessage());
                }
            }
            return d;
        }
        Path p = source.toAbsolutePath().getParent().resolve(d).normalize();
        if (!replaced) {
            if (!Files.isRegularFile(p)) {
                throw node.error("dialect file not found: " + d + " (looked for " + p + "); put it there, or give"
                        + " the dialect with --dialect NAME|FILE");
            }
            Dialect.load(p.toString()); // its own errors name the dialect file's line and column
        }
        return p.toString();
    }

    /**
     * The simulator with the bench file {@code path}, resolved against the sequence's folder. A file
     * that is not there is not refused here but when the sequence's own meter is used
     * ({@link MeterChoice#requireUsable()}): {@code --meter} replaces it without looking at it.
     */
    private MeterChoice simMeter(YamlNode node, String path, String dialect) {
        if (path.isBlank()) {
            throw node.error("expected a bench file path");
        }
        Path dir = source.toAbsolutePath().getParent();
        Path p = dir.resolve(path).normalize();
        String unusable = Files.isRegularFile(p) ? null
                : node.where() + ": bench file not found: " + path + " (looked for " + p + "); put it there, or"
                        + " give the meter with --meter ADDRESS";
        return new MeterChoice("sim:" + p, dialect, unusable);
    }

    // ---- safety ----

    private static SafetyLimits safety(YamlNode node) {
        YamlNode.YamlMap m = node.map("safety", SAFETY_KEYS);
        return new SafetyLimits(
                limit(m, "max_bias_voltage", Unit.VOLT),
                limit(m, "max_bias_current", Unit.AMPERE),
                limit(m, "max_level_voltage", Unit.VOLT),
                limit(m, "max_level_current", Unit.AMPERE));
    }

    private static double limit(YamlNode.YamlMap m, String key, Unit unit) {
        return m.optional(key).map(n -> Units.parse(n, unit, Unit.Bound.NON_NEGATIVE)).orElse(0.0);
    }

    // ---- fixture ----

    private FixturePlan fixture(YamlNode node) {
        YamlNode.YamlMap m = node.map("fixture", FIXTURE_KEYS);
        YamlNode t = m.required("terminals");
        TerminalConfiguration terminals = switch (word(t, "terminals", List.of("2", "4"))) {
            case "2" -> TerminalConfiguration.TWO_TERMINAL;
            default -> TerminalConfiguration.FOUR_TERMINAL;
        };
        CompensationMode mode = m.optional("compensation")
                .map(c -> CompensationMode.valueOf(
                        word(c, "compensation", List.of("none", "meter", "host")).toUpperCase(Locale.ROOT)))
                .orElse(CompensationMode.NONE);
        List<CorrectionStandard> standards = new ArrayList<>();
        if (m.has("standards")) {
            YamlNode sn = m.required("standards");
            if (mode == CompensationMode.NONE) {
                throw sn.error("standards given but compensation is none");
            }
            List<YamlNode> items = sn.items("a list of standards");
            if (items.isEmpty()) {
                throw sn.error("empty list: expected open, short and optionally load");
            }
            for (YamlNode i : items) {
                CorrectionStandard s = CorrectionStandard.valueOf(
                        word(i, "a standard", List.of("open", "short", "load")).toUpperCase(Locale.ROOT));
                if (standards.contains(s)) {
                    throw i.error("standard '" + i.text("") + "' given twice");
                }
                standards.add(s);
            }
            if (standards.contains(CorrectionStandard.LOAD)
                    && !(standards.contains(CorrectionStandard.OPEN) && standards.contains(CorrectionStandard.SHORT))) {
                throw sn.error("a load standard needs open and short too");
            }
        } else if (mode != CompensationMode.NONE) {
            standards.addAll(List.of(CorrectionStandard.OPEN, CorrectionStandard.SHORT));
        }
        UncertainImpedance load = null;
        if (m.has("load")) {
            YamlNode ln = m.required("load");
            if (!standards.contains(CorrectionStandard.LOAD)) {
                throw ln.error("load value given but standards has no load");
            }
            load = load(ln);
        } else if (standards.contains(CorrectionStandard.LOAD)) {
            throw node.error("missing key 'load' in fixture (the load standard's known value)");
        }
        Duration reuse = Duration.ZERO;
        if (m.has("reuse")) {
            YamlNode rn = m.required("reuse");
            if (mode == CompensationMode.NONE) {
                throw rn.error("reuse given but compensation is none");
            }
            reuse = Duration.ofNanos(Math.round(Units.durationS(rn, "an age") * 1e9));
        }
        Path store = null;
        if (m.has("store")) {
            YamlNode st = m.required("store");
            if (mode != CompensationMode.HOST) {
                throw st.error("store is only for host compensation");
            }
            store = source.toAbsolutePath().getParent().resolve(st.text("a folder")).normalize();
        }
        return new FixturePlan(terminals, mode, standards, load == null ? null : load.value(), reuse, store, load);
    }

    /**
     * The load standard's stated value, {@code 100 ohm} or {@code {r, x, u_r, u_x, k}}: u_r and u_x
     * as stated (standard uncertainties, or expanded ones with their coverage factor k), 0 when
     * not stated.
     */
    private static UncertainImpedance load(YamlNode node) {
        if (node.isMap()) {
            YamlNode.YamlMap lm = node.map("load", LOAD_KEYS);
            double r = Units.parse(lm.required("r"), Unit.OHM);
            double x = lm.optional("x").map(n -> Units.parse(n, Unit.OHM)).orElse(0.0);
            double ur = lm.optional("u_r").map(n -> Units.parse(n, Unit.OHM, Unit.Bound.NON_NEGATIVE)).orElse(0.0);
            double ux = lm.optional("u_x").map(n -> Units.parse(n, Unit.OHM, Unit.Bound.NON_NEGATIVE)).orElse(0.0);
            double k = 1;
            if (lm.has("k")) {
                YamlNode kn = lm.required("k");
                if (!lm.has("u_r") && !lm.has("u_x")) {
                    throw kn.error("k given but no u_r or u_x to divide by it");
                }
                k = Units.parse(kn, Unit.NONE, Unit.Bound.POSITIVE);
            }
            return new UncertainImpedance(new Impedance(Double.NaN, r, x), ur / k, ux / k, 0);
        }
        return UncertainImpedance.exact(new Impedance(Double.NaN, Units.parse(node, Unit.OHM), 0.0));
    }

    // ---- part ----

    private static Part part(YamlNode node) {
        YamlNode.YamlMap m = node.map("part", PART_KEYS);
        YamlNode kn = m.required("kind");
        PartKind kind = PartKind.ofWord(word(kn, "part kind", PartKind.words())).orElseThrow();
        String name = m.optional("name").map(n -> n.text("a part name")).orElse("");
        YamlNode nn = m.required("nominal");
        Unit unit = switch (kind) {
            case CAPACITOR -> Unit.FARAD;
            case INDUCTOR, TRANSFORMER -> Unit.HENRY;
            case RESISTOR -> Unit.OHM;
        };
        double nominal = Units.parse(nn, unit, Unit.Bound.POSITIVE);
        double tolerance = m.optional("tolerance").map(t -> tolerance(t, kind, nominal)).orElse(Double.NaN);
        double turns = Double.NaN;
        if (m.has("turns_ratio")) {
            YamlNode tn = m.required("turns_ratio");
            if (kind != PartKind.TRANSFORMER) {
                throw tn.error("turns_ratio is only for a transformer");
            }
            turns = turnsRatio(tn);
        }
        return new Part(kind, name, nominal, tolerance, turns);
    }

    private static double tolerance(YamlNode node, PartKind kind, double nominal) {
        String text = node.text("a tolerance");
        if (text.matches("[A-Za-z]")) {
            OptionalDouble p = ToleranceCode.symmetricPercent(text.charAt(0), kind == PartKind.CAPACITOR, nominal);
            if (p.isEmpty()) {
                throw node.error("unknown tolerance letter '" + text + "': expected one of "
                        + ToleranceCode.symmetricLetters() + " (IEC 60062) or a percentage such as ±10 %");
            }
            return p.getAsDouble();
        }
        return Units.percent(node, "a tolerance letter (IEC 60062) or");
    }

    private static double turnsRatio(YamlNode node) {
        String text = node.text("a turns ratio");
        Matcher m = Pattern.compile("((?:\\d+(?:\\.\\d*)?|\\.\\d+))\\s*(?::\\s*((?:\\d+(?:\\.\\d*)?|\\.\\d+)))?")
                .matcher(text);
        if (!m.matches()) {
            throw node.error("expected a turns ratio N1:N2 such as 4:1 or a number, got '" + text + "'");
        }
        double n1 = Double.parseDouble(m.group(1));
        double n2 = m.group(2) == null ? 1.0 : Double.parseDouble(m.group(2));
        if (n1 <= 0 || n2 <= 0) {
            throw node.error("expected a turns ratio above zero, got '" + text + "'");
        }
        return n1 / n2;
    }

    // ---- steps ----

    private List<StepSpec> steps(YamlNode node, Part part, SafetyLimits safety) {
        List<YamlNode> items = node.items("a list of steps");
        if (items.isEmpty()) {
            throw node.error("empty list: expected at least one step");
        }
        List<StepSpec> specs = new ArrayList<>();
        Map<String, YamlNode> names = new HashMap<>();
        long total = 0;
        for (YamlNode item : items) {
            StepSpec s = step(item, part, safety, names);
            total += s.pointCount();
            if (total > MAX_POINTS) {
                throw item.error("too many points: the sequence reaches " + total + " at step '" + s.name()
                        + "' (at most " + MAX_POINTS + ")");
            }
            specs.add(s);
        }
        return specs;
    }

    private StepSpec step(YamlNode node, Part part, SafetyLimits safety, Map<String, YamlNode> names) {
        YamlNode.YamlMap m = named(node, "step", STEP_KEYS, names);
        String name = m.values().get("name").text("");
        String step = "step '" + name + "'";
        String prompt = m.optional("prompt").map(p -> p.text("a prompt")).orElse("");
        boolean transformer = part.kind() == PartKind.TRANSFORMER;
        MeasuredQuantity quantity = MeasuredQuantity.IMPEDANCE;
        if (m.has("quantity")) {
            YamlNode qn = m.required("quantity");
            quantity = MeasuredQuantity.valueOf(
                    word(qn, "quantity", List.of("impedance", "voltage_ratio")).toUpperCase(Locale.ROOT));
            if (quantity == MeasuredQuantity.VOLTAGE_RATIO && !transformer) {
                throw qn.error("quantity voltage_ratio needs part kind transformer");
            }
        }
        Wiring wiring = Wiring.NONE;
        if (m.has("wiring")) {
            YamlNode wn = m.required("wiring");
            if (!transformer) {
                throw wn.error("wiring is only for a transformer");
            }
            wiring = Wiring.valueOf(word(wn, "wiring", List.of("secondary_open", "secondary_shorted"))
                    .toUpperCase(Locale.ROOT));
            if (quantity == MeasuredQuantity.VOLTAGE_RATIO && wiring == Wiring.SECONDARY_SHORTED) {
                throw wn.error("a voltage ratio needs the secondary open");
            }
        } else if (transformer) {
            throw node.error("missing key 'wiring' in " + step + " (secondary_open or secondary_shorted)");
        }
        AxisValues frequencies = AxisValues.read(m.required("frequency"), AxisValues.Kind.FREQUENCY);
        YamlNode levelNode = m.required("level");
        AxisValues levels = AxisValues.read(levelNode, AxisValues.Kind.LEVEL);
        checkLimit(levelNode, step, "drive level", levels, " rms", levels.unit() == Unit.VOLT
                ? new Limit("max_level_voltage", safety.maxLevelVrms())
                : new Limit("max_level_current", safety.maxLevelArms()));
        AxisValues bias = null;
        BiasControl control = BiasControl.NONE;
        if (m.has("bias")) {
            YamlNode bn = m.required("bias");
            if (bn.isMap()) {
                YamlNode.YamlMap bm = bn.map("bias", BIAS_KEYS);
                if (bm.has("values")) {
                    for (String k : AxisValues.RANGE_KEYS) {
                        if (bm.has(k)) {
                            throw bm.values().get(k).error("give either values or start/stop, not both");
                        }
                    }
                    bias = AxisValues.read(bm.required("values"), AxisValues.Kind.BIAS);
                } else {
                    bias = AxisValues.range(bm, AxisValues.Kind.BIAS);
                }
                Unit unit = bias.unit();
                double ramp = bm.optional("ramp").map(r -> Units.ratePerS(r, unit)).orElse(Double.POSITIVE_INFINITY);
                double settle = bm.optional("settle").map(s -> Units.parse(s, Unit.SECOND)).orElse(0.0);
                control = new BiasControl(ramp, settle);
            } else {
                bias = AxisValues.read(bn, AxisValues.Kind.BIAS);
            }
            checkLimit(bn, step, "DC bias", bias, "", bias.unit() == Unit.VOLT
                    ? new Limit("max_bias_voltage", safety.maxBiasVoltageV())
                    : new Limit("max_bias_current", safety.maxBiasCurrentA()));
        }
        List<StepSpec.Axis> order = m.optional("order").map(this::order).orElse(StepSpec.DEFAULT_ORDER);
        int averaging = m.optional("averaging").map(a -> Units.integer(a, "an averaging count", 1)).orElse(1);
        double integration = m.optional("integration").map(i -> Units.parse(i, Unit.SECOND, Unit.Bound.POSITIVE))
                .orElse(org.zweep.driver.meter.MeasurementSetting.DEFAULT_INTEGRATION_TIME_S);
        int repeats = m.optional("repeats").map(r -> Units.integer(r, "a repeat count", 1)).orElse(1);
        double delay = m.optional("delay").map(d -> Units.parse(d, Unit.SECOND)).orElse(0.0);
        ImpedanceRange range = m.optional("range").map(SequenceReader::range).orElse(ImpedanceRange.AUTO);
        AxisValues biasAxis = bias;
        List<Integer> derating = m.optional("derating").map(d -> deratingDrops(d, biasAxis, step)).orElse(List.of());
        StepSpec spec = new StepSpec(name, prompt, quantity, wiring, frequencies, levels, bias, control, order,
                averaging, integration, repeats, delay, range, derating, node);
        if (spec.pointCount() > MAX_POINTS) {
            throw node.error("too many points: " + step + " has " + spec.pointCount() + " (at most " + MAX_POINTS
                    + ")");
        }
        return spec;
    }

    /**
     * A step or check mapping with a valid {@code name} not seen before in {@code names} (which
     * it joins); unknown keys are reported with the item's name when it has one.
     */
    private static YamlNode.YamlMap named(YamlNode node, String kind, List<String> keys, Map<String, YamlNode> names) {
        YamlNode.YamlMap m = node.map(node.peek("name").map(n -> kind + " '" + n + "'").orElse("a " + kind), keys);
        YamlNode nameNode = m.required("name");
        String name = name(nameNode, "a " + kind + " name");
        YamlNode first = names.putIfAbsent(name, nameNode);
        if (first != null) {
            throw nameNode.error("duplicate " + kind + " name '" + name + "' (first at " + first.where() + ")");
        }
        return m;
    }

    private record Limit(String key, double value) {
    }

    private static void checkLimit(YamlNode node, String step, String what, AxisValues sweep, String rms, Limit limit) {
        double worst = sweep.maxAbs();
        if (worst > limit.value()) {
            throw node.error(step + ": " + what + " " + Units.format(worst, sweep.unit()) + rms + " exceeds safety "
                    + limit.key() + " " + Units.format(limit.value(), sweep.unit()));
        }
    }

    private static ImpedanceRange range(YamlNode node) {
        if (node.text("a range").equals("auto")) {
            return ImpedanceRange.AUTO;
        }
        return ImpedanceRange.hold(Units.parse(node, Unit.OHM, Unit.Bound.POSITIVE));
    }

    private List<StepSpec.Axis> order(YamlNode node) {
        List<String> keys = List.of("bias", "repeat", "level", "frequency");
        List<StepSpec.Axis> order = new ArrayList<>();
        for (YamlNode item : node.items("a list of axes")) {
            StepSpec.Axis a = StepSpec.Axis.valueOf(word(item, "axis", keys).toUpperCase(Locale.ROOT));
            if (order.contains(a)) {
                throw item.error("axis '" + a.key() + "' given twice");
            }
            order.add(a);
        }
        for (StepSpec.Axis a : StepSpec.DEFAULT_ORDER) {
            if (!order.contains(a)) {
                order.add(a);
            }
        }
        return List.copyOf(order);
    }

    // ---- checks ----

    /** A decision rule: {@code simple}, {@code guarded} or {@code probability P}. */
    private static DecisionRule rule(YamlNode node) {
        try {
            return DecisionRule.parse(node.text("a decision rule"));
        } catch (InvalidInputException e) {
            throw node.error(e.getMessage());
        }
    }

    private List<CheckLimit> checks(YamlNode node, List<StepSpec> steps, Part part, DecisionRule defaultRule) {
        Map<String, StepSpec> byName = new LinkedHashMap<>();
        steps.forEach(s -> byName.put(s.name(), s));
        Map<String, YamlNode> names = new HashMap<>();
        List<CheckLimit> out = new ArrayList<>();
        for (YamlNode item : node.items("a list of checks")) {
            CheckLimit c = check(item, byName, part, names);
            YamlNode r = item.map("a check", CHECK_KEYS).values().get("rule");
            out.add(c.withRule(r == null ? defaultRule : rule(r)));
        }
        return out;
    }

    private CheckLimit check(YamlNode node, Map<String, StepSpec> steps, Part part, Map<String, YamlNode> names) {
        YamlNode.YamlMap m = named(node, "check", CHECK_KEYS, names);
        String name = m.values().get("name").text("");
        String check = "check '" + name + "'";
        YamlNode stepNode = m.required("step");
        String stepName = stepNode.text("a step name");
        StepSpec step = steps.get(stepName);
        if (step == null) {
            throw stepNode.error("unknown step '" + stepName + "'" + Suggest.didYouMean(stepName, steps.keySet())
                    + "; steps are: " + String.join(", ", steps.keySet()));
        }
        YamlNode pn = m.required("parameter");
        String parameter = pn.text("a parameter");
        List<String> known = new ArrayList<>(POINT_PARAMETERS.keySet());
        known.add(SRF);
        known.add(SATURATION);
        Map<String, Unit> figures = part == null ? Map.of() : SWEEP_FIGURES.get(part.kind());
        known.addAll(new java.util.TreeSet<>(figures.keySet()));
        if (!known.contains(parameter)) {
            throw pn.error("unknown parameter '" + parameter + "'" + Suggest.didYouMean(parameter, known)
                    + "; expected one of: " + String.join(", ", known));
        }
        boolean ratio = parameter.equals("ratio");
        boolean ratioStep = step.quantity() == MeasuredQuantity.VOLTAGE_RATIO;
        if (ratio != ratioStep) {
            throw pn.error("parameter '" + parameter + "' needs " + (ratio ? "a voltage_ratio" : "an impedance")
                    + " step; step '" + stepName + "' measures " + step.quantity().name().toLowerCase(Locale.ROOT));
        }
        double frequencyHz = Double.NaN;
        double dropPercent = Double.NaN;
        Unit unit;
        if (parameter.equals(SRF) || figures.containsKey(parameter)) {
            unit = parameter.equals(SRF) ? Unit.HERTZ : figures.get(parameter);
            boolean transformer = List.of("turns_ratio", "k", "leakage_h", "mutual_h").contains(parameter);
            if (m.has("at")) {
                throw m.values().get("at").error(parameter + " is a whole-sweep figure: remove 'at'");
            }
            for (String k : List.of("bias", "level")) {
                if (m.has(k)) {
                    throw m.values().get(k).error(parameter + " is found on " + (transformer
                            ? "the run's transformer steps" : "the step's first fitted sweep") + ": remove '" + k + "'");
                }
            }
            if (!transformer && step.frequencies().values().size() < 2) {
                throw pn.error(parameter + " needs a frequency sweep; step '" + stepName + "' has one frequency");
            }
        } else if (parameter.equals(SATURATION)) {
            if (step.bias() == null || step.bias().values().size() < 2) {
                throw pn.error("saturation needs a bias sweep; step '" + stepName + "' has "
                        + (step.bias() == null ? "no bias" : "one bias value"));
            }
            unit = step.bias().unit();
            if (m.has("bias")) {
                throw m.values().get("bias").error("saturation finds the bias itself: remove 'bias'");
            }
            frequencyHz = !m.has("at") && step.frequencies().values().size() == 1
                    ? step.frequencies().values().get(0) : frequencyOf(m, node, step, check);
            if (!m.has("drop")) {
                throw node.error("missing key 'drop' in " + check + " (the fall in value, such as 30 %, at which"
                        + " the bias is read)");
            }
            dropPercent = wholePercent(m.required("drop"), "a drop");
        } else {
            unit = POINT_PARAMETERS.get(parameter);
            frequencyHz = frequencyOf(m, node, step, check);
        }
        if (m.has("drop") && !parameter.equals(SATURATION)) {
            throw m.values().get("drop").error("drop is only for parameter saturation");
        }
        double bias = Double.NaN;
        if (m.has("bias")) {
            YamlNode bn = m.required("bias");
            if (step.bias() == null) {
                throw bn.error("step '" + stepName + "' applies no bias: remove 'bias'");
            }
            bias = valueOf(bn, step.bias(), "bias value", step);
        }
        double level = m.optional("level").map(ln -> valueOf(ln, step.levels(), "drive level", step))
                .orElse(Double.NaN);
        double min = Double.NEGATIVE_INFINITY;
        double max = Double.POSITIVE_INFINITY;
        if (m.has("within")) {
            YamlNode wn = m.required("within");
            for (String k : List.of("min", "max")) {
                if (m.has(k)) {
                    throw m.values().get(k).error("give either within or min/max, not both");
                }
            }
            double nominal = nominalFor(wn, parameter, part);
            double percent;
            if (wn.text("tolerance or a percentage").equals("tolerance")) {
                if (Double.isNaN(part.tolerancePercent())) {
                    throw wn.error("within tolerance needs part tolerance");
                }
                percent = part.tolerancePercent();
            } else {
                percent = Units.percent(wn, "tolerance or");
            }
            min = Units.round(nominal * (1 - percent / 100.0));
            max = Units.round(nominal * (1 + percent / 100.0));
        } else {
            if (!m.has("min") && !m.has("max")) {
                throw node.error("missing key 'min', 'max' or 'within' in " + check);
            }
            if (m.has("min")) {
                min = Units.parse(m.required("min"), unit, Unit.Bound.ANY);
            }
            if (m.has("max")) {
                YamlNode xn = m.required("max");
                max = Units.parse(xn, unit, Unit.Bound.ANY);
                if (max < min) {
                    throw xn.error("max " + Units.format(max, unit) + " is below min " + Units.format(min, unit));
                }
            }
        }
        return new CheckLimit(name, parameter, stepName, new CheckLimit.Selection(frequencyHz, bias, level),
                new CheckLimit.Bounds(min, max), dropPercent);
    }

    private static double frequencyOf(YamlNode.YamlMap m, YamlNode node, StepSpec step, String check) {
        if (!m.has("at")) {
            throw node.error("missing key 'at' in " + check + " (the frequency the limit applies at)");
        }
        YamlNode at = m.required("at");
        double f = Units.parse(at, Unit.HERTZ);
        double nearest = Double.NaN;
        for (double v : step.frequencies().values()) {
            if (Math.abs(v - f) <= 1e-9 * Math.abs(f)) {
                return v;
            }
            if (Double.isNaN(nearest) || Math.abs(v - f) < Math.abs(nearest - f)) {
                nearest = v;
            }
        }
        throw at.error(Units.format(f, Unit.HERTZ) + " is not a frequency of step '" + step.name() + "' (nearest: "
                + Units.format(nearest, Unit.HERTZ) + ")");
    }

    /** The value of {@code node} in {@code sweep}'s unit, which must be one of the step's values of that axis. */
    private static double valueOf(YamlNode node, AxisValues sweep, String what, StepSpec step) {
        double v = Units.parse(node, sweep.unit(), Unit.Bound.ANY);
        double nearest = Double.NaN;
        for (double x : sweep.values()) {
            if (Math.abs(x - v) <= 1e-9 * Math.max(Math.abs(x), Math.abs(v))) {
                return x;
            }
            if (Double.isNaN(nearest) || Math.abs(x - v) < Math.abs(nearest - v)) {
                nearest = x;
            }
        }
        throw node.error(Units.format(v, sweep.unit()) + " is not a " + what + " of step '" + step.name()
                + "' (nearest: " + Units.format(nearest, sweep.unit()) + ")");
    }

    /** A percentage between 0 % and 100 % that is a whole number, such as {@code 30 %}. */
    private static int wholePercent(YamlNode node, String what) {
        double p = Units.percent(node, what);
        long rounded = Math.round(p);
        if (Math.abs(p - rounded) > 1e-9) {
            throw node.error("expected " + what + " as a whole percentage such as 30 %, got '" + node.text("") + "'");
        }
        return (int) rounded;
    }

    /** A step's {@code derating} list: whole percentages, each once, returned ascending. */
    private static List<Integer> deratingDrops(YamlNode node, AxisValues bias, String step) {
        if (bias == null || bias.values().size() < 2) {
            throw node.error("derating needs a bias sweep; " + step + " has " + (bias == null ? "no bias"
                    : "one bias value"));
        }
        List<YamlNode> items = node.items("a list of percentages");
        if (items.isEmpty()) {
            throw node.error("empty list: expected drops such as [10 %, 20 %, 30 %]");
        }
        java.util.TreeSet<Integer> drops = new java.util.TreeSet<>();
        for (YamlNode i : items) {
            if (!drops.add(wholePercent(i, "a drop"))) {
                throw i.error("drop '" + i.text("") + "' given twice");
            }
        }
        return List.copyOf(drops);
    }

    private static double nominalFor(YamlNode within, String parameter, Part part) {
        if (parameter.equals(FITTED_NOMINAL.get(part.kind()))) {
            return part.nominal();
        }
        if (parameter.equals("ratio")) {
            if (Double.isNaN(part.turnsRatio())) {
                throw within.error("within on ratio needs part turns_ratio");
            }
            return 1.0 / part.turnsRatio();
        }
        if (!NOMINAL_PARAMETERS.get(part.kind()).contains(parameter)) {
            throw within.error("within compares with the nominal " + Units.format(part.nominal(),
                    Unit.ofSymbol(part.nominalUnit()).orElse(Unit.NONE)) + ": for a " + part.kind().word()
                    + " use " + String.join(", ", NOMINAL_PARAMETERS.get(part.kind())) + ", not '" + parameter + "'");
        }
        return part.nominal();
    }
}
