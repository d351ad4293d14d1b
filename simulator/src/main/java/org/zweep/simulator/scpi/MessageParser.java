package org.zweep.simulator.scpi;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Splits one program message (terminator already removed) into message units, one at a time, so
 * that units before a syntax error are executed (IEEE 488.2 §7.3–§7.7). Not thread-safe.
 */
final class MessageParser {
    private static final int MAX_MANTISSA_DIGITS = 255; // IEEE 488.2 §7.7.2.4.1
    private static final int MAX_EXPONENT = 32000; // IEEE 488.2 §7.7.2.4.1

    private final byte[] m;
    private int pos;
    private boolean first = true;

    MessageParser(byte[] message) {
        this.m = message;
    }

    /** IEEE 488.2 §7.4.1.2 white space: 0x00–0x09 and 0x0B–0x20 (so a CR before LF is ignored). */
    static boolean isWhite(int c) {
        return c >= 0 && c <= 0x20 && c != 0x0A;
    }

    /** Whether another unit follows. */
    boolean hasNext() {
        skipWhite();
        return pos < m.length;
    }

    /**
     * Parses the next unit; throws {@link ScpiException} with a -1xx error on bad syntax. Returns
     * {@code null} when only a trailing {@code ;} was left.
     */
    ProgramUnit next() {
        skipWhite();
        if (!first) {
            if (peek() != ';') {
                throw new ScpiException(StandardError.INVALID_SEPARATOR, "expected ; at column " + (pos + 1));
            }
            pos++;
            skipWhite();
        }
        first = false;
        if (pos >= m.length) {
            return null;
        }
        ProgramUnit unit = header();
        skipWhite();
        if (pos < m.length && peek() != ';') {
            throw new ScpiException(StandardError.INVALID_SEPARATOR, "at column " + (pos + 1));
        }
        return unit;
    }

    private ProgramUnit header() {
        boolean common = false;
        boolean rooted = false;
        List<Mnemonic> mnemonics = new ArrayList<>(4);
        if (peek() == '*') {
            common = true;
            pos++;
            mnemonics.add(mnemonic());
        } else {
            if (peek() == ':') {
                rooted = true;
                pos++;
            }
            mnemonics.add(mnemonic());
            while (peek() == ':') {
                pos++;
                mnemonics.add(mnemonic());
            }
        }
        boolean query = false;
        if (peek() == '?') {
            query = true;
            pos++;
        }
        List<Param> params = List.of();
        int c = peek();
        if (c == -1 || c == ';') {
            return new ProgramUnit(common, rooted, List.copyOf(mnemonics), query, params);
        }
        if (!isWhite(c)) {
            // data glued to the header is a separator error (IEEE 488.2 §7.4.3); any other character is invalid
            boolean dataStart = c == '"' || c == '\'' || c == '#' || c == '(' || c == '+' || c == '-' || c == '.';
            throw new ScpiException(dataStart ? StandardError.HEADER_SEPARATOR_ERROR : StandardError.INVALID_CHARACTER,
                    "at column " + (pos + 1));
        }
        skipWhite();
        c = peek();
        if (c != -1 && c != ';') {
            params = params();
        }
        return new ProgramUnit(common, rooted, List.copyOf(mnemonics), query, params);
    }

    private Mnemonic mnemonic() {
        int start = pos;
        int c = peek();
        if (!isAlpha(c)) {
            if (c == -1 || c == ':' || c == '?' || c == ';' || isWhite(c)) {
                throw new ScpiException(StandardError.SYNTAX_ERROR, "missing mnemonic at column " + (pos + 1));
            }
            throw new ScpiException(StandardError.INVALID_CHARACTER, "at column " + (pos + 1));
        }
        while (isAlpha(peek()) || peek() == '_') {
            pos++;
        }
        int letters = pos;
        while (isDigit(peek())) {
            pos++;
        }
        if (isAlpha(peek()) || peek() == '_') {
            throw new ScpiException(StandardError.INVALID_CHARACTER, "at column " + (pos + 1));
        }
        if (pos - start > Mnemonics.MAX_LENGTH) {
            throw new ScpiException(StandardError.PROGRAM_MNEMONIC_TOO_LONG, text(start, pos));
        }
        String name = Param.upper(text(start, letters));
        int suffix = 1;
        if (pos > letters) {
            String digits = text(letters, pos);
            suffix = digits.length() > 6 ? Integer.MAX_VALUE : Integer.parseInt(digits);
        }
        return new Mnemonic(name, suffix);
    }

