package org.zweep.driver.impedance;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.zweep.driver.InvalidInputException;

/**
 * Quantities typed by a person: parsing with SI prefixes, units and the IEC 60062
 * letter-and-numeral (RKM) code, and formatting in engineering notation.
 *
 * <p>This is the <b>human-input grammar</b> only. SPICE netlists and SCPI parameters have their
 * own grammars and parsers elsewhere; never feed their text to this class.
 *
 * <pre>
 * text      = ws* ( decimal | rkm ) ws*
 * decimal   = number ws* suffix?
 * number    = sign? ( digits [ "." digits? ] | "." digits ) [ ("e"|"E") sign? digits ]
 * suffix    = unit | prefix [ unit ] | "R" (ohms only) | "%" (plain numbers only)
 * rkm       = sign? digits? letter digits [ ws* unit ]     e.g. 4k7, R47, 2M2, 4u7, 1F5
 * letter    = a prefix letter | "R" (ohms: unity) | "L" (ohms: milli) | "F" (farads: unity)
 * prefix    = "f" | "p" | "n" | "u" | "µ" | "μ" | "m" | "k" | "K" | "M" | "Meg" | "meg" | "MEG"
 *             | "G" | "T"
 * </pre>
 *
 * <p>Prefixes are case-sensitive as in SI: {@code m} is milli and {@code M} is mega, so
 * {@code mHz} is millihertz. {@code Meg}, {@code meg} and {@code MEG} are also accepted for mega,
 * {@code K} for kilo and {@code u} for micro. A space may separate the number from its suffix but
 * not a prefix from its unit. The unit may be omitted ({@code 100n} for 100 nF); a different
 * unit than the one expected is an error. In the RKM code the letter takes the place of the
 * decimal point ({@code 4k7} = 4.7 k, {@code R47} = 0.47 Ω); {@code E} is not an RKM letter here
 * because {@code 4E7} is the number 4×10⁷. Tolerance letters after a code are not accepted.
 *
 * <p>Stateless and thread-safe.
 */
public final class Quantities {

    private static final Pattern NUMBER =
            Pattern.compile("[+-]?(?:\\d+(?:\\.\\d*)?|\\.\\d+)(?:[eE][+-]?\\d+)?");
    private static final Pattern RKM = Pattern.compile("([+-]?)(\\d*)([fpnuµμmkKMGTRLF])(\\d+)");
    private static final String WS = "[\\s\\u00A0\\u202F]*";
    private static final Map<String, Integer> PREFIXES = Map.ofEntries(
            Map.entry("f", -15), Map.entry("p", -12), Map.entry("n", -9), Map.entry("u", -6),
            Map.entry("µ", -6), Map.entry("μ", -6), Map.entry("m", -3), Map.entry("k", 3),
            Map.entry("K", 3), Map.entry("M", 6), Map.entry("G", 9), Map.entry("T", 12));
    private static final String[] MEGA = {"Meg", "meg", "MEG"};
    private static final String ENGINEERING_PREFIXES = "fpnµm kMGT";

    private Quantities() {
    }

    /**
     * Parses {@code text} as a value of {@code unit}, enforcing the unit's
     * {@linkplain Unit#defaultBound() default bound} (frequencies positive, durations not negative).
     *
     * @return the value in the SI base unit (farads, hertz, ...)
     * @throws InvalidInputException if the text is empty, not a quantity, has another unit, or is
     *         out of range; the one-line message quotes the text and says what was expected
     */
    public static double parse(String text, Unit unit) {
        return parse(text, unit, unit.defaultBound());
    }

    /**
     * Parses {@code text} as a value of {@code unit} that must satisfy {@code bound}, for example
     * {@link Unit.Bound#POSITIVE} for an inductance given as a magnitude.
     *
     * @return the value in the SI base unit
     * @throws InvalidInputException as {@link #parse(String, Unit)}
     */
    public static double parse(String text, Unit unit, Unit.Bound bound) {
        double value = parseUnbounded(text, unit);
        if (value == 0.0) {
            value = 0.0;
        }
        if (bound == Unit.Bound.POSITIVE && value <= 0.0) {
            throw new InvalidInputException(quoted(text) + " is not a valid " + unit.noun()
                    + ": it must be greater than zero");
        }
        if (bound == Unit.Bound.NON_NEGATIVE && value < 0.0) {
            throw new InvalidInputException(quoted(text) + " is not a valid " + unit.noun()
                    + ": it must not be negative");
        }
        return value;
    }

