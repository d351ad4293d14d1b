package org.zweep.driver.impedance;

import java.util.Comparator;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.stream.Collectors;

/**
 * The IEC 60062:2016 tolerance letters (the code printed on parts), the one table zweep has:
 * sequences read their {@code tolerance} with it and analysis names the tightest letter a
 * measured value meets. Relative letters give a band in percent of nominal; for capacitances
 * below 10 pF, A, B, C, D, F and G are absolute bands in pF instead; A has only that meaning.
 *
 * @param letter the code letter
 * @param lowerPercent the lower bound in percent (negative)
 * @param upperPercent the upper bound in percent
 * @param absolutePf for small capacitances: the symmetric band in pF; NaN when the letter has none
 */
public record ToleranceCode(char letter, double lowerPercent, double upperPercent, double absolutePf) {
    /** Capacitances below this use the absolute pF meaning of A, B, C, D, F, G. */
    public static final double SMALL_CAPACITANCE_F = 10e-12;

    /** The letters, IEC 60062:2016 tolerance letter code. */
    public static final List<ToleranceCode> ALL = List.of(
            sym('E', 0.005), sym('L', 0.01), sym('P', 0.02), sym('W', 0.05), new ToleranceCode('A', -0.05, 0.05, 0.05),
            new ToleranceCode('B', -0.1, 0.1, 0.1), new ToleranceCode('C', -0.25, 0.25, 0.25),
            new ToleranceCode('D', -0.5, 0.5, 0.5), new ToleranceCode('F', -1, 1, 1), new ToleranceCode('G', -2, 2, 2),
            sym('H', 3), sym('J', 5), sym('K', 10), sym('M', 20), sym('N', 30),
            new ToleranceCode('Q', -10, 30, Double.NaN), new ToleranceCode('T', -10, 50, Double.NaN),
            new ToleranceCode('S', -20, 50, Double.NaN), new ToleranceCode('Z', -20, 80, Double.NaN));

    private static ToleranceCode sym(char letter, double percent) {
        return new ToleranceCode(letter, -percent, percent, Double.NaN);
    }

    /** The code for {@code letter} (case-insensitive), if there is one. */
    public static Optional<ToleranceCode> of(char letter) {
        char up = Character.toUpperCase(letter);
        return ALL.stream().filter(c -> c.letter == up).findFirst();
    }

    /** Whether the band is one ± figure (lower bound = −upper bound). */
    public boolean symmetric() {
        return lowerPercent == -upperPercent;
    }

    /**
     * The ± tolerance in percent of {@code nominal} that {@code letter} stands for on a part, or
     * empty when the letter is unknown, asymmetric (Q, S, T, Z) or, like A, has no meaning for
     * this part.
     *
     * @param capacitor whether the part is a capacitor (for the absolute pF meaning below 10 pF)
     * @param nominal the nominal value in SI units (F for a capacitor)
     */
    public static OptionalDouble symmetricPercent(char letter, boolean capacitor, double nominal) {
        Optional<ToleranceCode> code = of(letter).filter(ToleranceCode::symmetric);
        if (code.isEmpty()) {
            return OptionalDouble.empty();
        }
        ToleranceCode c = code.get();
        String unit = capacitor ? "F" : "";
        if (c.absoluteFor(nominal, unit)) {
            return OptionalDouble.of(c.absolutePf * 1e-12 / nominal * 100.0);
        }
        return c.letter == 'A' ? OptionalDouble.empty() : OptionalDouble.of(c.upperPercent);
    }

    /** The symmetric letters a part can carry, for messages: {@code E L P W B C D F G H J K M N}. */
    public static String symmetricLetters() {
        return ALL.stream().filter(c -> c.symmetric() && c.letter != 'A').map(c -> String.valueOf(c.letter))
                .collect(Collectors.joining(" "));
    }

    /** Whether this letter means an absolute pF band for a part of this nominal value and unit. */
    boolean absoluteFor(double nominal, String unit) {
        return "F".equals(unit) && nominal < SMALL_CAPACITANCE_F && Double.isFinite(absolutePf);
    }

    /** The smallest passing value for {@code nominal} in {@code unit} ({@code F}, {@code H}, {@code Ω}). */
    public double min(double nominal, String unit) {
        return absoluteFor(nominal, unit) ? nominal - absolutePf * 1e-12 : nominal * (1 + lowerPercent / 100);
    }

    /** The largest passing value. */
    public double max(double nominal, String unit) {
        return absoluteFor(nominal, unit) ? nominal + absolutePf * 1e-12 : nominal * (1 + upperPercent / 100);
    }

    /**
     * The tightest letter whose band around {@code nominal} holds {@code measured} (narrowest band;
     * symmetric before asymmetric at equal width), or empty when even the widest does not.
     */
    public static Optional<ToleranceCode> classOf(double measured, double nominal, String unit) {
        return ALL.stream()
                .filter(c -> !(c.letter == 'A' && !c.absoluteFor(nominal, unit)))
                .filter(c -> measured >= c.min(nominal, unit) * (1 - 1e-12) && measured <= c.max(nominal, unit) * (1 + 1e-12))
                .min(Comparator.comparingDouble((ToleranceCode c) -> c.max(nominal, unit) - c.min(nominal, unit))
                        .thenComparing(c -> c.lowerPercent != -c.upperPercent));
    }
}
