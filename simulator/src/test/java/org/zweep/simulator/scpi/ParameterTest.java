package org.zweep.simulator.scpi;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

/** Program data: numbers, suffixes, MIN/MAX/DEF, booleans, character data, strings, blocks. */
class ParameterTest {
    private final Console c = new Console();

    @AfterEach
    void close() {
        c.close();
    }

    @Test
    void suffixMultipliersScaleTheExpectedUnit() {
        // IEEE 488.2 §7.7.3 / SCPI-1999 Vol 1 §7.2.2: K kilo, M milli, U micro
        c.send("SOUR:FREQ 1.5KHZ");
        assertEquals(1500, c.number("SOUR:FREQ?"));
        c.send("SOUR:FREQ 2.5 khz");
        assertEquals(2500, c.number("SOUR:FREQ?"));
        c.send("SOUR:VOLT 500MV");
        assertEquals(0.5, c.number("SOUR:VOLT?"), 1e-15);
        c.send("IMP:APER 20MS");
        assertEquals(0.02, c.number("IMP:APER?"), 1e-15);
        c.send("SOUR:CURR 200UA");
        assertEquals(200e-6, c.number("SOUR:CURR?"), 1e-18);
        assertEquals(List.of(), c.codes());
    }

    @Test
    void mhzIsMegahertzInAnyCase() {
        // IEEE 488.2-1992 §7.7.3 / SCPI-1999 Vol 1 §7.2.2 (clause from memory): suffixes are case-insensitive and
        // MHZ is the standard exception (mega), so mHz is megahertz too
        c.send("SOUR:FREQ 1MHZ");
        assertEquals(1e6, c.number("SOUR:FREQ?"));
        c.send("SOUR:FREQ 2mHz");
        assertEquals(2e6, c.number("SOUR:FREQ?"));
        c.send("SOUR:FREQ 3MAHZ");
        assertEquals(3e6, c.number("SOUR:FREQ?"));
    }

    @Test
    void mohmIsMegohm() {
        // IEEE 488.2-1992 §7.7.3 (clause from memory): MOHM is megohm, the other exception
        c.send("IMP:RANG 1MOHM");
        assertEquals(1e6, c.number("IMP:RANG?"));
        c.send("IMP:RANG 10KOHM");
        assertEquals(1e4, c.number("IMP:RANG?"));
    }

    @Test
    void maAfterACurrentIsMilliampereAndMaaIsMegaampere() {
        // IEEE 488.2-1992 §7.7.3 (clause from memory): MA after a current is milliampere; mega-ampere is MAA
        c.send("SOUR:CURR 5MA");
        assertEquals(5e-3, c.number("SOUR:CURR?"), 1e-18);
        c.send("SOUR:CURR 1MAA");
        assertEquals(List.of(-222), c.codes());
        assertEquals(5e-3, c.number("SOUR:CURR?"), 1e-18);
    }

    @Test
    void aSuffixOfAnotherUnitIsInvalidAndOneOnAPlainNumberIsNotAllowed() {
        // IEEE 488.2 §7.7.3 / SCPI-1999 Vol 2 §21.8.9: -131 invalid suffix, -138 suffix not allowed
        c.send("SOUR:FREQ 1V");
        c.send("SOUR:CURR 5MV");
        c.send("AVER:COUN 4HZ");
        assertEquals(List.of(-131, -131, -138), c.codes());
    }

    @Test
    void minimumMaximumAndDefaultAreValuesAndQueryArguments() {
        // SCPI-1999 Vol 1 §7.2.1.1–7.2.1.2
        c.send("SOUR:FREQ MAX");
        assertEquals(TestBench.LIMITS.maxFrequencyHz(), c.number("SOUR:FREQ?"));
        c.send("SOUR:FREQ minimum");
        assertEquals(TestBench.LIMITS.minFrequencyHz(), c.number("SOUR:FREQ?"));
        assertEquals(TestBench.LIMITS.maxVoltageVrms(), c.number("SOUR:VOLT? MAX"));
        assertEquals(TestBench.LIMITS.minVoltageVrms(), c.number("SOUR:VOLT? MIN"));
        c.send("SOUR:FREQ DEF");
        assertEquals(1000, c.number("SOUR:FREQ?")); // our *RST default
        assertEquals(1000, c.number("SOUR:FREQ? DEF"));
    }

    @Test
    void anOutOfRangeValueIsRefusedAndLeavesTheSettingUnchanged() {
        // SCPI-1999 Vol 2 §21.8.10: -222 Data out of range
        c.send("SOUR:FREQ 1234");
        c.send("SOUR:FREQ 1E9");
        c.send("SOUR:VOLT 5");
        c.send("SOUR:LIST:FREQ 100,200");
        c.send("SOUR:LIST:FREQ 100,1E12,300");
        List<String> errors = c.errors();
        assertEquals(3, errors.size());
        for (String e : errors) {
            // SCPI-1999 Vol 2 §21.8: the standard text, then ;device-dependent info
            assertEquals(true, e.startsWith("-222,\"Data out of range;"), e);
        }
        assertEquals(1234, c.number("SOUR:FREQ?"));
        assertEquals(1.0, c.number("SOUR:VOLT?"));
        assertEquals("1.0E+02,2.0E+02", c.send("SOUR:LIST:FREQ?"));
    }

