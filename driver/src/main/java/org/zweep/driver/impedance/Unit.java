package org.zweep.driver.impedance;

import java.util.List;
import java.util.Optional;

/**
 * The units the human-input grammar of {@link Quantities} knows, each with the spellings it
 * accepts after a number and the range of values that make physical sense for it by default.
 */
public enum Unit {
    /** Capacitance, farad. */
    FARAD("F", "a capacitance", "100 nF or 4n7", Bound.ANY, true, List.of("F")),
    /** Inductance, henry. */
    HENRY("H", "an inductance", "10 mH or 4u7", Bound.ANY, true, List.of("H")),
    /** Resistance, reactance or impedance magnitude, ohm. */
    OHM("Ω", "an impedance", "4.7 kΩ, 4k7 or R47", Bound.ANY, true,
            List.of("Ω", "\u2126", "ohm", "ohms", "Ohm", "Ohms", "OHM")),
    /** Conductance, susceptance or admittance magnitude, siemens. */
    SIEMENS("S", "an admittance", "1 mS or 20 µS", Bound.ANY, true, List.of("S")),
    /** Frequency, hertz; positive by default. */
    HERTZ("Hz", "a frequency", "1 kHz or 1.5k", Bound.POSITIVE, true, List.of("Hz", "hz", "HZ")),
    /** Voltage (rms or DC), volt. */
    VOLT("V", "a voltage", "10 mV or -2 V", Bound.ANY, true, List.of("V")),
    /** Current (rms or DC), ampere. */
    AMPERE("A", "a current", "0.5 A or 20 mA", Bound.ANY, true, List.of("A")),
    /** Duration, second; zero or positive by default. */
    SECOND("s", "a duration", "100 ms or 2 s", Bound.NON_NEGATIVE, true, List.of("s")),
    /** Angle in degrees (no SI prefixes). */
    DEGREE("°", "an angle in degrees", "80 or -89.5°", Bound.ANY, false, List.of("°", "deg")),
    /** A plain number such as Q or D; {@code %} means one hundredth. */
    NONE("", "a number", "0.01, 1e-3 or 1%", Bound.ANY, true, List.of());

    /** The range of values a parsed quantity must fall in. */
    public enum Bound {
        /** Any finite value, negative included. */
        ANY,
        /** Zero or more. */
        NON_NEGATIVE,
        /** More than zero. */
        POSITIVE
    }

    private final String symbol;
    private final String description;
    private final String example;
    private final Bound defaultBound;
    private final boolean prefixes;
    private final List<String> spellings;

    Unit(String symbol, String description, String example, Bound defaultBound, boolean prefixes,
            List<String> spellings) {
        this.symbol = symbol;
        this.description = description;
        this.example = example;
        this.defaultBound = defaultBound;
        this.prefixes = prefixes;
        this.spellings = spellings;
    }

    /** The symbol used when formatting, e.g. {@code Ω}; empty for {@link #NONE}. */
    public String symbol() {
        return symbol;
    }

    /**
     * The unit whose formatting symbol is {@code symbol} ({@code "F"}, {@code "Ω"}, {@code "Hz"},
     * {@code ""} for {@link #NONE}); empty when no unit has that symbol.
     */
    public static Optional<Unit> ofSymbol(String symbol) {
        for (Unit u : values()) {
            if (u.symbol.equals(symbol)) {
                return Optional.of(u);
            }
        }
        return Optional.empty();
    }

    /** What a value of this unit is, with its article, e.g. "a capacitance". */
    String description() {
        return description;
    }

    /** Example inputs for error messages. */
    String example() {
        return example;
    }

    /** The range {@link Quantities#parse(String, Unit)} enforces. */
    public Bound defaultBound() {
        return defaultBound;
    }

    /** Whether SI prefixes may precede the unit. */
    boolean allowsPrefixes() {
        return prefixes;
    }

    /** Whether {@code text} is one of this unit's accepted spellings. */
    boolean isSpelledAs(String text) {
        return spellings.contains(text);
    }

    /** The noun without its article, e.g. "capacitance". */
    String noun() {
        int space = description.indexOf(' ');
        return description.substring(space + 1);
    }
}
