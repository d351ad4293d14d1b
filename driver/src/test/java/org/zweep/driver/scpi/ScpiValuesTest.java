package org.zweep.driver.scpi;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

class ScpiValuesTest {

    @ParameterizedTest
    @ValueSource(strings = {"NaN", "Infinity", "0x10", "1d", "1f", "1,5", "", "E5", "--1", "1E"})
    void javaOnlyAndMalformedNumbersAreRejected(String text) {
        assertThrows(NumberFormatException.class, () -> ScpiValues.parseNumber(text));
    }

    @Test
    void forgivingDecimalFormsParse() {
        assertEquals(0.5, ScpiValues.parseNumber(" .5 "));
        assertEquals(5.0, ScpiValues.parseNumber("5."));
        assertEquals(-1.5e-9, ScpiValues.parseNumber("-1.5e-9"));
    }

    @Test
    void specialValuesMapOnlyOnExactEquality() {
        assertEquals(9.910001e37, ScpiValues.special(9.910001e37)); // common practice, no source: near is not special
        assertEquals(Double.NaN, ScpiValues.parseNumber("+9.910000E+37")); // SCPI-1999 Vol 1 §7.2.1.5
    }

    @Test
    void errorEntryWithDoubledQuotesAndWithoutMessage() {
        assertEquals(new ScpiError(-100, "Command error;bad \"x\""),
                ScpiValues.parseError("-100,\"Command error;bad \"\"x\"\"\""));
        assertEquals(new ScpiError(0, ""), ScpiValues.parseError("0"));
        assertThrows(NumberFormatException.class, () -> ScpiValues.parseError("No error"));
    }

    @Test
    void emptyListIsEmpty() {
        assertEquals(List.of(), ScpiValues.splitList(""));
        assertEquals(List.of("", ""), ScpiValues.splitList(","));
    }

    @Test
    void escapeShowsControlBytesAndTruncates() {
        byte[] data = {'A', '\n', '\r', '\t', '\\', 0, (byte) 0xFF, 'z'};
        assertEquals("A\\n\\r\\t\\\\\\x00\\xFFz", ScpiValues.escape(data, 0, data.length, 100));
        assertEquals("A\\n... (6 more bytes)", ScpiValues.escape(data, 0, data.length, 2));
    }
}
