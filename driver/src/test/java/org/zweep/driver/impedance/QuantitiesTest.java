package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.zweep.driver.InvalidInputException;

class QuantitiesTest {

    @ParameterizedTest(name = "{0} as {1} is {2}")
    @CsvSource(delimiter = '|', value = {
        // SI prefixes (SI Brochure, 9th ed., Table 7) and the usual spellings, from memory
        "100 nF     | FARAD   | 1e-7",
        "100n       | FARAD   | 1e-7",
        "100nF      | FARAD   | 1e-7",
        "1.5kHz     | HERTZ   | 1500",
        "1.5 KHZ    | HERTZ   | 1500",
        "1 MHz      | HERTZ   | 1e6",
        "1 mHz      | HERTZ   | 1e-3",
        "2.2µF      | FARAD   | 2.2e-6",
        "2.2μF      | FARAD   | 2.2e-6",
        "2.2uF      | FARAD   | 2.2e-6",
        "10 mV      | VOLT    | 0.01",
        "-2 V       | VOLT    | -2",
        "0.5 A      | AMPERE  | 0.5",
        "2.2Meg     | OHM     | 2.2e6",
        "2.2 megohm | OHM     | 2.2e6",
        "4.7 kΩ     | OHM     | 4700",
        "4.7kΩ      | OHM     | 4700",
        "4.7 kohm   | OHM     | 4700",
        "1e3        | OHM     | 1000",
        "1E-3 H     | HENRY   | 1e-3",
        ".5         | NONE    | 0.5",
        "5.         | NONE    | 5",
        "+3         | NONE    | 3",
        "0.1 %      | NONE    | 1e-3",
        "100 ms     | SECOND  | 0.1",
        "20 µS      | SIEMENS | 2e-5",
        "80         | DEGREE  | 80",
        "-89.5°     | DEGREE  | -89.5",
        "45 deg     | DEGREE  | 45",
        "'  100 nF  ' | FARAD | 1e-7",
    })
    void parsesHumanQuantities(String text, Unit unit, double expected) {
        assertEquals(expected, Quantities.parse(text, unit));
    }

    @ParameterizedTest(name = "RKM {0} as {1} is {2}")
    @CsvSource(delimiter = '|', value = {
        // IEC 60062:2016 letter-and-numeral code (the letter marks the decimal point and the multiplier),
        // as Wikipedia's "RKM code" article describes it; the individual examples are from memory
        "4k7   | OHM   | 4700",
        "4K7   | OHM   | 4700",
        "R47   | OHM   | 0.47",
        "4R7   | OHM   | 4.7",
        "470R  | OHM   | 470",
        "47K   | OHM   | 47000",
        "47K3  | OHM   | 47300",
        "2M2   | OHM   | 2.2e6",
        "1G0   | OHM   | 1e9",
        "1L5   | OHM   | 1.5e-3",
        "4k7Ω  | OHM   | 4700",
        "4u7   | FARAD | 4.7e-6",
        "4µ7   | FARAD | 4.7e-6",
        "4n7   | FARAD | 4.7e-9",
        "4p7   | FARAD | 4.7e-12",
        "1F5   | FARAD | 1.5",
        "2m2 F | FARAD | 2.2e-3",
        "4u7   | HENRY | 4.7e-6",
    })
    void parsesIec60062LetterAndNumeralCodes(String text, Unit unit, double expected) {
        assertEquals(expected, Quantities.parse(text, unit));
    }

