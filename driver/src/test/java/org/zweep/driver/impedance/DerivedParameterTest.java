package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

class DerivedParameterTest {

    @Test
    void contractNamesAreExactlyTheDocumentedOnesInOrder() {
        // issue 2, "zweep convert": the JSON field names are our own contract
        List<String> expected = List.of("frequency_hz", "r_ohm", "x_ohm", "z_ohm", "theta_deg", "delta_deg", "q", "d",
                "g_s", "b_s", "cs_f", "cp_f", "ls_h", "lp_h", "rs_ohm", "rp_ohm");
        Map<String, Double> values = DerivedParameter.contractValues(new Impedance(1e3, 3, 4));
        assertEquals(expected, List.copyOf(values.keySet()));
    }

    @Test
    void contractValuesAreTheImpedancesOwnParameters() {
        Impedance z = Impedance.fromCsEsr(1e3, 1e-6, 1.0);
        Map<String, Double> values = DerivedParameter.contractValues(z);
        assertEquals(-159.15494, values.get("x_ohm"), 1e-5); // 1 µF at 1 kHz: X_C = −1/(2πfC), computed
        assertEquals(1e-6, values.get("cs_f"), 1e-18);
        assertEquals(1.0, values.get("rs_ohm"), 1e-15);
        assertEquals(25_331.296, values.get("rp_ohm"), 1e-3); // Rp = Rs(1 + Q²), Q = 1/(ωCs·Rs), computed
    }
}
