package org.zweep.simulator.scpi;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

/** Header rules: mnemonic forms, optional nodes, numeric suffixes and the header path. */
class HeaderTest {
    private final Console c = new Console();

    @AfterEach
    void close() {
        c.close();
    }

    @Test
    void shortAndLongFormsInAnyCaseAreAccepted() {
        // SCPI-1999 Vol 1 §6.2.1: exact short or long form, case-insensitive
        c.send("SOUR:FREQ 2000");
        assertEquals(2000, c.number("SOURCE:FREQUENCY?"));
        c.send("source:frequency:cw 3000");
        assertEquals(3000, c.number("sOuR:fReQ:Cw?"));
        assertEquals(List.of(), c.codes());
    }

    @Test
    void anythingBetweenShortAndLongFormIsAnUndefinedHeader() {
        // SCPI-1999 Vol 1 §6.2.1: FREQU is neither form, so -113
        c.send("SOUR:FREQU 2000");
        c.send("SOURC:FREQ 2000");
        assertEquals(List.of(-113, -113), c.codes());
        assertEquals(1000, c.number("SOUR:FREQ?")); // the *RST value stays
    }

    @Test
    void optionalNodesMayBeOmittedOrGiven() {
        // SCPI-1999 Vol 1 §6.2.2: [LEVel][:IMMediate][:AMPLitude] and [SENSe:] are default nodes
        c.send("SOUR:VOLT:LEV:IMM:AMPL 0.5");
        assertEquals(0.5, c.number("SOUR:VOLT?"));
        c.send("SOUR:VOLT:AMPL 0.25");
        assertEquals(0.25, c.number("SOURCE:VOLTAGE:LEVEL?"));
        c.send("IMP:RANG 100");
        assertEquals(100, c.number("SENS:IMP:RANG:UPP?"));
        assertEquals(List.of(), c.codes());
    }

    @Test
    void numericSuffixOneMayBeWrittenOrOmittedAndOthersAreOutOfRange() {
        // SCPI-1999 Vol 1 §6.2.5: an omitted suffix means 1; one that does not exist is -114
        c.send("SOUR1:FREQ 5000");
        assertEquals(5000, c.number("SOUR:FREQ?"));
        c.send("SOUR2:FREQ 7000");
        assertEquals(List.of(-114), c.codes());
        assertEquals(5000, c.number("SOUR1:FREQ?"));
    }

    @Test
    void aMnemonicLongerThanTwelveCharactersIsTooLong() {
        // IEEE 488.2 §7.6.1.4.1: at most 12 characters, else -112
        c.send("SOUR:FREQUENCYCWXX 1000");
        assertEquals(List.of(-112), c.codes());
    }

    @Test
    void afterASemicolonTheHeaderIsRelativeToThePathOfThePreviousHeader() {
        // IEEE 488.2 Appendix A / SCPI-1999 Vol 1 §6.2.4 rule 3: SOUR:VOLT 0.5;FREQ 2E3 = SOUR:FREQ 2E3
        c.send("SOUR:VOLT 0.5;FREQ 2E3");
        assertEquals(0.5, c.number("SOUR:VOLT?"));
        assertEquals(2000, c.number("SOUR:FREQ?"));
        c.send("SOUR:VOLT:OFFS 1.5;OFFS:STAT ON");
        assertEquals("1", c.send("SOUR:VOLT:OFFS:STAT?"));
        assertEquals(List.of(), c.codes());
    }

    @Test
    void theHeaderPathIsTakenFromHeadersAsTypedNotFromOmittedDefaultNodes() {
        // IEEE 488.2-1992 Appendix A / SCPI-1999 Vol 1 §6.2.4 (header-path traversal): after a unit the path is
        // its header up to the last mnemonic. Whether an omitted default node counts is left open; the
        // simulator applies the rule to headers as typed, so IMP:APER sets
        // the path IMP:, so AVER:COUN after it is IMP:AVER:COUN, which does not exist
        c.send("IMP:APER 0.2;AVER:COUN 4");
        assertEquals(List.of(-113), c.codes());
        assertEquals(0.2, c.number("IMP:APER?"));
        assertEquals(1, c.number("AVER:COUN?"));
    }

    @Test
    void aLeadingColonResolvesFromTheRoot() {
        // IEEE 488.2 Appendix A / SCPI-1999 Vol 1 §6.2.4 rule 2
        c.send("SOUR:FREQ 3E3;:TRIG:SOUR BUS");
        assertEquals("BUS", c.send("TRIG:SOUR?"));
        c.send("SOUR:FREQ 4E3;TRIG:SOUR IMM");
        assertEquals(List.of(-113), c.codes());
        assertEquals("BUS", c.send("TRIG:SOUR?"));
    }

    @Test
    void commonCommandsBetweenUnitsNeitherUseNorChangeThePath() {
        // IEEE 488.2 Appendix A / SCPI-1999 Vol 1 §6.2.4 rule 4
        assertEquals("0;5.0E-01", c.send("SOUR:FREQ 6E3;*ESE?;VOLT 0.5;*CLS;VOLT?"));
        assertEquals(6000, c.number("SOUR:FREQ?"));
        assertEquals(List.of(), c.codes());
    }

    @Test
    void everyNewMessageStartsAtTheRoot() {
        // IEEE 488.2 Appendix A / SCPI-1999 Vol 1 §6.2.4 rule 1
        c.send("SOUR:VOLT 0.5");
        c.send("FREQ 2E3");
        assertEquals(List.of(-113), c.codes());
    }

    @Test
    void aCommandErrorDiscardsTheRestOfTheMessageAndAnExecutionErrorDoesNot() {
        // our policy within IEEE 488.2 §6.1.6: units before an error ran; -1xx ends the message, -2xx not
        assertNull(c.send("SOUR:FREQ 2E3;FREQ 9E99;FREQ 3E3;BOGUS;FREQ 4E3"));
        assertEquals(List.of(-222, -113), c.codes());
        assertEquals(3000, c.number("SOUR:FREQ?"));
    }

    @Test
    void queryResponsesOfOneMessageAreJoinedBySemicolons() {
        // IEEE 488.2-1992 §8.4.1: the responses of one message are joined by ';' in one line
        assertEquals("1.0E+03;1.0E+00", c.send("SOUR:FREQ?;VOLT?"));
    }

    @Test
    void aSyntaxErrorIsReportedWithTheStandardNumber() {
        // SCPI-1999 Vol 2 §21.8.9: -101 invalid character, -102 syntax, -103 separator, -111 header separator
        c.send("SOUR:FREQ& 1");
        c.send("SOUR::FREQ 1");
        c.send("SOUR:FREQ 1 2");
        c.send("*ESE\"1\"");
        assertEquals(List.of(-101, -102, -103, -111), c.codes());
    }

    @Test
    void aTrailingSemicolonAndWhiteSpaceIncludingCrAreTolerated() {
        // IEEE 488.2 §7.4.1.2: CR is white space, so a CR LF terminator works
        assertEquals("1.0E+03", c.send("  SOUR:FREQ? ;\r"));
        assertEquals(List.of(), c.codes());
    }
}
