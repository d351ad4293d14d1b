package org.zweep.runner.sequence;

import java.util.Map;
import java.util.OptionalDouble;

/**
 * The symmetric IEC 60062 tolerance letters (the letter code printed on parts).
 * Source: IEC 60062:2016 letter code, as tabulated in check-values.md §4.1.
 *
 * <p>For capacitors below 10 pF the letters B, C, D, F and G mean an absolute tolerance in pF
 * (±0.1, ±0.25, ±0.5, ±1, ±2 pF) rather than a percentage (check-values.md §4.1). Asymmetric
 * letters (Z, Q, T, S) are not accepted: a tolerance here is one ± figure.
 */
final class Tolerances {
    /** Letter → ± percent. */
    static final Map<Character, Double> PERCENT = Map.of(
            'B', 0.1, 'C', 0.25, 'D', 0.5, 'F', 1.0, 'G', 2.0, 'J', 5.0, 'K', 10.0, 'M', 20.0);

    /** Letter → ± picofarads, used for capacitors below {@link #SMALL_CAPACITANCE_F}. */
    static final Map<Character, Double> PICOFARADS = Map.of('B', 0.1, 'C', 0.25, 'D', 0.5, 'F', 1.0, 'G', 2.0);

    /** Below this nominal capacitance B…G are absolute pF tolerances. */
    static final double SMALL_CAPACITANCE_F = 10e-12;

    private Tolerances() {
    }

    /**
     * The ± tolerance in percent of {@code nominal} that letter {@code letter} stands for, or
     * empty when the letter is not one of B C D F G J K M.
     *
     * @param capacitor whether the part is a capacitor (for the small-capacitance pF meaning)
     * @param nominal the nominal value in SI units (F for a capacitor)
     */
    static OptionalDouble percentOf(char letter, boolean capacitor, double nominal) {
        if (capacitor && nominal < SMALL_CAPACITANCE_F && PICOFARADS.containsKey(letter)) {
            return OptionalDouble.of(PICOFARADS.get(letter) * 1e-12 / nominal * 100.0);
        }
        Double p = PERCENT.get(letter);
        return p == null ? OptionalDouble.empty() : OptionalDouble.of(p);
    }
}
