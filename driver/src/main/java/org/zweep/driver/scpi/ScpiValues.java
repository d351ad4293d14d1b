package org.zweep.driver.scpi;

import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Parsers for SCPI response data (IEEE 488.2 §8.7): numbers, lists and error-queue entries.
 * Stateless and thread-safe.
 */
public final class ScpiValues {
    /** NR1, NR2 or NR3 (IEEE 488.2 §8.7.2–8.7.4), allowing the forgiving forms {@code .5} and {@code 5.}. */
    private static final Pattern NRF = Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");
    private static final Pattern ERROR = Pattern.compile("([+-]?\\d+)\\s*(?:,\\s*(.*))?", Pattern.DOTALL);

    /** SCPI's not-a-number, 9.91E37 (SCPI-1999 Vol 1 §7.2.1.5). */
    public static final double SCPI_NAN = 9.91e37;
    /** SCPI's infinity, 9.9E37 (SCPI-1999 Vol 1 §7.2.1.4); its negative is minus infinity. */
    public static final double SCPI_INFINITY = 9.9e37;

    private ScpiValues() {
    }

    /**
     * Parses one NR1/NR2/NR3 number; SCPI's 9.91E37 becomes {@link Double#NaN}, ±9.9E37 become
     * ±infinity. Surrounding spaces are allowed.
     *
     * @throws NumberFormatException if {@code text} is not a decimal number
     */
    public static double parseNumber(String text) {
        String t = text.strip();
        if (!NRF.matcher(t).matches()) {
            throw new NumberFormatException("'" + t + "' is not a decimal number");
        }
        return special(Double.parseDouble(t));
    }

    /** Maps SCPI's special values (9.91E37 NaN, ±9.9E37 infinity) onto the IEEE 754 ones; others unchanged. */
    public static double special(double v) {
        if (v == SCPI_NAN) {
            return Double.NaN;
        }
        if (v == SCPI_INFINITY) {
            return Double.POSITIVE_INFINITY;
        }
        if (v == -SCPI_INFINITY) {
            return Double.NEGATIVE_INFINITY;
        }
        return v;
    }

    /**
     * Splits a response at commas that are not inside a quoted string; elements are stripped of
     * spaces but keep their quotes. An empty response is an empty list.
     */
    public static List<String> splitList(String text) {
        List<String> out = new ArrayList<>();
        if (text.isBlank()) {
            return out;
        }
        StringBuilder cur = new StringBuilder();
        char quote = 0;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (quote != 0) {
                if (c == quote) {
                    quote = 0;
                }
                cur.append(c);
            } else if (c == '"' || c == '\'') {
                quote = c;
                cur.append(c);
            } else if (c == ',') {
                out.add(cur.toString().strip());
                cur.setLength(0);
            } else {
                cur.append(c);
            }
        }
        out.add(cur.toString().strip());
        return out;
    }

    /**
     * Splits a response message at {@code ;} outside quoted strings: one piece per query of a
     * message that held several (IEEE 488.2 §8.4.1). Pieces are not stripped; one piece for a
     * response without {@code ;}.
     */
    public static List<String> splitUnits(String text) {
        List<String> out = new ArrayList<>();
        boolean quoted = false;
        int start = 0;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c == '"') {
                quoted = !quoted;
            } else if (c == ';' && !quoted) {
                out.add(text.substring(start, i));
                start = i + 1;
            }
        }
        out.add(text.substring(start));
        return out;
    }

    /**
     * Parses a comma-separated list of NR1/NR2/NR3 numbers as {@link #parseNumber} does each; a
     * blank response is an empty array.
     *
     * @throws NumberFormatException whose message is the first element that is not a number, stripped
     */
    public static double[] parseNumbers(String text) {
        if (text.isBlank()) {
            return new double[0];
        }
        String[] parts = text.split(",", -1);
        double[] values = new double[parts.length];
        for (int i = 0; i < parts.length; i++) {
            try {
                values[i] = parseNumber(parts[i]);
            } catch (NumberFormatException e) {
                throw new NumberFormatException(parts[i].strip());
            }
        }
        return values;
    }

    /**
     * Decodes a block of IEEE 754 doubles ({@code FORMat REAL,64}) in {@code order}; SCPI's
     * special values are mapped as in {@link #parseNumber}.
     *
     * @throws IllegalArgumentException when the length is not a multiple of 8
     */
    public static double[] real64(byte[] block, java.nio.ByteOrder order) {
        if (block.length % Double.BYTES != 0) {
            throw new IllegalArgumentException("a REAL,64 block of " + block.length
                    + " bytes is not a whole number of 8-byte values");
        }
        double[] out = new double[block.length / Double.BYTES];
        java.nio.ByteBuffer.wrap(block).order(order).asDoubleBuffer().get(out);
        for (int i = 0; i < out.length; i++) {
            out[i] = special(out[i]);
        }
        return out;
    }

    /** {@code text} cut to 60 characters for a one-line message ({@code ...} marks the cut). */
    public static String abbreviate(String text) {
        return text.length() <= 60 ? text : text.substring(0, 57) + "...";
    }

    /**
     * Parses a {@code SYSTem:ERRor?} reply, {@code <code>,"<message>"} (SCPI-1999 Vol 2 §21.8);
     * a doubled quote inside the message is one quote.
     *
     * @throws NumberFormatException if the reply does not start with an integer code
     */
    public static ScpiError parseError(String reply) {
        Matcher m = ERROR.matcher(reply.strip());
        if (!m.matches()) {
            throw new NumberFormatException("'" + reply.strip() + "' is not an error entry <code>,\"<message>\"");
        }
        int code = Integer.parseInt(m.group(1).startsWith("+") ? m.group(1).substring(1) : m.group(1));
        String msg = m.group(2) == null ? "" : m.group(2).strip();
        if (msg.length() >= 2 && msg.startsWith("\"") && msg.endsWith("\"")) {
            msg = msg.substring(1, msg.length() - 1).replace("\"\"", "\"");
        }
        return new ScpiError(code, msg);
    }

    /**
     * Shows bytes safely on one line: printable ASCII as is, {@code \n \r \t \\} escaped, every other
     * byte as {@code \xNN}; past {@code limit} bytes the rest is summarised as a count.
     */
    public static String escape(byte[] data, int offset, int length, int limit) {
        StringBuilder sb = new StringBuilder(Math.min(length, limit) + 16);
        int shown = Math.min(length, limit);
        for (int i = 0; i < shown; i++) {
            int b = data[offset + i] & 0xff;
            switch (b) {
                case '\n' -> sb.append("\\n");
                case '\r' -> sb.append("\\r");
                case '\t' -> sb.append("\\t");
                case '\\' -> sb.append("\\\\");
                default -> {
                    if (b >= 0x20 && b < 0x7f) {
                        sb.append((char) b);
                    } else {
                        sb.append(String.format("\\x%02X", b));
                    }
                }
            }
        }
        if (shown < length) {
            sb.append("... (").append(length - shown).append(" more bytes)");
        }
        return sb.toString();
    }
}
