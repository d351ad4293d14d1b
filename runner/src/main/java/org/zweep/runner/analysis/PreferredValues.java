package org.zweep.runner.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.zweep.driver.InvalidInputException;

/**
 * IEC 60063 preferred-number series E6, E12, E24 (stored tables: they do not follow the rounding
 * formula) and E48, E96 (10^(i/N) rounded to three significant figures), and the nearest value in
 * a series, across decade edges.
 */
public enum PreferredValues {
    /** 20 %. */
    E6(table(1.0, 1.5, 2.2, 3.3, 4.7, 6.8)),
    /** 10 %. */
    E12(table(1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2)),
    /** 5 %. */
    E24(table(1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2,
            6.8, 7.5, 8.2, 9.1)),
    /** 2 %. */
    E48(computed(48)),
    /** 1 %. */
    E96(computed(96));

    private final List<Double> decade;

    PreferredValues(List<Double> decade) {
        this.decade = decade;
    }

    private static List<Double> table(double... v) {
        List<Double> out = new ArrayList<>();
        for (double d : v) {
            out.add(d);
        }
        return List.copyOf(out);
    }

    private static List<Double> computed(int n) {
        List<Double> out = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            out.add(new java.math.BigDecimal(Math.pow(10, i / (double) n)).round(new java.math.MathContext(3))
                    .doubleValue());
        }
        return List.copyOf(out);
    }

    /** The values of one decade, from 1.0 up to (not including) 10. */
    public List<Double> decade() {
        return decade;
    }

    /** The series named {@code name} ({@code E24}), or {@link InvalidInputException}. */
    public static PreferredValues byName(String name) {
        try {
            return valueOf(name.toUpperCase(Locale.ROOT));
        } catch (IllegalArgumentException e) {
            throw new InvalidInputException("unknown E-series '" + name + "'; choose E6, E12, E24, E48 or E96");
        }
    }

    /**
     * The preferred value nearest to {@code value} (positive) on a logarithmic scale (ratio
     * distance), looking into the neighbouring decades: 9.7 in E12 gives 10.
     */
    public double nearest(double value) {
        requirePositive(value);
        int exp = (int) Math.floor(Math.log10(value));
        double best = Double.NaN;
        double bestDistance = Double.POSITIVE_INFINITY;
        for (int e = exp - 1; e <= exp + 1; e++) {
            for (double m : decade) {
                double candidate = scale(m, e);
                double d = Math.abs(Math.log(candidate / value));
                if (d < bestDistance) {
                    bestDistance = d;
                    best = candidate;
                }
            }
        }
        return best;
    }

    /** The smallest preferred value at or above {@code value} (positive). */
    public double ceiling(double value) {
        requirePositive(value);
        int exp = (int) Math.floor(Math.log10(value));
        for (int e = exp - 1; e <= exp + 1; e++) {
            for (double m : decade) {
                double candidate = scale(m, e);
                if (candidate >= value * (1 - 1e-12)) {
                    return candidate;
                }
            }
        }
        throw new IllegalStateException("unreachable");
    }

    /** m·10^e rounded to 12 significant digits, so that 4.7·10^-9 prints as 4.7E-9. */
    private static double scale(double m, int e) {
        return new java.math.BigDecimal(m).scaleByPowerOfTen(e).round(new java.math.MathContext(12)).doubleValue();
    }

    private static void requirePositive(double value) {
        if (!(value > 0) || !Double.isFinite(value)) {
            throw new IllegalArgumentException("a preferred value needs a positive value, got " + value);
        }
    }
}
