package org.zweep.runner.results;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/** The points.csv derived columns are the impedance domain's parameters, by their own keys. */
class DerivedTest {
    @Test
    void everyColumnIsTheDerivedParameterWithThatKey() {
        // 1 uF + 1 ohm ESR at 1 kHz: X_C = −1/(2πfC), computed
        Impedance z = new Impedance(1000.0, 1.0, -159.15494309189535);
        Derived d = Derived.of(z);
        for (String name : Derived.NAMES) {
            DerivedParameter p = Arrays.stream(DerivedParameter.values()).filter(x -> x.key().equals(name))
                    .findFirst().orElseThrow();
            assertEquals(p.of(z), d.value(name), name);
        }
        assertEquals(1e-6, d.value("cs_f"), 1e-15); // Cs = −1/(ωX), common practice, no source
        assertTrue(Double.isNaN(d.value("no_such_column")));
    }
}
