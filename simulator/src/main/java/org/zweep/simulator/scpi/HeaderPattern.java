package org.zweep.simulator.scpi;

import java.util.ArrayList;
import java.util.List;

/**
 * A header as documented, e.g. {@code [SENSe:]IMPedance:RANGe[:UPPer]}: mnemonics in
 * documentation case (upper case = short form), optional nodes in brackets (SCPI-1999 Vol 1
 * §6.2.1–6.2.2). Matches typed headers on exact short or long forms, any case.
 */
final class HeaderPattern {
    record Node(String documented, boolean optional) {
    }

    private final String text;
    private final List<Node> nodes;

    private HeaderPattern(String text, List<Node> nodes) {
        this.text = text;
        this.nodes = nodes;
    }

    /** Parses a documented header without its trailing {@code ?}. */
    static HeaderPattern parse(String documented) {
        List<Node> nodes = new ArrayList<>();
        int i = 0;
        String s = documented;
        while (i < s.length()) {
            boolean optional = false;
            if (s.charAt(i) == '[') {
                optional = true;
                i++;
            }
            if (i < s.length() && s.charAt(i) == ':') {
                i++;
            }
            int start = i;
            while (i < s.length() && Character.isLetterOrDigit(s.charAt(i))) {
                i++;
            }
            if (i == start) {
                throw new IllegalArgumentException("bad header pattern " + documented);
            }
            nodes.add(new Node(s.substring(start, i), optional));
            if (i < s.length() && s.charAt(i) == ':' && optional) {
                i++;
            }
            if (optional) {
                if (i >= s.length() || s.charAt(i) != ']') {
                    throw new IllegalArgumentException("unclosed [ in header pattern " + documented);
                }
                i++;
            }
        }
        return new HeaderPattern(documented, List.copyOf(nodes));
    }

    String text() {
        return text;
    }

    /**
     * Whether {@code typed} names this header. Numeric suffixes are not compared here: the caller
     * reports any suffix other than 1 as -114.
     */
    boolean matches(List<Mnemonic> typed) {
        return match(0, typed, 0);
    }

    private boolean match(int pi, List<Mnemonic> typed, int ti) {
        if (pi == nodes.size()) {
            return ti == typed.size();
        }
        Node node = nodes.get(pi);
        if (ti < typed.size() && Mnemonics.matches(node.documented(), typed.get(ti).name())
                && match(pi + 1, typed, ti + 1)) {
            return true;
        }
        return node.optional() && match(pi + 1, typed, ti);
    }
}
