package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

/**
 * The real-meter paths, through the command line as a user runs them, against the meter that
 * {@code ZWEEP_HARDWARE_ADDRESS} names (any address {@code zweep measure} takes, e.g.
 * {@code tcp://192.168.1.50:5025}) in the dialect {@code ZWEEP_HARDWARE_DIALECT} names (default
 * {@code standard}). Without the address every test is reported as skipped, with that reason.
 * The part in the fixture must have a finite impedance at 1 kHz (no open); no DC bias is applied.
 */
class MeterHardwareIT {
    static final String ADDRESS = System.getenv("ZWEEP_HARDWARE_ADDRESS");
    static final String DIALECT = System.getenv().getOrDefault("ZWEEP_HARDWARE_DIALECT", "standard");

    @BeforeEach
    void aMeterIsNamed() {
        Assumptions.assumeTrue(ADDRESS != null && !ADDRESS.isBlank(),
                "ZWEEP_HARDWARE_ADDRESS is not set: no real meter to test (set it to the meter's address, e.g."
                        + " tcp://HOST:5025, and ZWEEP_HARDWARE_DIALECT to its dialect)");
    }

    @Test
    void theMeterIdentifiesItselfWithTheFourFieldsOfIeee4882() {
        ConvertCommandTest.Run run = ConvertCommandTest.zweep("scpi", ADDRESS, "*IDN?");
        assertEquals(ExitCode.OK, run.exitCode(), run.err());
        String idn = run.out().strip();
        // IEEE 488.2-1992 §10.14: manufacturer, model, serial number, firmware level
        assertEquals(4, idn.split(",", -1).length, idn);
    }

    @Test
    void onePointAtOneKilohertzGivesAFiniteImpedanceAndItsDerivedParameters() throws Exception {
        ConvertCommandTest.Run run = ConvertCommandTest.zweep("measure", ADDRESS, "--dialect", DIALECT,
                "--frequency", "1kHz", "--level", "0.5V", "--json");
        assertEquals(ExitCode.OK, run.exitCode(), run.err());
        JsonNode z = new ObjectMapper().readTree(run.out());
        assertEquals(1000.0, z.get("frequency_hz").asDouble(), 1e-6, run.out());
        double r = z.get("r_ohm").asDouble();
        double x = z.get("x_ohm").asDouble();
        assertTrue(Double.isFinite(r) && Double.isFinite(x), "the part reads no finite impedance: " + run.out());
        // |Z| = √(R² + X²) and D = R/|X|: the derived values belong to the reading, not to a default
        assertEquals(Math.hypot(r, x), z.get("z_ohm").asDouble(), 1e-9 * Math.hypot(r, x), run.out());
        if (x != 0) {
            assertEquals(r / Math.abs(x), z.get("d").asDouble(), 1e-9 * Math.abs(r / x) + 1e-15, run.out());
        }
    }
}
