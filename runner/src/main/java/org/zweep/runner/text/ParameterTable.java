package org.zweep.runner.text;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Unit;

/**
 * The one table of figure names: every derived parameter of an impedance ({@code cs_f} is Cs in
 * farads), the fitted circuit values ({@code c_f} C, {@code esr_ohm} ESR, {@code esl_h} ESL, ...),
 * the whole-sweep figures ({@code srf_hz} SRF) and the transformer's measured voltage ratio
 * ({@code ratio}, V2/V1). The unit comes from here, never from the name's suffix. Immutable.
 */
public final class ParameterTable {
    private static final Map<String, Parameter> TABLE;

    static {
        Map<String, Parameter> t = new LinkedHashMap<>();
        for (DerivedParameter p : DerivedParameter.values()) {
            t.put(p.key(), new Parameter(p.key(), p.label(), p.unit()));
        }
        for (Parameter p : new Parameter[] {
            new Parameter("c_f", "C", Unit.FARAD),
            new Parameter("esr_ohm", "ESR", Unit.OHM),
            new Parameter("esl_h", "ESL", Unit.HENRY),
            new Parameter("l_h", "L", Unit.HENRY),
            new Parameter("rcore_ohm", "Rcore (core loss)", Unit.OHM),
            new Parameter("tan_delta", "tan δ", Unit.NONE),
            new Parameter("srf_hz", "SRF", Unit.HERTZ),
            new Parameter("ratio", "V2/V1", Unit.NONE),
            new Parameter("leakage_h", "leakage L", Unit.HENRY),
            new Parameter("mutual_h", "M", Unit.HENRY),
        }) {
            t.put(p.key(), p);
        }
        TABLE = Collections.unmodifiableMap(t);
    }

    private ParameterTable() {
    }

    /** The figure named {@code key}; empty for a name the table does not hold. */
    public static Optional<Parameter> find(String key) {
        return Optional.ofNullable(TABLE.get(key));
    }

    /** The label of {@code key} ({@code esr_ohm} → {@code ESR}); the name itself when the table does not hold it. */
    public static String label(String key) {
        Parameter p = TABLE.get(key);
        return p == null ? key : p.label();
    }

    /** The unit of {@code key}; {@link Unit#NONE} when the table does not hold it. */
    public static Unit unit(String key) {
        Parameter p = TABLE.get(key);
        return p == null ? Unit.NONE : p.unit();
    }
}
