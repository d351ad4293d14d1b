package org.zweep.simulator.netlist;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.zweep.simulator.SimulatorInputException;

/** Turns netlist text into element records; checks each line on its own (syntax and values). */
final class NetlistParser {

    static final String HI = "hi";
    static final String LO = "lo";

    /**
     * One element line.
     *
     * @param kind R, L, C or K
     * @param name the name as written
     * @param nodeA first node (for K: the first inductor's name), lower case
     * @param nodeB second node (for K: the second inductor's name), lower case
     * @param value ohms, henries, farads, or the coupling coefficient
     * @param line 1-based line of the element's name
     * @param column 1-based column of the element's name
     * @param nodeColumns columns of the two node tokens
     */
    record Element(char kind, String name, String nodeA, String nodeB, double value, int line,
            int column, int[] nodeColumns) {
        String key() {
            return name.toLowerCase(Locale.ROOT);
        }

        int nodeColumn(int side) {
            return nodeColumns[side];
        }
    }

    private record Token(String text, int line, int column) {
    }

    private NetlistParser() {
    }

    static List<Element> parse(String text, String source, int firstLine, int indent) {
        if (text.length() > Netlist.MAX_TEXT_CHARS) {
            throw new SimulatorInputException(source + ": the netlist is longer than " + Netlist.MAX_TEXT_CHARS
                    + " characters (the limit)");
        }
        List<List<Token>> statements = new ArrayList<>();
        String[] lines = text.split("\r?\n|\r", -1);
        for (int i = 0; i < lines.length; i++) {
            int lineNo = firstLine + i;
            String line = lines[i];
            String trimmed = line.strip();
            if (trimmed.isEmpty() || trimmed.startsWith("*")) {
                continue;
            }
            if (trimmed.toLowerCase(Locale.ROOT).equals(".end")) {
                break;
            }
            boolean continuation = trimmed.startsWith("+");
            List<List<Token>> pieces = tokenize(line, lineNo, indent, continuation);
            if (continuation) {
                if (statements.isEmpty()) {
                    throw SimulatorInputException.at(source, lineNo,
                            indent + line.indexOf('+') + 1,
                            "a continuation line '+' with no element line before it");
                }
                statements.get(statements.size() - 1).addAll(pieces.get(0));
                pieces.remove(0);
            }
            for (List<Token> piece : pieces) {
                if (!piece.isEmpty()) {
                    if (statements.size() == Netlist.MAX_ELEMENTS) {
                        Token t = piece.get(0);
                        throw SimulatorInputException.at(source, t.line(), t.column(),
                                "more than " + Netlist.MAX_ELEMENTS + " elements (the limit)");
                    }
                    statements.add(piece);
                }
            }
        }
        List<Element> elements = new ArrayList<>();
        Map<String, Element> byName = new HashMap<>();
        for (List<Token> statement : statements) {
            Element e = element(statement, source);
            Element before = byName.put(e.key(), e);
            if (before != null) {
                throw SimulatorInputException.at(source, e.line(), e.column(),
                        "element " + e.name() + " is already defined on line " + before.line());
            }
            elements.add(e);
        }
        return elements;
    }

    /** Splits a line into statements at ';', each a list of whitespace-separated tokens. */
    private static List<List<Token>> tokenize(String line, int lineNo, int indent,
            boolean continuation) {
        List<List<Token>> statements = new ArrayList<>();
        List<Token> current = new ArrayList<>();
        int i = continuation ? line.indexOf('+') + 1 : 0;
        while (i < line.length()) {
            char c = line.charAt(i);
            if (c == ';') {
                statements.add(current);
                current = new ArrayList<>();
                i++;
            } else if (Character.isWhitespace(c)) {
                i++;
            } else {
                int start = i;
                while (i < line.length() && !Character.isWhitespace(line.charAt(i))
                        && line.charAt(i) != ';') {
                    i++;
                }
                current.add(new Token(line.substring(start, i), lineNo, indent + start + 1));
            }
        }
        statements.add(current);
        return statements;
    }

    private static Element element(List<Token> tokens, String source) {
        Token head = tokens.get(0);
        String name = head.text();
        char kind = Character.toUpperCase(name.charAt(0));
        if (name.startsWith(".")) {
            throw SimulatorInputException.at(source, head.line(), head.column(),
                    "directive '" + name + "' is not allowed in a device netlist (only element"
                            + " lines R, L, C, K and .end)");
        }
        if ("RLCK".indexOf(kind) < 0) {
            throw SimulatorInputException.at(source, head.line(), head.column(),
                    "unsupported element '" + name + "': a device netlist has only R, L, C and K"
                            + " elements");
        }
        if (tokens.size() != 4) {
            String form = kind == 'K' ? "K<name> <inductor> <inductor> <coupling>"
                    : kind + "<name> <node> <node> <value>";
            Token at = tokens.size() > 4 ? tokens.get(4) : tokens.get(tokens.size() - 1);
            throw SimulatorInputException.at(source, at.line(), at.column(),
                    name + ": expected '" + form + "', found " + tokens.size() + " fields");
        }
        Token a = tokens.get(1);
        Token b = tokens.get(2);
        Token v = tokens.get(3);
        double value;
        try {
            value = SpiceValue.parse(v.text());
        } catch (IllegalArgumentException ex) {
            throw SimulatorInputException.at(source, v.line(), v.column(),
                    name + ": bad value: " + ex.getMessage());
        }
        if (kind == 'K') {
            if (!(value > 0 && value <= 1)) {
                throw SimulatorInputException.at(source, v.line(), v.column(),
                        name + ": coupling must be greater than 0 and at most 1, not " + v.text());
            }
        } else if (!(value >= 0) || Double.isInfinite(value) || (kind == 'C' && value == 0)) {
            throw SimulatorInputException.at(source, v.line(), v.column(), name + ": "
                    + (kind == 'C' ? "capacitance must be greater than 0" : "value must be 0 (a"
                    + " wire) or greater") + ", not " + v.text());
        }
        String nodeA = node(a.text(), kind);
        String nodeB = node(b.text(), kind);
        if (kind != 'K' && nodeA.equals(nodeB)) {
            throw SimulatorInputException.at(source, b.line(), b.column(),
                    name + " has both ends on node '" + nodeA + "'");
        }
        return new Element(kind, name, nodeA, nodeB, value, head.line(), head.column(),
                new int[] {a.column(), b.column()});
    }

    private static String node(String text, char kind) {
        String n = text.toLowerCase(Locale.ROOT);
        return kind != 'K' && n.equals("0") ? LO : n;
    }
}