    private List<Param> params() {
        List<Param> out = new ArrayList<>(2);
        while (true) {
            out.add(param());
            skipWhite();
            int c = peek();
            if (c == ',') {
                pos++;
                skipWhite();
                if (peek() == -1 || peek() == ';' || peek() == ',') {
                    throw new ScpiException(StandardError.SYNTAX_ERROR, "missing data after , at column " + (pos + 1));
                }
                continue;
            }
            return out;
        }
    }

    private Param param() {
        int c = peek();
        if (c == '"' || c == '\'') {
            return string((char) c);
        }
        if (c == '#') {
            int d = peekAt(pos + 1);
            if (isDigit(d)) {
                return block();
            }
            return nonDecimal();
        }
        if (c == '(') {
            throw new ScpiException(StandardError.EXPRESSION_DATA_NOT_ALLOWED, "at column " + (pos + 1));
        }
        if (isDigit(c) || c == '+' || c == '-' || c == '.') {
            return decimal();
        }
        if (isAlpha(c)) {
            int start = pos;
            while (isAlpha(peek()) || isDigit(peek()) || peek() == '_') {
                pos++;
            }
            if (pos - start > Mnemonics.MAX_LENGTH) {
                throw new ScpiException(StandardError.CHARACTER_DATA_TOO_LONG, text(start, pos));
            }
            return new Param.Chars(Param.upper(text(start, pos)));
        }
        throw new ScpiException(StandardError.INVALID_CHARACTER, "at column " + (pos + 1));
    }

    private Param string(char quote) {
        StringBuilder b = new StringBuilder();
        pos++;
        while (true) {
            int c = peek();
            if (c == -1) {
                throw new ScpiException(StandardError.INVALID_STRING_DATA, "missing closing " + quote);
            }
            pos++;
            if (c == quote) {
                if (peek() == quote) {
                    b.append(quote);
                    pos++;
                    continue;
                }
                return new Param.Str(b.toString());
            }
            b.append((char) c);
        }
    }

    private Param block() {
        pos++;
        int n = peek() - '0';
        pos++;
        if (n == 0) {
            byte[] rest = Arrays.copyOfRange(m, pos, m.length);
            pos = m.length;
            return new Param.Block(rest);
        }
        if (pos + n > m.length) {
            throw new ScpiException(StandardError.INVALID_BLOCK_DATA, "block header cut short");
        }
        long len = 0;
        for (int i = 0; i < n; i++) {
            int d = m[pos + i];
            if (!isDigit(d)) {
                throw new ScpiException(StandardError.INVALID_BLOCK_DATA, "non-digit in block length");
            }
            len = len * 10 + (d - '0');
        }
        pos += n;
        if (pos + len > m.length) {
            throw new ScpiException(StandardError.INVALID_BLOCK_DATA, "block shorter than its length " + len);
        }
        byte[] data = Arrays.copyOfRange(m, pos, pos + (int) len);
        pos += (int) len;
        return new Param.Block(data);
    }

