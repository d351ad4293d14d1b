package org.zweep.runner.results;

import java.util.List;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/**
 * The derived parameters of one impedance reading, under the column names of {@code points.csv}
 * (the same names as {@code zweep convert --json}: the {@link DerivedParameter} keys). {@code NaN}
 * means not applicable.
 */
public record Derived(double zOhm, double thetaDeg, double csF, double cpF, double lsH, double lpH, double rsOhm,
        double rpOhm, double d, double q) {

    /** The parameters of the record's components, in component (and {@code points.csv}) order. */
    private static final List<DerivedParameter> COLUMNS = List.of(DerivedParameter.Z, DerivedParameter.THETA,
            DerivedParameter.CS, DerivedParameter.CP, DerivedParameter.LS, DerivedParameter.LP, DerivedParameter.RS,
            DerivedParameter.RP, DerivedParameter.D, DerivedParameter.Q);

    /** The column names, in {@code points.csv} order. */
    public static final List<String> NAMES = COLUMNS.stream().map(DerivedParameter::key).toList();

    /** No derived parameters (voltage-ratio rows, rows without a value). */
    public static final Derived NONE = new Derived(Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN,
            Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN);

    /** The derived parameters of {@code z}. */
    public static Derived of(Impedance z) {
        return fromValues(COLUMNS.stream().mapToDouble(p -> p.of(z)).toArray());
    }

    /** The value named {@code name} (one of {@link #NAMES}), or {@code NaN} for an unknown name. */
    public double value(String name) {
        int i = NAMES.indexOf(name);
        return i < 0 ? Double.NaN : values()[i];
    }

    /** The values in {@link #NAMES} order. */
    double[] values() {
        return new double[] {zOhm, thetaDeg, csF, cpF, lsH, lpH, rsOhm, rpOhm, d, q};
    }

    static Derived fromValues(double[] v) {
        return new Derived(v[0], v[1], v[2], v[3], v[4], v[5], v[6], v[7], v[8], v[9]);
    }
}