    @ParameterizedTest(name = "{0} as {1}")
    @CsvSource(delimiter = '|', value = {
        "''         | HERTZ  | empty value; expected a frequency in Hz, e.g. 1 kHz or 1.5k",
        "'   '      | FARAD  | empty value; expected a capacitance in F, e.g. 100 nF or 4n7",
        "abc        | FARAD  | \"abc\" is not a number; expected a capacitance in F, e.g. 100 nF or 4n7",
        "NaN        | NONE   | \"NaN\" is not a number; expected a number, e.g. 0.01, 1e-3 or 1%",
        "100 nH     | FARAD  | \"100 nH\" has the wrong unit H; expected a capacitance in F, e.g. 100 nF or 4n7",
        "10 V       | FARAD  | \"10 V\" has the wrong unit V; expected a capacitance in F, e.g. 100 nF or 4n7",
        "5 ms       | HERTZ  | \"5 ms\" has the wrong unit s; expected a frequency in Hz, e.g. 1 kHz or 1.5k",
        "100 nX     | FARAD  | \"100 nX\" has an unknown unit or prefix \"nX\"; expected a capacitance in F, e.g. 100 nF or 4n7",
        "1.5 k Hz   | HERTZ  | \"1.5 k Hz\" has an unknown unit or prefix \"k Hz\"; expected a frequency in Hz, e.g. 1 kHz or 1.5k",
        "4k7k       | OHM    | \"4k7k\" has an unknown unit or prefix \"k\"; expected an impedance in Ω, e.g. 4.7 kΩ, 4k7 or R47",
        "4R7        | FARAD  | \"4R7\": the code letter R does not belong to a capacitance; expected a capacitance in F, e.g. 100 nF or 4n7",
        "80 k°      | DEGREE | \"80 k°\": an angle in degrees takes no SI prefix; expected an angle in degrees, e.g. 80 or -89.5°",
        "0 Hz       | HERTZ  | \"0 Hz\" is not a valid frequency: it must be greater than zero",
        "-1 kHz     | HERTZ  | \"-1 kHz\" is not a valid frequency: it must be greater than zero",
        "-1 s       | SECOND | \"-1 s\" is not a valid duration: it must not be negative",
        "1e400      | OHM    | \"1e400\" is out of range",
        "1e99999999999 | OHM | \"1e99999999999\" is out of range",
    })
    void rejectsBadInputWithOneClearLine(String text, Unit unit, String message) {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Quantities.parse(text, unit));
        assertEquals(message, e.getMessage());
    }

    @Test
    void negativeMagnitudeIsRejectedWhenAPositiveValueIsRequired() {
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> Quantities.parse("-10 mH", Unit.HENRY, Unit.Bound.POSITIVE));
        assertEquals("\"-10 mH\" is not a valid inductance: it must be greater than zero", e.getMessage());
        assertEquals(-0.01, Quantities.parse("-10 mH", Unit.HENRY)); // a signed inductance, as meters show it
    }

    @Test
    void negativeZeroIsParsedAsZero() {
        assertEquals(0.0, Quantities.parse("-0", Unit.OHM, Unit.Bound.NON_NEGATIVE));
    }

    @ParameterizedTest(name = "{0} {1} to {2} digits is {3}")
    @CsvSource(delimiter = '|', value = {
        "1e-7        | FARAD   | 3 | 100 nF",
        "4700        | OHM     | 2 | 4.7 kΩ",
        "-159.15494  | OHM     | 6 | -159.155 Ω",
        "999.96      | OHM     | 4 | 1.000 kΩ",
        "2.2e-6      | FARAD   | 2 | 2.2 µF",
        "0.5         | AMPERE  | 1 | 500 mA",
        "1000        | HERTZ   | 6 | 1.00000 kHz",
        "470         | OHM     | 1 | 500 Ω",
        "1e-20       | FARAD   | 3 | 1.00e-20 F",
        "3.3e15      | OHM     | 2 | 3.3e15 Ω",
        "0           | HENRY   | 3 | 0 H",
        "1591.549    | NONE    | 6 | 1591.55",
        "0.006283185 | NONE    | 3 | 0.00628",
        "-89.964     | DEGREE  | 5 | -89.964°",
        "Infinity    | NONE    | 3 | ∞",
        "-Infinity   | FARAD   | 3 | -∞ F",
    })
    void formatsInEngineeringNotation(double value, Unit unit, int digits, String expected) {
        assertEquals(expected, Quantities.format(value, unit, digits)); // SI Brochure prefixes; common practice
    }

    @ParameterizedTest(name = "{0} {1} to at most {2} digits is {3}")
    @CsvSource(delimiter = '|', value = {
        "30          | VOLT    | 12 | 30 V",
        "1500        | HERTZ   | 12 | 1.5 kHz",
        "100e-9      | FARAD   | 12 | 100 nF",
        "0.025       | NONE    | 12 | 0.025",
        "1258.925412 | HERTZ   | 4  | 1.259 kHz",
        "999.96      | OHM     | 4  | 1 kΩ",
        "0.1         | VOLT    | 6  | 100 mV",
        "0           | AMPERE  | 6  | 0 A",
    })
    void shortFormatDropsTrailingZeros(double value, Unit unit, int maxDigits, String expected) {
        assertEquals(expected, Quantities.formatShort(value, unit, maxDigits)); // SI Brochure prefixes; common practice
    }

    @Test
    void unitIsFoundByItsSymbol() {
        assertEquals(Unit.OHM, Unit.ofSymbol("Ω").orElseThrow());
        assertEquals(Unit.NONE, Unit.ofSymbol("").orElseThrow());
        assertEquals(java.util.Optional.empty(), Unit.ofSymbol("ohm"));
    }

    @Test
    void formatWithSeventeenDigitsParsesBackToTheSameDouble() {
        SplittableRandom random = new SplittableRandom(42);
        for (int i = 0; i < 10_000; i++) {
            double v = (random.nextBoolean() ? 1 : -1) * Math.pow(10, random.nextDouble(-18, 16));
            for (Unit unit : new Unit[] {Unit.FARAD, Unit.OHM, Unit.NONE}) {
                String text = Quantities.format(v, unit, 17);
                assertEquals(v, Quantities.parse(text, unit), text);
            }
        }
    }

    @Test
    void prefixOfAnEngineeringExponentIsTheSiSymbol() {
        // BIPM, The International System of Units, 9th ed. (2019), Table 7: SI prefixes
        assertEquals("f", Quantities.prefix(-15));
        assertEquals("µ", Quantities.prefix(-6));
        assertEquals("", Quantities.prefix(0));
        assertEquals("k", Quantities.prefix(3));
        assertEquals("T", Quantities.prefix(12));
        assertThrows(IllegalArgumentException.class, () -> Quantities.prefix(4));
    }
}
