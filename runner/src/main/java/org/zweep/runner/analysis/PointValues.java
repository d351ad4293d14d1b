package org.zweep.runner.analysis;

import java.util.Arrays;
import java.util.Map;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.results.PointRow;

/**
 * The values of a {@code points.csv} row by column or parameter name, with every derived
 * parameter computed by the impedance core ({@link DerivedParameter}) from the row's R and X, so
 * analysis, checks and exports share one set of formulas. Stateless and thread-safe.
 */
public final class PointValues {
    private static final Map<String, DerivedParameter> BY_KEY = Arrays.stream(DerivedParameter.values())
            .collect(Collectors.toUnmodifiableMap(DerivedParameter::key, Function.identity()));

    private PointValues() {
    }

    /** The row's impedance R + jX at its frequency (NaN parts for a row without a value). */
    public static Impedance impedance(PointRow row) {
        return new Impedance(row.frequencyHz(), row.rOhm(), row.xOhm());
    }

    /**
     * The value named {@code name}: a derived parameter of the impedance core ({@code cs_f},
     * {@code g_s}, ...; {@code NaN} for a voltage-ratio row), or any other numeric column of the row
     * ({@code frequency_hz}, {@code r_ohm}, {@code level}, {@code ratio}, ...); {@code NaN} when the
     * row has no such value.
     */
    public static double of(PointRow row, String name) {
        DerivedParameter p = BY_KEY.get(name);
        if (p == null || p == DerivedParameter.FREQUENCY || p == DerivedParameter.R || p == DerivedParameter.X) {
            return row.value(name);
        }
        return "impedance".equals(row.quantity()) ? p.of(impedance(row)) : Double.NaN;
    }
}
