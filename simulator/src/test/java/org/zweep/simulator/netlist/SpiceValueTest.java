package org.zweep.simulator.netlist;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

class SpiceValueTest {

    // SPICE scale factors (ngspice manual, "Scale factors"), from memory; the IT cross-checks
    // 'meg' and 'm' against ngspice itself.
    @Test
    void everyScaleSuffixMultipliesAsInSpice() {
        assertEquals(1e-15, SpiceValue.parse("1f"), 1e-30);
        assertEquals(1e-12, SpiceValue.parse("1p"), 1e-27);
        assertEquals(1e-9, SpiceValue.parse("1n"), 1e-24);
        assertEquals(1e-6, SpiceValue.parse("1u"), 1e-21);
        assertEquals(1e-3, SpiceValue.parse("1m"), 1e-18);
        assertEquals(1e3, SpiceValue.parse("1k"), 1e-9);
        assertEquals(1e6, SpiceValue.parse("1meg"), 1e-6);
        assertEquals(1e9, SpiceValue.parse("1g"), 1e-3);
        assertEquals(1e12, SpiceValue.parse("1t"), 1);
    }

    @Test
    void suffixesAreCaseInsensitiveSoUpperCaseMIsMilliNotMega() {
        assertEquals(1e-3, SpiceValue.parse("1M"), 1e-18); // SPICE convention, from memory
        assertEquals(2.2e6, SpiceValue.parse("2.2MEG"), 1e-6);
        assertEquals(4.7e3, SpiceValue.parse("4.7K"), 1e-9);
    }

    @Test
    void trailingUnitLettersAreIgnored() {
        // SPICE ignores letters after a scale factor (ngspice manual, "Scale factors"), from memory
        assertEquals(100e-9, SpiceValue.parse("100nF"), 1e-22);
        assertEquals(10e-6, SpiceValue.parse("10uH"), 1e-20);
        assertEquals(4.7e3, SpiceValue.parse("4.7kOhm"), 1e-9);
        assertEquals(50, SpiceValue.parse("50ohm"), 0);
        assertEquals(1e6, SpiceValue.parse("1megohm"), 1e-6);
    }

    @Test
    void exponentsAndSignsAreNumbers() {
        // SPICE number syntax: exponent, then an optional scale factor; from memory
        assertEquals(1e-9, SpiceValue.parse("1e-9"), 1e-24);
        assertEquals(2.5e-6, SpiceValue.parse("2.5e-3m"), 1e-21);
        assertEquals(-3, SpiceValue.parse("-3"), 0);
        assertEquals(0.5, SpiceValue.parse(".5"), 0);
    }

    @Test
    void digitsAfterASuffixAreRejectedRatherThanMisread() {
        IllegalArgumentException e =
                assertThrows(IllegalArgumentException.class, () -> SpiceValue.parse("4k7"));
        assertEquals("'4k7' has characters after the number that are neither a scale suffix nor"
                + " unit letters", e.getMessage());
    }

    @Test
    void milAndNonNumbersAreRejected() {
        assertThrows(IllegalArgumentException.class, () -> SpiceValue.parse("10mil"));
        assertThrows(IllegalArgumentException.class, () -> SpiceValue.parse("abc"));
        assertThrows(IllegalArgumentException.class, () -> SpiceValue.parse("{rval}"));
        assertThrows(IllegalArgumentException.class, () -> SpiceValue.parse(""));
    }
}
