package org.zweep.runner.sim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.zweep.driver.scpi.ScpiSession;
import org.zweep.driver.scpi.ScpiSettings;

/** {@code sim:} addresses: with a bench file or, without one, the default bench. */
class InProcessSimulatorTest {
    @Test
    void simWithoutABenchFileServesTheDefault100OhmResistor() {
        try (InProcessSimulator sim = InProcessSimulator.start("sim:?timing=none");
                ScpiSession meter = sim.connect(ScpiSettings.builder().build())) {
            assertTrue(meter.query("*IDN?").startsWith("Korvane Bench Instruments,"));
            String[] z = meter.query("READ?").split(",");
            // README "zweep sim": the default device is a 100 Ω resistor; noise and fixture residuals are far below 1 %
            assertEquals(100.0, Double.parseDouble(z[0]), 1.0);
            assertEquals(0.0, Double.parseDouble(z[1]), 1.0);
        }
    }
}
