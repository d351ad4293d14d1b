package org.zweep.runner.sequence;

import java.util.List;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Values with units in sequence files, checked per field: each field names the unit it
 * expects and anything else is an error at the value's position.
 *
 * <p>Grammar: a decimal number, optional spaces, an optional SI prefix (p n u µ m k M G T; {@code u}, {@code µ} and {@code μ} all mean micro) and
 * the unit symbol ({@code 100 nF}, {@code 1.5kHz}, {@code 25 V}, {@code 1 V/s}, {@code 10 kohm};
 * ohms as {@code Ω}, {@code ohm} or {@code ohms}). A dimensional field needs its unit; a bare
 * number is accepted only where the quantity has none (D, Q, a ratio, a count).
 */
final class Units {
    private static final Pattern NUMBER_AND_UNIT =
            Pattern.compile("([+-]?(?:\\d+(?:\\.\\d*)?|\\.\\d+)(?:[eE][+-]?\\d+)?)\\s*(\\S*(?:\\s*/\\s*\\S+)?)");
    private static final String PREFIXES = "pnuµμmkMGT";
    private static final double[] MULTIPLIERS = {1e-12, 1e-9, 1e-6, 1e-6, 1e-6, 1e-3, 1e3, 1e6, 1e9, 1e12};

    private Units() {
    }

    /** A value in SI units and the unit symbol it was given in (one of the field's units). */
    record Value(double si, String unit) {
    }

    /**
     * The node's value in {@code unit} (SI, prefix applied). {@code kind} names the quantity for
     * the message, e.g. {@code "a frequency"}.
     */
    static double parse(YamlNode node, String kind, String unit) {
        return parseAny(node, kind, List.of(unit)).si();
    }

    /** The node's value in one of {@code units}; the error lists them all. */
    static Value parseAny(YamlNode node, String kind, List<String> units) {
        String text = node.text(kind);
        Value v = tryParse(text, units);
        if (v == null || !Double.isFinite(v.si())) {
            throw node.error("expected " + kind + " " + describe(units) + ", got '" + text + "'");
        }
        return v;
    }

    private static String describe(List<String> units) {
        List<String> named = units.stream().filter(u -> !u.isEmpty()).toList();
        if (named.isEmpty()) {
            return "(a plain number)";
        }
        return "in " + String.join(" or ", named) + (named.size() < units.size() ? " (or a plain number)" : "");
    }

    /** A plain number without unit (D, Q, a ratio). */
    static double number(YamlNode node, String kind) {
        return parseAny(node, kind, List.of("")).si();
    }

    /** A whole number of at least {@code min}. */
    static int integer(YamlNode node, String kind, int min) {
        String text = node.text(kind);
        int n;
        try {
            n = Integer.parseInt(text);
        } catch (NumberFormatException e) {
            throw node.error("expected " + kind + " (a whole number), got '" + text + "'");
        }
        if (n < min) {
            throw node.error("expected " + kind + " of at least " + min + ", got " + n);
        }
        return n;
    }

    /** A percentage such as {@code ±10 %}, {@code 10%} or {@code +-0.5 %}; the number of percent. */
    static double percent(YamlNode node, String kind) {
        String text = node.text(kind);
        Matcher m = Pattern.compile("(?:±|\\+-|\\+/-)?\\s*((?:\\d+(?:\\.\\d*)?|\\.\\d+))\\s*%").matcher(text);
        if (!m.matches()) {
            throw node.error("expected " + kind + " as a percentage such as ±10 %, got '" + text + "'");
        }
        return Double.parseDouble(m.group(1));
    }

    private static final Pattern DURATION =
            Pattern.compile("((?:\\d+(?:\\.\\d*)?|\\.\\d+))\\s*(ms|s|min|h|d)");

    /** A duration such as {@code 90 s}, {@code 30 min}, {@code 2h} or {@code 1 d}, in seconds. */
    static double durationS(YamlNode node, String kind) {
        String text = node.text(kind);
        Matcher m = DURATION.matcher(text);
        if (!m.matches()) {
            throw node.error("expected " + kind + " in ms, s, min, h or d, got '" + text + "'");
        }
        double n = Double.parseDouble(m.group(1));
        return n * switch (m.group(2)) {
            case "ms" -> 1e-3;
            case "s" -> 1.0;
            case "min" -> 60.0;
            case "h" -> 3600.0;
            default -> 86400.0;
        };
    }

    /** The parsed value, or {@code null} when the text is not a number in one of {@code units}. */
    static Value tryParse(String text, List<String> units) {
        Matcher m = NUMBER_AND_UNIT.matcher(text.strip());
        if (!m.matches()) {
            return null;
        }
        double number = Double.parseDouble(m.group(1));
        String rest = normaliseOhm(m.group(2).replaceAll("\\s+", ""));
        for (String unit : units) {
            if (rest.equals(unit)) {
                return new Value(number, unit);
            }
            if (!unit.isEmpty() && rest.length() == unit.length() + 1 && rest.endsWith(unit)) {
                int p = PREFIXES.indexOf(rest.charAt(0));
                if (p >= 0) {
                    return new Value(number * MULTIPLIERS[p], unit);
                }
            }
        }
        return null;
    }

    private static String normaliseOhm(String rest) {
        String lower = rest.toLowerCase(Locale.ROOT);
        for (String alias : List.of("ohms", "ohm")) {
            if (lower.endsWith(alias)) {
                return rest.substring(0, rest.length() - alias.length()) + "Ω";
            }
        }
        return rest;
    }

    /** {@code value} with an SI prefix for messages, e.g. {@code 30 V}, {@code 1.5 kHz}, {@code 100 nF}. */
    static String format(double value, String unit) {
        if (value == 0.0 || unit.isEmpty()) {
            return trim(value) + (unit.isEmpty() ? "" : " " + unit);
        }
        double a = Math.abs(value);
        String[] names = {"p", "n", "µ", "m", "", "k", "M", "G", "T"};
        double[] scale = {1e-12, 1e-9, 1e-6, 1e-3, 1.0, 1e3, 1e6, 1e9, 1e12};
        int i = 4;
        for (int k = scale.length - 1; k >= 0; k--) {
            if (a >= scale[k] * (1 - 1e-12)) {
                i = k;
                break;
            }
            i = 0;
        }
        return trim(round(value / scale[i])) + " " + names[i] + unit;
    }

    private static String trim(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return Long.toString((long) v);
        }
        return Double.toString(v);
    }

    /** {@code v} rounded to 12 significant digits, so that computed grid points print and compare cleanly. */
    static double round(double v) {
        if (v == 0.0 || !Double.isFinite(v)) {
            return v;
        }
        return new java.math.BigDecimal(v).round(new java.math.MathContext(12)).doubleValue();
    }
}