    private static double parseUnbounded(String text, Unit unit) {
        String s = text == null ? "" : text.replaceAll("^[\\s\\u00A0\\u202F]+|[\\s\\u00A0\\u202F]+$", "");
        if (s.isEmpty()) {
            throw new InvalidInputException("empty value; expected " + expectation(unit));
        }
        Matcher rkm = RKM.matcher(s);
        if (rkm.lookingAt()) {
            return fromRkm(text, s, rkm, unit);
        }
        Matcher number = NUMBER.matcher(s);
        if (!number.lookingAt()) {
            throw new InvalidInputException(quoted(text) + " is not a number; expected " + expectation(unit));
        }
        String suffix = s.substring(number.end()).replaceFirst("^" + WS, "");
        int exponent = suffixExponent(text, suffix, unit);
        return toDouble(text, number.group(), exponent);
    }

    private static double fromRkm(String text, String s, Matcher rkm, Unit unit) {
        String letter = rkm.group(3);
        Integer exponent = rkmLetterExponent(letter, unit);
        if (exponent == null) {
            throw new InvalidInputException(quoted(text) + ": the code letter " + letter + " does not belong to "
                    + unit.description() + "; expected " + expectation(unit));
        }
        String rest = s.substring(rkm.end()).replaceFirst("^" + WS, "");
        if (!rest.isEmpty() && !unit.isSpelledAs(rest)) {
            throw unitError(text, rest, unit);
        }
        String whole = rkm.group(2).isEmpty() ? "0" : rkm.group(2);
        return toDouble(text, rkm.group(1) + whole + "." + rkm.group(4), exponent);
    }

    private static Integer rkmLetterExponent(String letter, Unit unit) {
        switch (letter) {
            case "R":
                return unit == Unit.OHM ? 0 : null;
            case "L":
                return unit == Unit.OHM ? -3 : null;
            case "F":
                return unit == Unit.FARAD ? 0 : null;
            default:
                return unit.allowsPrefixes() ? PREFIXES.get(letter) : null;
        }
    }

    private static int suffixExponent(String text, String suffix, Unit unit) {
        if (suffix.isEmpty() || unit.isSpelledAs(suffix)) {
            return 0;
        }
        if (unit == Unit.OHM && suffix.equals("R")) {
            return 0;
        }
        if (unit == Unit.NONE && suffix.equals("%")) {
            return -2;
        }
        String rest = null;
        int exponent = 0;
        for (String mega : MEGA) {
            if (suffix.startsWith(mega)) {
                rest = suffix.substring(mega.length());
                exponent = 6;
                break;
            }
        }
        if (rest == null) {
            String first = suffix.substring(0, suffix.offsetByCodePoints(0, 1));
            Integer e = PREFIXES.get(first);
            if (e != null) {
                rest = suffix.substring(first.length());
                exponent = e;
            }
        }
        if (rest != null && (rest.isEmpty() || unit.isSpelledAs(rest))) {
            if (!unit.allowsPrefixes()) {
                throw new InvalidInputException(quoted(text) + ": " + unit.description()
                        + " takes no SI prefix; expected " + expectation(unit));
            }
            return exponent;
        }
        throw unitError(text, rest != null && otherUnit(rest) != null ? rest : suffix, unit);
    }

    private static InvalidInputException unitError(String text, String found, Unit unit) {
        Unit other = otherUnit(found);
        if (other != null && other != unit) {
            return new InvalidInputException(quoted(text) + " has the wrong unit " + found + "; expected "
                    + expectation(unit));
        }
        return new InvalidInputException(quoted(text) + " has an unknown unit or prefix \"" + found
                + "\"; expected " + expectation(unit));
    }

    private static Unit otherUnit(String spelling) {
        for (Unit u : Unit.values()) {
            if (u.isSpelledAs(spelling)) {
                return u;
            }
        }
        return null;
    }

    private static double toDouble(String text, String decimal, int exponent) {
        double value;
        try {
            value = new BigDecimal(decimal).scaleByPowerOfTen(exponent).doubleValue();
        } catch (NumberFormatException | ArithmeticException e) {
            value = Double.POSITIVE_INFINITY;
        }
        if (Double.isInfinite(value)) {
            throw new InvalidInputException(quoted(text) + " is out of range");
        }
        return value;
    }

    private static String expectation(Unit unit) {
        String in = unit.symbol().isEmpty() || unit == Unit.DEGREE ? "" : " in " + unit.symbol();
        return unit.description() + in + ", e.g. " + unit.example();
    }

    private static String quoted(String text) {
        return "\"" + text + "\"";
    }