    private Param nonDecimal() {
        pos++;
        int radix;
        switch (Character.toUpperCase(peek())) {
            case 'H' -> radix = 16;
            case 'Q' -> radix = 8;
            case 'B' -> radix = 2;
            default -> throw new ScpiException(StandardError.INVALID_CHARACTER, "after # at column " + (pos + 1));
        }
        pos++;
        int start = pos;
        while (Character.digit(peek(), radix) >= 0) {
            pos++;
        }
        if (pos == start || isAlpha(peek()) || isDigit(peek())) {
            throw new ScpiException(StandardError.INVALID_CHARACTER_IN_NUMBER, "at column " + (pos + 1));
        }
        String digits = text(start, pos);
        if (digits.length() > 15) {
            throw new ScpiException(StandardError.TOO_MANY_DIGITS, digits);
        }
        return new Param.Decimal(Long.parseLong(digits, radix), "");
    }

    private Param decimal() {
        int start = pos;
        if (peek() == '+' || peek() == '-') {
            pos++;
        }
        int digits = 0;
        while (isDigit(peek())) {
            pos++;
            digits++;
        }
        if (peek() == '.') {
            pos++;
            while (isDigit(peek())) {
                pos++;
                digits++;
            }
        }
        if (digits == 0) {
            throw new ScpiException(StandardError.NUMERIC_DATA_ERROR, "no digits at column " + (start + 1));
        }
        if (digits > MAX_MANTISSA_DIGITS) {
            throw new ScpiException(StandardError.TOO_MANY_DIGITS, null);
        }
        int mantissaEnd = pos;
        long exponent = 0;
        int expStart = exponentStart();
        if (expStart >= 0) {
            pos = expStart;
            boolean negative = false;
            if (peek() == '+' || peek() == '-') {
                negative = peek() == '-';
                pos++;
            }
            while (isDigit(peek())) {
                exponent = Math.min(exponent * 10 + (peek() - '0'), 1_000_000);
                pos++;
            }
            if (exponent > MAX_EXPONENT) {
                throw new ScpiException(StandardError.EXPONENT_TOO_LARGE, null);
            }
            exponent = negative ? -exponent : exponent;
        }
        if (peek() == '.' || isDigit(peek())) {
            throw new ScpiException(StandardError.INVALID_CHARACTER_IN_NUMBER, "at column " + (pos + 1));
        }
        double value = Double.parseDouble(text(start, mantissaEnd) + "E" + exponent);
        int afterNumber = pos;
        skipWhite();
        if (isAlpha(peek())) {
            int s = pos;
            while (isAlpha(peek()) || isDigit(peek()) || peek() == '/' || peek() == '.') {
                pos++;
            }
            if (pos - s > Mnemonics.MAX_LENGTH) {
                throw new ScpiException(StandardError.SUFFIX_TOO_LONG, text(s, pos));
            }
            return new Param.Decimal(value, Param.upper(text(s, pos)));
        }
        pos = afterNumber;
        return new Param.Decimal(value, "");
    }

    /** Where the exponent's sign or digits start if an exponent follows, else -1. */
    private int exponentStart() {
        int p = pos;
        while (p < m.length && m[p] == ' ') {
            p++;
        }
        if (p >= m.length || (m[p] != 'E' && m[p] != 'e')) {
            return -1;
        }
        p++;
        while (p < m.length && m[p] == ' ') {
            p++;
        }
        int q = p;
        if (q < m.length && (m[q] == '+' || m[q] == '-')) {
            q++;
        }
        return q < m.length && isDigit(m[q]) ? p : -1;
    }

    private void skipWhite() {
        while (pos < m.length && isWhite(m[pos] & 0xFF)) {
            pos++;
        }
    }

    private int peek() {
        return pos < m.length ? m[pos] & 0xFF : -1;
    }

    private int peekAt(int p) {
        return p < m.length ? m[p] & 0xFF : -1;
    }

    private String text(int from, int to) {
        return new String(m, from, to - from, StandardCharsets.ISO_8859_1);
    }

    private static boolean isAlpha(int c) {
        return (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z');
    }

    private static boolean isDigit(int c) {
        return c >= '0' && c <= '9';
    }
}
