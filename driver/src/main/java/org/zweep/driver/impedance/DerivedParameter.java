package org.zweep.driver.impedance;

import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.ToDoubleFunction;

/**
 * The parameters derived from an impedance, with their machine names. The names of the
 * {@linkplain #contract() contract} parameters are what {@code zweep convert --json},
 * {@code zweep measure} and the results CSV use; scripts rely on them, so they never change.
 *
 * <p>Enum order is display order; the contract order is the same with {@link #ADMITTANCE} left out.
 */
public enum DerivedParameter {
    FREQUENCY("frequency_hz", "f", Unit.HERTZ, true, Impedance::frequencyHz),
    R("r_ohm", "R", Unit.OHM, true, Impedance::resistanceOhm),
    X("x_ohm", "X", Unit.OHM, true, Impedance::reactanceOhm),
    Z("z_ohm", "|Z|", Unit.OHM, true, Impedance::magnitudeOhm),
    THETA("theta_deg", "θ", Unit.DEGREE, true, Impedance::phaseDeg),
    DELTA("delta_deg", "δ", Unit.DEGREE, true, Impedance::lossAngleDeg),
    Q("q", "Q", Unit.NONE, true, Impedance::qualityFactor),
    D("d", "D", Unit.NONE, true, Impedance::dissipationFactor),
    G("g_s", "G", Unit.SIEMENS, true, Impedance::conductanceS),
    B("b_s", "B", Unit.SIEMENS, true, Impedance::susceptanceS),
    /** |Y|: shown in tables, not part of the machine-readable contract. */
    ADMITTANCE("y_s", "|Y|", Unit.SIEMENS, false, Impedance::admittanceMagnitudeS),
    CS("cs_f", "Cs", Unit.FARAD, true, Impedance::seriesCapacitanceF),
    CP("cp_f", "Cp", Unit.FARAD, true, Impedance::parallelCapacitanceF),
    LS("ls_h", "Ls", Unit.HENRY, true, Impedance::seriesInductanceH),
    LP("lp_h", "Lp", Unit.HENRY, true, Impedance::parallelInductanceH),
    RS("rs_ohm", "Rs (ESR)", Unit.OHM, true, Impedance::seriesResistanceOhm),
    RP("rp_ohm", "Rp", Unit.OHM, true, Impedance::parallelResistanceOhm);

    private static final List<DerivedParameter> CONTRACT = Collections.unmodifiableList(
            Arrays.stream(values()).filter(p -> p.contract).toList());

    private final String key;
    private final String label;
    private final Unit unit;
    private final boolean contract;
    private final ToDoubleFunction<Impedance> value;

    DerivedParameter(String key, String label, Unit unit, boolean contract, ToDoubleFunction<Impedance> value) {
        this.key = key;
        this.label = label;
        this.unit = unit;
        this.contract = contract;
        this.value = value;
    }

    /** The machine name, e.g. {@code cs_f}: lower case, SI unit as suffix. */
    public String key() {
        return key;
    }

    /** The short human label, e.g. {@code Cs}. */
    public String label() {
        return label;
    }

    /** The unit of the value. */
    public Unit unit() {
        return unit;
    }

    /** The value for {@code z}, in SI units (may be infinite, see {@link Impedance}). */
    public double of(Impedance z) {
        return value.applyAsDouble(z);
    }

    /** The contract parameters in contract order: frequency_hz, r_ohm, …, rs_ohm, rp_ohm. */
    public static List<DerivedParameter> contract() {
        return CONTRACT;
    }

    /** Contract name → value for {@code z}, in contract order; a new map each call. */
    public static Map<String, Double> contractValues(Impedance z) {
        Map<String, Double> map = new LinkedHashMap<>();
        for (DerivedParameter p : CONTRACT) {
            map.put(p.key, p.of(z));
        }
        return map;
    }
}
