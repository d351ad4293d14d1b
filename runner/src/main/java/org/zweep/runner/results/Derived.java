package org.zweep.runner.results;

import java.util.List;
import org.zweep.driver.impedance.Impedance;

/**
 * The derived parameters of one impedance reading, under the column names of {@code points.csv}
 * (the same names as {@code zweep convert --json}). {@code NaN} means not applicable.
 */
public record Derived(double zOhm, double thetaDeg, double csF, double cpF, double lsH, double lpH, double rsOhm,
        double rpOhm, double d, double q) {

    /** The column names, in {@code points.csv} order. */
    public static final List<String> NAMES =
            List.of("z_ohm", "theta_deg", "cs_f", "cp_f", "ls_h", "lp_h", "rs_ohm", "rp_ohm", "d", "q");

    /** No derived parameters (voltage-ratio rows, rows without a value). */
    public static final Derived NONE = new Derived(Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN,
            Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN);

    /** The derived parameters of {@code z}. */
    public static Derived of(Impedance z) {
        return DerivedTable.of(z);
    }

    /** The value named {@code name} (one of {@link #NAMES}), or {@code NaN} for an unknown name. */
    public double value(String name) {
        return switch (name) {
            case "z_ohm" -> zOhm;
            case "theta_deg" -> thetaDeg;
            case "cs_f" -> csF;
            case "cp_f" -> cpF;
            case "ls_h" -> lsH;
            case "lp_h" -> lpH;
            case "rs_ohm" -> rsOhm;
            case "rp_ohm" -> rpOhm;
            case "d" -> d;
            case "q" -> q;
            default -> Double.NaN;
        };
    }

    /** The values in {@link #NAMES} order. */
    double[] values() {
        return new double[] {zOhm, thetaDeg, csF, cpF, lsH, lpH, rsOhm, rpOhm, d, q};
    }

    static Derived fromValues(double[] v) {
        return new Derived(v[0], v[1], v[2], v[3], v[4], v[5], v[6], v[7], v[8], v[9]);
    }
}
