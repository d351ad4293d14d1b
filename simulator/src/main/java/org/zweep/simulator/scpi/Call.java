package org.zweep.simulator.scpi;

import java.util.List;

/**
 * One unit being executed: its session and its parameters, with the parameter rules of
 * SCPI-1999 Vol 1 §7 (numeric values with MINimum/MAXimum/DEFault, booleans, character data).
 */
public final class Call {
    private final Session session;
    private final List<Param> params;
    private final String header;

    Call(Session session, List<Param> params, String header) {
        this.session = session;
        this.params = params;
        this.header = header;
    }

    /** The connection's session. */
    public Session session() {
        return session;
    }

    /** The parameters as parsed. */
    public List<Param> params() {
        return params;
    }

    /** The header as resolved, for error details. */
    public String header() {
        return header;
    }

    /** Checks the parameter count: -109 below {@code min}, -108 above {@code max}. */
    public void count(int min, int max) {
        if (params.size() < min) {
            throw new ScpiException(StandardError.MISSING_PARAMETER, header);
        }
        if (params.size() > max) {
            throw new ScpiException(StandardError.PARAMETER_NOT_ALLOWED, header);
        }
    }

    /**
     * Parameter {@code i} as a {@code <numeric_value>} in {@code unit}: NRf with an optional
     * suffix, or MINimum, MAXimum, DEFault (§7.2.1). Outside [{@code min}, {@code max}] it is
     * {@code -222 Data out of range}.
     */
    public double number(int i, SuffixUnit unit, double min, double max, double def) {
        Param p = params.get(i);
        if (p instanceof Param.Chars c) {
            if (c.is("MINimum")) {
                return min;
            }
            if (c.is("MAXimum")) {
                return max;
            }
            if (c.is("DEFault")) {
                return def;
            }
            throw new ScpiException(StandardError.DATA_TYPE_ERROR, c.text() + " is not a number");
        }
        if (!(p instanceof Param.Decimal d)) {
            throw new ScpiException(StandardError.DATA_TYPE_ERROR, p.typeName() + " data where a number is expected");
        }
        double v = d.value() * unit.scale(d.suffix());
        if (!(v >= min && v <= max)) {
            throw new ScpiException(StandardError.DATA_OUT_OF_RANGE,
                    header + " " + Numbers.nr3(v) + " outside " + Numbers.nr3(min) + " to " + Numbers.nr3(max));
        }
        return v;
    }

    /** Parameter {@code i} as an integer in [{@code min}, {@code max}] (NRf rounded, §7.2.1). */
    public long integer(int i, long min, long max, long def) {
        Param p = params.get(i);
        if (p instanceof Param.Decimal d) {
            if (!d.suffix().isEmpty()) {
                throw new ScpiException(StandardError.SUFFIX_NOT_ALLOWED, d.suffix());
            }
            double r = Math.rint(d.value());
            if (!(r >= min && r <= max)) {
                throw new ScpiException(StandardError.DATA_OUT_OF_RANGE, header + " " + d.value() + " outside " + min + " to " + max);
            }
            return (long) r;
        }
        return Math.round(number(i, SuffixUnit.NONE, min, max, def));
    }

    /** Parameter {@code i} as a boolean: ON, OFF or an NRf rounded, non-zero meaning 1 (§7.3). */
    public boolean bool(int i) {
        Param p = params.get(i);
        if (p instanceof Param.Chars c) {
            if (c.text().equals("ON")) {
                return true;
            }
            if (c.text().equals("OFF")) {
                return false;
            }
            throw new ScpiException(StandardError.ILLEGAL_PARAMETER_VALUE, c.text() + " is not ON or OFF");
        }
        if (p instanceof Param.Decimal d) {
            if (!d.suffix().isEmpty()) {
                throw new ScpiException(StandardError.SUFFIX_NOT_ALLOWED, d.suffix());
            }
            return Math.rint(d.value()) != 0;
        }
        throw new ScpiException(StandardError.DATA_TYPE_ERROR, p.typeName() + " data where a boolean is expected");
    }

    /**
     * Parameter {@code i} as character data, one of {@code choices} written in documentation case
     * ({@code IMMediate}); returns the index of the match. A different word is -224, other data -104.
     */
    public int choice(int i, String... choices) {
        Param p = params.get(i);
        if (!(p instanceof Param.Chars c)) {
            throw new ScpiException(StandardError.DATA_TYPE_ERROR, p.typeName() + " data where a word is expected");
        }
        for (int k = 0; k < choices.length; k++) {
            if (c.is(choices[k])) {
                return k;
            }
        }
        throw new ScpiException(StandardError.ILLEGAL_PARAMETER_VALUE, c.text() + " is not one of " + String.join("|", choices));
    }

    /** Parameter {@code i} as string data. */
    public String string(int i) {
        Param p = params.get(i);
        if (p instanceof Param.Str s) {
            return s.value();
        }
        throw new ScpiException(StandardError.DATA_TYPE_ERROR, p.typeName() + " data where a string is expected");
    }

    /** Parameter {@code i} as text: string data, or block data read as UTF-8. */
    public String text(int i) {
        Param p = params.get(i);
        if (p instanceof Param.Block b) {
            return new String(b.bytes(), java.nio.charset.StandardCharsets.UTF_8);
        }
        return string(i);
    }

    /**
     * The value a query with an optional MINimum|MAXimum|DEFault argument answers (§7.2.1.2):
     * {@code current} when there is no argument.
     */
    public double queryLimit(double current, double min, double max, double def) {
        count(0, 1);
        if (params.isEmpty()) {
            return current;
        }
        return switch (choice(0, "MINimum", "MAXimum", "DEFault")) {
            case 0 -> min;
            case 1 -> max;
            default -> def;
        };
    }
}