    /**
     * Formats {@code value} in engineering notation with exactly {@code significantDigits}
     * digits and the unit's symbol, e.g. {@code format(1e-7, FARAD, 3)} gives {@code "100 nF"} and
     * {@code format(4700, OHM, 2)} gives {@code "4.7 kΩ"}. Outside the prefixes f…T the exponent is
     * written out ({@code 1.00e-18 F}). Degrees and plain numbers get no prefix ({@code -89.96°},
     * {@code 1592}). Infinite values are written {@code ∞} or {@code -∞}, zero as {@code 0}.
     *
     * @param significantDigits 1 or more
     */
    public static String format(double value, Unit unit, int significantDigits) {
        if (significantDigits < 1) {
            throw new IllegalArgumentException("significantDigits must be at least 1: " + significantDigits);
        }
        String separator = unit == Unit.DEGREE || unit == Unit.NONE ? "" : " ";
        if (Double.isNaN(value)) {
            return "NaN" + separator + unit.symbol();
        }
        if (Double.isInfinite(value)) {
            return (value < 0 ? "-∞" : "∞") + separator + unit.symbol();
        }
        if (value == 0.0) {
            return "0" + separator + unit.symbol();
        }
        BigDecimal rounded = new BigDecimal(value).round(new MathContext(significantDigits, RoundingMode.HALF_EVEN));
        int exponent = rounded.precision() - rounded.scale() - 1;
        if (unit == Unit.NONE || unit == Unit.DEGREE) {
            return plain(rounded, exponent, significantDigits) + separator + unit.symbol();
        }
        int engineering = Math.floorDiv(exponent, 3) * 3;
        if (engineering < -15 || engineering > 12) {
            return scientific(rounded, exponent, significantDigits) + separator + unit.symbol();
        }
        BigDecimal mantissa = rounded.movePointLeft(engineering);
        int scale = Math.max(0, significantDigits - 1 - (exponent - engineering));
        char prefix = ENGINEERING_PREFIXES.charAt(engineering / 3 + 5);
        String p = prefix == ' ' ? "" : String.valueOf(prefix);
        return mantissa.setScale(scale, RoundingMode.HALF_EVEN).toPlainString() + separator + p + unit.symbol();
    }

    /**
     * Formats {@code value} as {@link #format(double, Unit, int)} does, rounded to at most
     * {@code maxSignificantDigits} digits and without trailing zeros: {@code 100 nF},
     * {@code 1.5 kHz}, {@code 1.259 kHz} for 1258.9 Hz with 4 digits. Meant for set values and
     * summaries, where the exact digit count carries no meaning.
     *
     * @param maxSignificantDigits 1 or more
     */
    public static String formatShort(double value, Unit unit, int maxSignificantDigits) {
        if (maxSignificantDigits < 1) {
            throw new IllegalArgumentException("maxSignificantDigits must be at least 1: " + maxSignificantDigits);
        }
        int digits = 1;
        if (Double.isFinite(value) && value != 0.0) {
            digits = Math.max(1, new BigDecimal(value)
                    .round(new MathContext(maxSignificantDigits, RoundingMode.HALF_EVEN))
                    .stripTrailingZeros().precision());
        }
        return format(value, unit, digits);
    }

    /**
     * The SI prefix of an engineering exponent, as {@link #format} writes it: {@code "µ"} for −6,
     * {@code "k"} for 3, {@code ""} for 0.
     *
     * @param exponent a multiple of 3 from −15 to 12
     */
    public static String prefix(int exponent) {
        if (exponent % 3 != 0 || exponent < -15 || exponent > 12) {
            throw new IllegalArgumentException("not an engineering exponent from -15 to 12: " + exponent);
        }
        char p = ENGINEERING_PREFIXES.charAt(exponent / 3 + 5);
        return p == ' ' ? "" : String.valueOf(p);
    }

    private static String plain(BigDecimal rounded, int exponent, int significantDigits) {
        if (exponent < -6 || exponent > 12) {
            return scientific(rounded, exponent, significantDigits);
        }
        int scale = Math.max(0, significantDigits - 1 - exponent);
        return rounded.setScale(scale, RoundingMode.HALF_EVEN).toPlainString();
    }

    private static String scientific(BigDecimal rounded, int exponent, int significantDigits) {
        BigDecimal mantissa = rounded.movePointLeft(exponent).setScale(significantDigits - 1, RoundingMode.HALF_EVEN);
        return mantissa.toPlainString() + "e" + exponent;
    }
}
