package org.zweep.runner.results;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.uncertainty.UncertainImpedance;

/**
 * The standard uncertainties of one row: of R and X with their correlation, and of every derived
 * parameter by the law of propagation of uncertainty (JCGM 100:2008), computed once when the row
 * is made. {@code NaN} when unknown (the meter states no accuracy for the point, or the row has
 * no impedance value).
 *
 * @param uROhm u(R) in ohms
 * @param uXOhm u(X) in ohms
 * @param correlation r(R, X)
 * @param derived u of each derived parameter, in its unit
 */
public record RowUncertainty(double uROhm, double uXOhm, double correlation, Derived derived) {

    /** Unknown. */
    public static final RowUncertainty NONE = new RowUncertainty(Double.NaN, Double.NaN, Double.NaN, Derived.NONE);

    /** The {@code points.csv} columns, in order: {@code u_r_ohm}, {@code u_x_ohm}, {@code r_rx}, then {@code u_<name>}. */
    public static final List<String> COLUMNS = columnNames();

    private static List<String> columnNames() {
        List<String> c = new ArrayList<>(List.of("u_r_ohm", "u_x_ohm", "r_rx"));
        for (String n : Derived.NAMES) {
            c.add("u_" + n);
        }
        return List.copyOf(c);
    }

    /** From an uncertain impedance; {@link #NONE} for null. */
    public static RowUncertainty of(UncertainImpedance z) {
        if (z == null) {
            return NONE;
        }
        EnumMap<DerivedParameter, Double> u = new EnumMap<>(DerivedParameter.class);
        for (DerivedParameter p : DerivedParameter.values()) {
            double v = z.standardUncertainty(p);
            u.put(p, Double.isFinite(v) ? v : Double.NaN);
        }
        return new RowUncertainty(z.uROhm(), z.uXOhm(), z.correlation(), new Derived(u));
    }

    /** From stored u(R), u(X) and r(R, X) of {@code value}; {@link #NONE} when they are not known. */
    static RowUncertainty of(Impedance value, double uROhm, double uXOhm, double correlation) {
        if (!(uROhm >= 0) || !(uXOhm >= 0) || !(Math.abs(correlation) <= 1) || !Double.isFinite(value.resistanceOhm())
                || !Double.isFinite(value.reactanceOhm())) {
            return NONE;
        }
        return of(new UncertainImpedance(value, uROhm, uXOhm, correlation));
    }

    /** Whether the uncertainty is known. */
    public boolean known() {
        return !Double.isNaN(uROhm);
    }

    /** As an uncertain impedance of {@code value}; null when unknown. */
    public UncertainImpedance at(Impedance value) {
        return known() ? new UncertainImpedance(value, uROhm, uXOhm, correlation) : null;
    }

    /**
     * The standard uncertainty of the value named {@code name} ({@code r_ohm}, {@code x_ohm} or a
     * derived parameter's key); NaN when unknown or not an impedance value.
     */
    public double of(String name) {
        return switch (name) {
            case "r_ohm" -> uROhm;
            case "x_ohm" -> uXOhm;
            default -> derived.value(name);
        };
    }

    /** The stored columns' values, in {@link #COLUMNS} order. */
    double[] columns() {
        double[] d = derived.columns();
        double[] v = new double[3 + d.length];
        v[0] = uROhm;
        v[1] = uXOhm;
        v[2] = correlation;
        System.arraycopy(d, 0, v, 3, d.length);
        return v;
    }
}
