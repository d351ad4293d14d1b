package org.zweep.driver.dialect;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;

/**
 * One command template of a dialect: literal text with placeholders such as {@code {frequency}}
 * or {@code {frequency:kHz}}, rendered with values in SI units. Immutable.
 */
final class Template {
    private static final String[] PREFIXES = {"p", "n", "u", "µ", "m", "", "k", "M", "G"};
    private static final int[] SHIFTS = {-12, -9, -6, -6, -3, 0, 3, 6, 9};

    /** A literal piece ({@code placeholder == null}) or a placeholder with its decimal point shift. */
    private record Piece(String literal, Placeholder placeholder, int pointShift) {
    }

    private final String text;
    private final List<Piece> pieces;

    private Template(String text, List<Piece> pieces) {
        this.text = text;
        this.pieces = List.copyOf(pieces);
    }

    /** The template as written in the dialect file. */
    String text() {
        return text;
    }

    /** Whether the template holds more than one message unit ({@code ;} outside quotes). */
    boolean compound() {
        boolean quoted = false;
        for (char c : text.toCharArray()) {
            if (c == '"') {
                quoted = !quoted;
            } else if (c == ';' && !quoted) {
                return true;
            }
        }
        return false;
    }

    /**
     * Fills in the placeholders.
     *
     * @param values by placeholder name: a {@code Double} in the placeholder's SI unit, a {@code List<Double>}
     *     for list placeholders, an {@code Integer} for counts
     */
    String render(Map<String, ?> values) {
        StringBuilder sb = new StringBuilder();
        for (Piece p : pieces) {
            if (p.placeholder == null) {
                sb.append(p.literal);
                continue;
            }
            Object v = values.get(p.placeholder.name());
            if (v == null) {
                throw new IllegalArgumentException("no value for {" + p.placeholder.name() + "} in " + text);
            }
            if (p.placeholder.list()) {
                @SuppressWarnings("unchecked")
                List<Double> list = (List<Double>) v;
                sb.append(list.stream().map(x -> Nr3.format(x, p.pointShift)).collect(Collectors.joining(",")));
            } else if (p.placeholder.unit().isEmpty()) {
                sb.append(((Integer) v).intValue());
            } else {
                sb.append(Nr3.format((Double) v, p.pointShift));
            }
        }
        return sb.toString();
    }

    /** Renders a template that has no placeholders. */
    String render() {
        return render(Map.of());
    }

    /**
     * Parses {@code text}, the value of {@code command}'s entry.
     *
     * @param errors reports a problem at a 0-based index into {@code text}
     */
    static Template parse(String text, Command command, ErrorSink errors) {
        return parse(text, command.key(), command.placeholders(), errors);
    }

    /** Parses {@code text}, the value of entry {@code key} whose placeholders are {@code placeholders}. */
    static Template parse(String text, String key, List<Placeholder> placeholders, ErrorSink errors) {
        List<Piece> pieces = new ArrayList<>();
        List<String> seen = new ArrayList<>();
        int i = 0;
        StringBuilder literal = new StringBuilder();
        while (i < text.length()) {
            char c = text.charAt(i);
            if (c == '}') {
                throw errors.at(i, "'}' without a matching '{'");
            }
            if (c != '{') {
                literal.append(c);
                i++;
                continue;
            }
            int close = text.indexOf('}', i);
            if (close < 0) {
                throw errors.at(i, "'{' without a closing '}'");
            }
            String inside = text.substring(i + 1, close);
            int colon = inside.indexOf(':');
            String name = colon < 0 ? inside : inside.substring(0, colon);
            int nameIndex = i + 1;
            Placeholder placeholder = placeholders.stream().filter(s -> s.name().equals(name)).findFirst()
                    .orElseThrow(() -> errors.at(nameIndex, unknownPlaceholder(name, key, placeholders)));
            int shift = 0;
            if (colon >= 0) {
                String unit = inside.substring(colon + 1);
                shift = shiftFor(unit, placeholder, errors, i + 2 + colon);
            }
            if (literal.length() > 0) {
                pieces.add(new Piece(literal.toString(), null, 0));
                literal.setLength(0);
            }
            pieces.add(new Piece(null, placeholder, shift));
            seen.add(name);
            i = close + 1;
        }
        if (literal.length() > 0) {
            pieces.add(new Piece(literal.toString(), null, 0));
        }
        for (Placeholder s : placeholders) {
            if (!seen.contains(s.name())) {
                throw errors.at(0, "command '" + key + "' must contain {" + s.name() + "}");
            }
        }
        return new Template(text, pieces);
    }

    private static String unknownPlaceholder(String name, String key, List<Placeholder> placeholders) {
        if (placeholders.isEmpty()) {
            return "command '" + key + "' takes no placeholder, found {" + name + "}";
        }
        return "unknown placeholder {" + name + "} in '" + key + "' (it takes "
                + placeholders.stream().map(s -> "{" + s.name() + "}").collect(Collectors.joining(" ")) + ")";
    }

    private static int shiftFor(String unit, Placeholder placeholder, ErrorSink errors, int index) {
        if (placeholder.unit().isEmpty()) {
            throw errors.at(index, "{" + placeholder.name() + "} is a plain count and takes no unit");
        }
        for (int k = 0; k < PREFIXES.length; k++) {
            if (unit.equals(PREFIXES[k] + placeholder.unit())) {
                return SHIFTS[k];
            }
        }
        throw errors.at(index, "unit '" + unit + "' does not fit {" + placeholder.name() + "}: expected " + placeholder.unit()
                + " with an optional SI prefix (p n u m k M G)");
    }

    /** Builds the exception for a problem at an index into the text being parsed. */
    interface ErrorSink {
        RuntimeException at(int index, String message);
    }
}
