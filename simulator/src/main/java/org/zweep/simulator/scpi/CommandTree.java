package org.zweep.simulator.scpi;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The command tree as data: documented headers such as {@code [SENSe:]IMPedance:RANGe[:UPPer]}
 * or {@code SOURce:FREQuency[:CW]?} (a trailing {@code ?} declares the query form) each mapped
 * to a {@link Handler}; common commands are declared as {@code *IDN?}. Immutable and
 * thread-safe once built.
 */
public final class CommandTree {
    private record Entry(HeaderPattern pattern, boolean query, Handler handler) {
    }

    private final List<Entry> entries;
    private final Map<String, Handler> common;

    private CommandTree(List<Entry> entries, Map<String, Handler> common) {
        this.entries = List.copyOf(entries);
        this.common = Map.copyOf(common);
    }

    /** A new, empty builder. */
    public static Builder builder() {
        return new Builder();
    }

    /** Collects header patterns and their handlers; the first matching declaration wins. */
    public static final class Builder {
        private final List<Entry> entries = new ArrayList<>();
        private final Map<String, Handler> common = new HashMap<>();

        private Builder() {
        }

        /** Declares {@code header} (e.g. {@code SOURce:FREQuency[:CW]?} or {@code *RST}). */
        public Builder on(String header, Handler handler) {
            boolean query = header.endsWith("?");
            String h = query ? header.substring(0, header.length() - 1) : header;
            if (h.startsWith("*")) {
                common.put(Param.upper(h.substring(1)) + (query ? "?" : ""), handler);
            } else {
                entries.add(new Entry(HeaderPattern.parse(h), query, handler));
            }
            return this;
        }

        /** The tree. */
        public CommandTree build() {
            return new CommandTree(entries, common);
        }
    }

    /** The handler of a common command, or -113. */
    Handler common(Mnemonic m, boolean query) {
        Handler h = m.suffix() == 1 ? common.get(m.name() + (query ? "?" : "")) : null;
        if (h == null) {
            throw new ScpiException(StandardError.UNDEFINED_HEADER, "*" + m.name() + (query ? "?" : ""));
        }
        return h;
    }

    /** The handler for a full header (path already applied): -113 if none, -114 on a bad suffix. */
    Handler resolve(List<Mnemonic> header, boolean query) {
        for (Entry e : entries) {
            if (e.query() == query && e.pattern().matches(header)) {
                for (Mnemonic m : header) {
                    if (m.suffix() != 1) {
                        throw new ScpiException(StandardError.HEADER_SUFFIX_OUT_OF_RANGE, m.name() + m.suffix());
                    }
                }
                return e.handler();
            }
        }
        throw new ScpiException(StandardError.UNDEFINED_HEADER, describe(header, query));
    }

    /** Every declared header, in declaration order (for {@code SYSTem:HELP:HEADers?}). */
    List<String> headers() {
        List<String> out = new ArrayList<>();
        for (Entry e : entries) {
            out.add(e.pattern().text() + (e.query() ? "?" : ""));
        }
        return out;
    }

    static String describe(List<Mnemonic> header, boolean query) {
        StringBuilder b = new StringBuilder();
        for (Mnemonic m : header) {
            if (b.length() > 0) {
                b.append(':');
            }
            b.append(m.name());
            if (m.suffix() != 1) {
                b.append(m.suffix());
            }
        }
        return b.append(query ? "?" : "").toString();
    }
}
