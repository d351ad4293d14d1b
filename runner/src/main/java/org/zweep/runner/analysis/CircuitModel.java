package org.zweep.runner.analysis;

import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.InvalidInputException;

/**
 * The equivalent circuits a sweep is fitted to. Each has named parameters in SI units; the names
 * are those of the {@code analysis.json} contract. An element that is left out (not resolved) takes
 * its "absent" value: 0 for a series inductance, a series resistance, a parallel capacitance or a
 * loss tangent, +∞ for a parallel resistance.
 *
 * <ul>
 *   <li>{@code capacitor}: ESR + jωESL + 1/(jωC)
 *   <li>{@code capacitor-leakage}: as capacitor, with a leakage resistance {@code rp_ohm} across C
 *   <li>{@code capacitor-tan-delta}: as capacitor, with C lossy: Y = ωC(tan δ + j)
 *   <li>{@code inductor}: (R + jωL) in parallel with Cp
 *   <li>{@code inductor-core-loss}: as inductor, with a core-loss resistance {@code rcore_ohm} across it
 *   <li>{@code resistor}: (R + jωLs) in parallel with Cp
 * </ul>
 */
public enum CircuitModel {
    /** C, ESR, ESL in series. */
    CAPACITOR("capacitor", "c_f", "esr_ohm", "esl_h"),
    /** C with a parallel leakage resistance, in series with ESR and ESL. */
    CAPACITOR_LEAKAGE("capacitor-leakage", "c_f", "esr_ohm", "esl_h", "rp_ohm"),
    /** A lossy C (tan δ), in series with ESR and ESL. */
    CAPACITOR_TAN_DELTA("capacitor-tan-delta", "c_f", "esr_ohm", "esl_h", "tan_delta"),
    /** L with its winding resistance, in parallel with the winding capacitance. */
    INDUCTOR("inductor", "l_h", "r_ohm", "cp_f"),
    /** As {@link #INDUCTOR}, with a core-loss resistance across the whole. */
    INDUCTOR_CORE_LOSS("inductor-core-loss", "l_h", "r_ohm", "cp_f", "rcore_ohm"),
    /** R with its series inductance, in parallel with its capacitance. */
    RESISTOR("resistor", "r_ohm", "ls_h", "cp_f");

    private final String id;
    private final List<String> keys;

    CircuitModel(String id, String... keys) {
        this.id = id;
        this.keys = List.of(keys);
    }

    /** The name used on the command line and in {@code analysis.json}, e.g. {@code capacitor}. */
    public String id() {
        return id;
    }

    /** The parameter names in order; the first is the main element (never left out). */
    public List<String> keys() {
        return keys;
    }

    /** The model named {@code id} ({@code capacitor}, ...), or {@link InvalidInputException} listing the choices. */
    public static CircuitModel byId(String id) {
        String want = id.toLowerCase(Locale.ROOT).strip();
        for (CircuitModel m : values()) {
            if (m.id.equals(want)) {
                return m;
            }
        }
        throw new InvalidInputException("unknown model '" + id + "'; choose one of "
                + Arrays.stream(values()).map(CircuitModel::id).toList());
    }

    /** The value a left-out parameter takes: 0, or +∞ for a parallel resistance. */
    double absentValue(int index) {
        String k = keys.get(index);
        return k.equals("rp_ohm") || k.equals("rcore_ohm") ? Double.POSITIVE_INFINITY : 0.0;
    }

    /** The impedance in ohms at angular frequency {@code omega} (rad/s), for physical parameters {@code p}. */
    public Complex impedance(double omega, double[] p) {
        return switch (this) {
            case CAPACITOR, CAPACITOR_LEAKAGE, CAPACITOR_TAN_DELTA -> {
                Complex y = capacitorAdmittance(omega, p);
                yield new Complex(p[1], omega * p[2]).add(y.reciprocal());
            }
            case INDUCTOR, INDUCTOR_CORE_LOSS, RESISTOR -> parallelAdmittance(omega, p).reciprocal();
        };
    }

    /**
     * ∂Z/∂(ln p_k) = p_k·∂Z/∂p_k at {@code omega}, for each k in {@code active}; the derivatives the
     * log-parameter fit needs.
     */
    Complex[] logDerivatives(double omega, double[] p, int[] active) {
        Complex[] d = new Complex[active.length];
        switch (this) {
            case CAPACITOR, CAPACITOR_LEAKAGE, CAPACITOR_TAN_DELTA -> {
                Complex y = capacitorAdmittance(omega, p);
                Complex minusInvY2 = y.multiply(y).reciprocal().negate();
                for (int a = 0; a < active.length; a++) {
                    int k = active[a];
                    d[a] = switch (k) {
                        case 0 -> minusInvY2.multiply(new Complex(tanDelta(p) * omega * p[0], omega * p[0]));
                        case 1 -> new Complex(p[1], 0);
                        case 2 -> new Complex(0, omega * p[2]);
                        // ∂Y/∂(ln Rp) = −1/Rp for the leakage; ∂Y/∂(ln tan δ) = ωC·tan δ
                        default -> this == CAPACITOR_LEAKAGE
                                ? minusInvY2.multiply(-1.0 / p[3])
                                : minusInvY2.multiply(omega * p[0] * p[3]);
                    };
                }
            }
            case INDUCTOR, INDUCTOR_CORE_LOSS, RESISTOR -> {
                boolean resistor = this == RESISTOR;
                double r = resistor ? p[0] : p[1];
                double l = resistor ? p[1] : p[0];
                Complex zs = new Complex(r, omega * l);
                Complex z = parallelAdmittance(omega, p).reciprocal();
                Complex minusZ2 = z.multiply(z).negate();
                Complex invZs2 = zs.multiply(zs).reciprocal();
                for (int a = 0; a < active.length; a++) {
                    int k = active[a];
                    String key = keys.get(k);
                    Complex dy = switch (key) {
                        case "r_ohm" -> invZs2.multiply(-r);
                        case "l_h", "ls_h" -> invZs2.multiply(new Complex(0, -omega * l));
                        case "cp_f" -> new Complex(0, omega * p[2]);
                        default -> new Complex(-1.0 / p[3], 0);
                    };
                    d[a] = minusZ2.multiply(dy);
                }
            }
            default -> throw new IllegalStateException();
        }
        return d;
    }

    private double tanDelta(double[] p) {
        return this == CAPACITOR_TAN_DELTA ? p[3] : 0.0;
    }

    private Complex capacitorAdmittance(double omega, double[] p) {
        double g = switch (this) {
            case CAPACITOR_LEAKAGE -> 1.0 / p[3];
            case CAPACITOR_TAN_DELTA -> omega * p[0] * p[3];
            default -> 0.0;
        };
        return new Complex(g, omega * p[0]);
    }

    private Complex parallelAdmittance(double omega, double[] p) {
        boolean resistor = this == RESISTOR;
        double r = resistor ? p[0] : p[1];
        double l = resistor ? p[1] : p[0];
        Complex y = new Complex(r, omega * l).reciprocal().add(new Complex(0, omega * p[2]));
        if (this == INDUCTOR_CORE_LOSS) {
            y = y.add(new Complex(1.0 / p[3], 0));
        }
        return y;
    }

    /** Whether this model describes a capacitor. */
    boolean capacitive() {
        return this == CAPACITOR || this == CAPACITOR_LEAKAGE || this == CAPACITOR_TAN_DELTA;
    }
}