    @Test
    void aValueOfTheWrongTypeIsADataTypeErrorAndAWordNotInTheListIsIllegal() {
        // SCPI-1999 Vol 2 §21.8.9/§21.8.10: -104 data type error, -224 illegal parameter value
        c.send("SOUR:FREQ \"abc\"");
        c.send("SOUR:FREQ ABC");
        c.send("FORM:BORD 5");
        c.send("TRIG:SOUR FOO");
        c.send("SENS:FUNC \"RESistance\"");
        assertEquals(List.of(-104, -104, -104, -224, -224), c.codes());
        assertEquals("IMM", c.send("TRIG:SOUR?"));
    }

    @Test
    void missingAndExtraParametersAreReported() {
        // SCPI-1999 Vol 2 §21.8.9: -109 missing parameter, -108 parameter not allowed
        c.send("SOUR:FREQ");
        c.send("*RST 1");
        c.send("SOUR:FREQ 1,2");
        assertEquals(List.of(-109, -108, -108), c.codes());
    }

    @Test
    void booleansAcceptOnOffAndNumbersAndAnswerOneOrZero() {
        // SCPI-1999 Vol 1 §7.3: ON|OFF|NRf, the NRf rounded, non-zero meaning 1; queries answer 1|0
        c.send("SOUR:VOLT:OFFS:STAT ON");
        assertEquals("1", c.send("SOUR:VOLT:OFFS:STAT?"));
        c.send("SOUR:VOLT:OFFS:STAT 0");
        assertEquals("0", c.send("SOUR:VOLT:OFFS:STAT?"));
        c.send("SOUR:VOLT:OFFS:STAT 0.7");
        assertEquals("1", c.send("SOUR:VOLT:OFFS:STAT?"));
        c.send("SOUR:VOLT:OFFS:STAT 0.2");
        assertEquals("0", c.send("SOUR:VOLT:OFFS:STAT?"));
        c.send("SOUR:VOLT:OFFS:STAT MAYBE");
        assertEquals(List.of(-224), c.codes());
    }

    @Test
    void enumerationsAreAnsweredInUpperCaseShortForm() {
        // SCPI-1999 Vol 1 §7.1 (character data): a query returns the short form in upper case
        c.send("TRIG:SOUR bus");
        assertEquals("BUS", c.send("TRIG:SOUR?"));
        c.send("TRIG:SOUR immediate");
        assertEquals("IMM", c.send("TRIG:SOUR?"));
        c.send("FORM:BORD swapped");
        assertEquals("SWAP", c.send("FORM:BORD?"));
        c.send("SOUR:FREQ:MODE list");
        assertEquals("LIST", c.send("SOUR:FREQ:MODE?"));
        assertEquals("ASC", c.send("FORM?"));
        c.send("FORM REAL,64");
        assertEquals("REAL,64", c.send("FORM:DATA?"));
        c.send("FORM REAL,32");
        assertEquals(List.of(-224), c.codes());
    }

    @Test
    void stringsTakeEitherQuoteAndAreAnsweredInDoubleQuotes() {
        // IEEE 488.2 §7.7.5 and §8.7.8
        c.send("SENS:FUNC 'VOLT:RAT'");
        assertEquals("\"VOLT:RAT\"", c.send("SENS:FUNC?"));
        c.send("FUNC \"impedance\"");
        assertEquals("\"IMP\"", c.send("FUNC?"));
        c.send("FUNC \"IMP");
        assertEquals(List.of(-151), c.codes());
    }

    @Test
    void characterDataLongerThanTwelveCharactersIsTooLong() {
        // IEEE 488.2 §7.7.1.4: -144
        c.send("TRIG:SOUR IMMEDIATEXXXXX");
        assertEquals(List.of(-144), c.codes());
    }

    @Test
    void nonDecimalNumbersAreAccepted() {
        // IEEE 488.2 §7.7.4: #H, #Q, #B
        c.send("*ESE #H24");
        assertEquals("36", c.send("*ESE?"));
        c.send("*ESE #Q17");
        assertEquals("15", c.send("*ESE?"));
        c.send("*ESE #B101");
        assertEquals("5", c.send("*ESE?"));
    }

    @Test
    void numberSyntaxErrorsHaveTheirOwnNumbers() {
        // SCPI-1999 Vol 2 §21.8.9: -121 invalid character in number, -123 exponent too large
        c.send("SOUR:FREQ 1.2.3");
        c.send("SOUR:FREQ 1E40000");
        assertEquals(List.of(-121, -123), c.codes());
    }

    @Test
    void expressionsAreNotAccepted() {
        // SCPI-1999 Vol 2 §21.8.9: -178 expression data not allowed
        c.send("SOUR:FREQ (@1)");
        assertEquals(List.of(-178), c.codes());
    }

    @Test
    void nr3RepliesReadBackAsTheSameDouble() {
        // IEEE 488.2 §8.7.4: NR3 with an explicit point and exponent
        assertEquals("1.0E+03", Numbers.nr3(1000));
        assertEquals("-2.5E-07", Numbers.nr3(-2.5e-7));
        assertEquals("9.91E+37", Numbers.nr3(Double.NaN)); // SCPI-1999 Vol 1 §7.2.1.5
        double x = 0.1 + 0.2;
        assertEquals(x, Double.parseDouble(Numbers.nr3(x)));
    }
}
