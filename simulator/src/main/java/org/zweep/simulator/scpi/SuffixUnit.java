package org.zweep.simulator.scpi;

import java.util.List;
import java.util.Map;

/**
 * The unit a numeric parameter expects, and how a suffix is turned into a multiplier of it
 * (IEEE 488.2 §7.7.3; SCPI-1999 Vol 1 §7.2.2). The unit the command expects is matched first:
 * {@code MHZ} is megahertz, {@code MOHM} megohm, {@code MA} after a current milliampere;
 * elsewhere {@code M} is milli and {@code MA} mega, so {@code mHz} is megahertz.
 */
public enum SuffixUnit {
    /** A plain number: any suffix is {@code -138 Suffix not allowed}. */
    NONE(List.of()),
    HERTZ(List.of("HZ")),
    /** Volts; {@code VRMS} is accepted as the same unit, since every level here is rms. */
    VOLT(List.of("V", "VRMS")),
    AMPERE(List.of("A")),
    OHM(List.of("OHM")),
    SECOND(List.of("S"));

    // IEEE 488.2 §7.7.3.5.2 (Table 7-2): suffix multipliers
    private static final Map<String, Double> MULTIPLIERS = Map.ofEntries(
            Map.entry("EX", 1e18), Map.entry("PE", 1e15), Map.entry("T", 1e12), Map.entry("G", 1e9),
            Map.entry("MA", 1e6), Map.entry("K", 1e3), Map.entry("M", 1e-3), Map.entry("U", 1e-6),
            Map.entry("N", 1e-9), Map.entry("P", 1e-12), Map.entry("F", 1e-15), Map.entry("A", 1e-18));

    private final List<String> symbols;

    SuffixUnit(List<String> symbols) {
        this.symbols = symbols;
    }

    /** The unit's base symbol, e.g. {@code HZ}; empty for {@link #NONE}. */
    public String symbol() {
        return symbols.isEmpty() ? "" : symbols.get(0);
    }

    /**
     * The factor that turns a number written with {@code suffix} (upper case, possibly empty) into
     * this unit.
     *
     * @throws ScpiException -138 when this unit takes no suffix, -131 when the suffix is not this unit
     */
    public double scale(String suffix) {
        if (suffix.isEmpty()) {
            return 1.0;
        }
        if (this == NONE) {
            throw new ScpiException(StandardError.SUFFIX_NOT_ALLOWED, suffix);
        }
        // the standard's special cases, matched before the general multiplier rule
        if (this == HERTZ && suffix.equals("MHZ")) {
            return 1e6;
        }
        if (this == OHM && suffix.equals("MOHM")) {
            return 1e6;
        }
        if (this == AMPERE && suffix.equals("MA")) {
            return 1e-3;
        }
        for (String u : symbols) {
            if (suffix.endsWith(u)) {
                String prefix = suffix.substring(0, suffix.length() - u.length());
                if (prefix.isEmpty()) {
                    return 1.0;
                }
                Double m = MULTIPLIERS.get(prefix);
                if (m != null) {
                    return m;
                }
            }
        }
        throw new ScpiException(StandardError.INVALID_SUFFIX, suffix + " is not a unit of " + symbol());
    }
}
