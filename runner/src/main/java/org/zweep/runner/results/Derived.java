package org.zweep.runner.results;

import java.util.Collections;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/**
 * Every parameter derived from one impedance reading ({@link DerivedParameter}, by its machine
 * key), computed once when the row is made. {@code NaN} means not applicable (a voltage-ratio row,
 * a row without a value).
 *
 * @param values each parameter's value; parameters missing from the map are {@code NaN}
 */
public record Derived(Map<DerivedParameter, Double> values) {

    /** The parameters {@code points.csv} stores, in its column order. */
    private static final List<DerivedParameter> COLUMNS = List.of(DerivedParameter.Z, DerivedParameter.THETA,
            DerivedParameter.CS, DerivedParameter.CP, DerivedParameter.LS, DerivedParameter.LP, DerivedParameter.RS,
            DerivedParameter.RP, DerivedParameter.D, DerivedParameter.Q);

    /** The derived columns of {@code points.csv}, in order (the others are computed when read). */
    public static final List<String> NAMES = COLUMNS.stream().map(DerivedParameter::key).toList();

    private static final Map<String, DerivedParameter> BY_KEY = java.util.Arrays.stream(DerivedParameter.values())
            .collect(java.util.stream.Collectors.toUnmodifiableMap(DerivedParameter::key, p -> p));

    /** No derived parameters (voltage-ratio rows, rows without a value). */
    public static final Derived NONE = new Derived(Map.of());

    public Derived {
        EnumMap<DerivedParameter, Double> copy = new EnumMap<>(DerivedParameter.class);
        copy.putAll(values);
        values = Collections.unmodifiableMap(copy);
    }

    /** Every derived parameter of {@code z}. */
    public static Derived of(Impedance z) {
        EnumMap<DerivedParameter, Double> m = new EnumMap<>(DerivedParameter.class);
        for (DerivedParameter p : DerivedParameter.values()) {
            m.put(p, p.of(z));
        }
        return new Derived(m);
    }

    /** The value of {@code p}, or {@code NaN} when not applicable. */
    public double value(DerivedParameter p) {
        Double v = values.get(p);
        return v == null ? Double.NaN : v;
    }

    /** The value of the parameter whose key is {@code name} ({@code cs_f}, {@code g_s}, ...), {@code NaN} for an unknown name. */
    public double value(String name) {
        DerivedParameter p = BY_KEY.get(name);
        return p == null ? Double.NaN : value(p);
    }

    /** The parameter whose key is {@code name}, or null. */
    public static DerivedParameter parameter(String name) {
        return BY_KEY.get(name);
    }

    /** |Z| in Ω. */
    public double zOhm() {
        return value(DerivedParameter.Z);
    }

    /** θ in degrees. */
    public double thetaDeg() {
        return value(DerivedParameter.THETA);
    }

    /** Cs in F. */
    public double csF() {
        return value(DerivedParameter.CS);
    }

    /** Cp in F. */
    public double cpF() {
        return value(DerivedParameter.CP);
    }

    /** Ls in H. */
    public double lsH() {
        return value(DerivedParameter.LS);
    }

    /** Lp in H. */
    public double lpH() {
        return value(DerivedParameter.LP);
    }

    /** Rs in Ω. */
    public double rsOhm() {
        return value(DerivedParameter.RS);
    }

    /** Rp in Ω. */
    public double rpOhm() {
        return value(DerivedParameter.RP);
    }

    /** D. */
    public double d() {
        return value(DerivedParameter.D);
    }

    /** Q. */
    public double q() {
        return value(DerivedParameter.Q);
    }

    /** The stored columns' values, in {@link #NAMES} order. */
    double[] columns() {
        return COLUMNS.stream().mapToDouble(this::value).toArray();
    }
}
