package org.zweep.runner.sequence;

import org.zweep.config.YamlNode;
import java.math.BigDecimal;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;

/**
 * Values with units in sequence files, checked per field: each field names the unit it expects
 * and anything else is an error at the value's position. Numbers and units follow the project's
 * human-input grammar ({@link Quantities}: {@code 100 nF}, {@code 1.5kHz}, {@code 4k7},
 * {@code 10 kohm}); this class adds only the field-level forms a sequence needs on top of it:
 * a source value in V or A, a ramp rate in V/s or A/s, a ± percentage, and durations in minutes,
 * hours or days.
 */
final class Units {
    private Units() {
    }

    /** The node's value in {@code unit} with the unit's default bound (frequencies positive, times not negative). */
    static double parse(YamlNode node, Unit unit) {
        return parse(node, unit, unit.defaultBound());
    }

    /** The node's value in {@code unit}, which must satisfy {@code bound}. */
    static double parse(YamlNode node, Unit unit, Unit.Bound bound) {
        String text = node.text(unit == Unit.NONE ? "a number" : "a value in " + unit.symbol());
        try {
            return Quantities.parse(text, unit, bound);
        } catch (InvalidInputException e) {
            throw node.error(e.getMessage());
        }
    }

    /**
     * A source value (drive level or DC bias) in V or A ({@link SourceValues#parse}); the unit must
     * be written, since it decides whether the source is a voltage or a current.
     *
     * @param only when not {@code null}, the one unit accepted (the unit of earlier values)
     */
    static SourceValues.Value source(YamlNode node, String kind, Unit only, Unit.Bound bound) {
        String text = node.text(kind);
        try {
            return SourceValues.parse(text, kind, only, bound);
        } catch (InvalidInputException e) {
            throw node.error(e.getMessage());
        }
    }

    /** A ramp rate in {@code unit}/s ({@link SourceValues#ratePerS}: {@code 1 V/s}, {@code 500 mA/s}), above zero. */
    static double ratePerS(YamlNode node, Unit unit) {
        String text = node.text("a ramp rate");
        try {
            return SourceValues.ratePerS(text, unit);
        } catch (InvalidInputException e) {
            throw node.error(e.getMessage());
        }
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

    private static final Pattern PERCENT = Pattern.compile("(?:±|\\+-|\\+/-)?\\s*([^±]*%)");

    /** A percentage such as {@code ±10 %}, {@code 10%} or {@code +-0.5 %}; the number of percent. */
    static double percent(YamlNode node, String kind) {
        String text = node.text(kind);
        Matcher m = PERCENT.matcher(text);
        double fraction = Double.NaN;
        if (m.matches()) {
            try {
                fraction = Quantities.parse(m.group(1), Unit.NONE);
            } catch (InvalidInputException e) {
                fraction = Double.NaN;
            }
        }
        if (!(fraction > 0 && fraction < 1)) {
            throw node.error("expected " + kind + " as a percentage between 0 % and 100 % such as ±10 %, got '"
                    + text + "'");
        }
        return fraction * 100.0;
    }

    private static final Pattern LONG_DURATION = Pattern.compile("((?:\\d+(?:\\.\\d*)?|\\.\\d+))\\s*(min|h|d)");

    /** A duration such as {@code 90 s}, {@code 30 min}, {@code 2h} or {@code 1 d}, in seconds. */
    static double durationS(YamlNode node, String kind) {
        String text = node.text(kind);
        Matcher m = LONG_DURATION.matcher(text);
        if (m.matches()) {
            double scale = switch (m.group(2)) {
                case "min" -> 60.0;
                case "h" -> 3600.0;
                default -> 86400.0;
            };
            return Double.parseDouble(m.group(1)) * scale;
        }
        try {
            return Quantities.parse(text, Unit.SECOND);
        } catch (InvalidInputException e) {
            throw node.error("expected " + kind + " in s, min, h or d (e.g. 90 s, 30 min, 2h), got '" + text + "'");
        }
    }

    /** {@code value} for messages with as many digits as it needs, e.g. {@code 30 V}, {@code 1.5 kHz}. */
    static String format(double value, Unit unit) {
        return Quantities.formatShort(value, unit, 12);
    }

    /** {@code v} rounded to 12 significant digits, so that computed grid points print and compare cleanly. */
    static double round(double v) {
        if (v == 0.0 || !Double.isFinite(v)) {
            return v;
        }
        return new BigDecimal(v).round(new java.math.MathContext(12)).doubleValue();
    }
}
