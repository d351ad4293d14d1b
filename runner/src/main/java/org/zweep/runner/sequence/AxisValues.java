package org.zweep.runner.sequence;

import org.zweep.config.YamlNode;
import java.util.ArrayList;
import java.util.List;
import org.zweep.driver.impedance.Unit;

/**
 * The values of one sweep axis (frequency, drive level or DC bias), read from a single value, an
 * explicit list, or a mapping {@code {start, stop, points}} (linear; {@code spacing: log} for
 * logarithmic) or {@code {start, stop, per_decade}} (logarithmic).
 *
 * @param values the values in SI units, in sweep order
 * @param unit the unit they were given in (hertz, or volt or ampere for a source)
 * @param node where they were given, for later complaints
 */
record AxisValues(List<Double> values, Unit unit, YamlNode node) {
    /** The most values one axis may hold. */
    static final int MAX_VALUES = 100_000;

    static final List<String> RANGE_KEYS = List.of("start", "stop", "points", "per_decade", "spacing");

    /** What an axis sweeps: its name in messages, and whether it is a source in V or A. */
    enum Kind {
        FREQUENCY("a frequency", false, Unit.Bound.POSITIVE),
        LEVEL("a drive level", true, Unit.Bound.POSITIVE),
        BIAS("a DC bias", true, Unit.Bound.ANY);

        final String noun;
        final boolean source;
        final Unit.Bound bound;

        Kind(String noun, boolean source, Unit.Bound bound) {
            this.noun = noun;
            this.source = source;
            this.bound = bound;
        }

        /** One value; a source must be in {@code only} when that is not {@code null}. */
        SourceValues.Value value(YamlNode node, Unit only) {
            if (source) {
                return Units.source(node, noun, only, bound);
            }
            return new SourceValues.Value(Units.parse(node, Unit.HERTZ, bound), Unit.HERTZ);
        }
    }

    AxisValues {
        values = List.copyOf(values);
    }

    /** Reads an axis given as a value, a list or a range mapping. */
    static AxisValues read(YamlNode node, Kind kind) {
        if (node.isMap()) {
            return range(node.map(kind.noun + " sweep", RANGE_KEYS), kind);
        }
        if (node.isList()) {
            List<YamlNode> items = node.items(kind.noun);
            if (items.isEmpty()) {
                throw node.error("empty list: expected at least one value (" + kind.noun + ")");
            }
            if (items.size() > MAX_VALUES) {
                throw node.error("too many values: " + items.size() + " (at most " + MAX_VALUES + ")");
            }
            List<Double> values = new ArrayList<>();
            Unit unit = null;
            for (YamlNode item : items) {
                SourceValues.Value v = kind.value(item, unit);
                unit = v.unit();
                values.add(v.si());
            }
            return new AxisValues(values, unit, node);
        }
        SourceValues.Value v = kind.value(node, null);
        return new AxisValues(List.of(v.si()), v.unit(), node);
    }

    /** Reads a {@code {start, stop, points | per_decade, spacing}} mapping already checked for its keys. */
    static AxisValues range(YamlNode.YamlMap m, Kind kind) {
        YamlNode startNode = m.required("start");
        SourceValues.Value start = kind.value(startNode, null);
        YamlNode stopNode = m.required("stop");
        SourceValues.Value stop = kind.value(stopNode, start.unit());
        if (stop.si() < start.si()) {
            throw stopNode.error("stop " + Units.format(stop.si(), stop.unit()) + " is below start "
                    + Units.format(start.si(), start.unit()));
        }
        if (stop.si() == start.si()) {
            throw stopNode.error("stop equals start: give a single value instead of a sweep");
        }
        boolean log = false;
        if (m.has("spacing")) {
            YamlNode sp = m.required("spacing");
            String s = sp.text("a spacing");
            if (!s.equals("log") && !s.equals("linear")) {
                throw sp.error("expected spacing log or linear, got '" + s + "'");
            }
            log = s.equals("log");
        }
        List<Double> values = new ArrayList<>();
        if (m.has("per_decade")) {
            YamlNode pd = m.required("per_decade");
            if (m.has("points")) {
                throw pd.error("give either points or per_decade, not both");
            }
            if (m.has("spacing") && !log) {
                throw pd.error("per_decade needs log spacing");
            }
            int perDecade = Units.integer(pd, "points per decade", 1);
            checkLogStart(startNode, start);
            double decades = Math.log10(stop.si() / start.si());
            long steps = (long) Math.floor(decades * perDecade + 1e-9);
            if (steps + 2 > MAX_VALUES) {
                throw pd.error("too many points: " + (steps + 1) + " (at most " + MAX_VALUES + ")");
            }
            for (long k = 0; k <= steps; k++) {
                values.add(Units.round(start.si() * Math.pow(10.0, (double) k / perDecade)));
            }
            double last = values.get(values.size() - 1);
            if (Math.abs(last - stop.si()) > 1e-9 * stop.si()) {
                values.add(stop.si());
            }
        } else {
            YamlNode pn = m.required("points");
            int points = Units.integer(pn, "a number of points", 2);
            if (points > MAX_VALUES) {
                throw pn.error("too many points: " + points + " (at most " + MAX_VALUES + ")");
            }
            if (log) {
                checkLogStart(startNode, start);
            }
            for (int i = 0; i < points; i++) {
                double f = (double) i / (points - 1);
                double v = log ? start.si() * Math.pow(stop.si() / start.si(), f)
                        : start.si() + f * (stop.si() - start.si());
                values.add(i == points - 1 ? stop.si() : Units.round(v));
            }
        }
        return new AxisValues(values, start.unit(), m.self());
    }

    private static void checkLogStart(YamlNode startNode, SourceValues.Value start) {
        if (start.si() <= 0) {
            throw startNode.error("a logarithmic sweep needs a start above zero, got '" + startNode.text("") + "'");
        }
    }

    /** The largest magnitude among the values. */
    double maxAbs() {
        return values.stream().mapToDouble(Math::abs).max().orElse(0.0);
    }
}
