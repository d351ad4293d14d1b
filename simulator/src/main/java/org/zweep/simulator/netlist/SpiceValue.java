package org.zweep.simulator.netlist;

import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * SPICE numbers: a decimal number with an optional exponent, then an optional scale suffix
 * ({@code f p n u m k meg g t}, case-insensitive, so {@code m} is milli and {@code meg} mega), then
 * optional unit letters that are ignored ({@code 100nF}, {@code 4.7kOhm}, {@code 10uH}). Anything
 * else after the number, such as the digit in {@code 4k7}, is an error, and so is {@code mil}.
 */
final class SpiceValue {

    private static final Pattern NUMBER =
            Pattern.compile("[+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?");

    private SpiceValue() {
    }

    /**
     * @param text the value as written
     * @return the value, scaled by its suffix
     * @throws IllegalArgumentException with a short reason if {@code text} is not a SPICE number
     */
    static double parse(String text) {
        Matcher m = NUMBER.matcher(text);
        if (!m.lookingAt()) {
            throw new IllegalArgumentException("'" + text + "' is not a number");
        }
        double number = Double.parseDouble(m.group());
        String rest = text.substring(m.end()).toLowerCase(Locale.ROOT);
        if (!rest.chars().allMatch(c -> c >= 'a' && c <= 'z')) {
            throw new IllegalArgumentException("'" + text + "' has characters after the number that"
                    + " are neither a scale suffix nor unit letters");
        }
        if (rest.startsWith("mil")) {
            throw new IllegalArgumentException("'" + text + "': the suffix 'mil' is not supported");
        }
        return number * scale(rest);
    }

    private static double scale(String suffix) {
        if (suffix.startsWith("meg")) {
            return 1e6;
        }
        if (suffix.isEmpty()) {
            return 1;
        }
        switch (suffix.charAt(0)) {
            case 'f': return 1e-15;
            case 'p': return 1e-12;
            case 'n': return 1e-9;
            case 'u': return 1e-6;
            case 'm': return 1e-3;
            case 'k': return 1e3;
            case 'g': return 1e9;
            case 't': return 1e12;
            default: return 1;
        }
    }
}
