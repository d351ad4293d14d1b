package org.zweep.simulator.scpi;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

/** The error queue, the status registers and the common commands. */
class StatusTest {
    private Console c = new Console();

    @AfterEach
    void close() {
        c.close();
    }

    @Test
    void theErrorQueueIsFirstInFirstOutAndSaysNoErrorWhenEmpty() {
        // SCPI-1999 Vol 2 §21.8.1
        c.send("BOGUS");
        c.send("SOUR:FREQ 1E12");
        assertEquals("2", c.send("SYST:ERR:COUN?")); // SCPI-1999 Vol 2 §21.8.6
        assertTrue(c.send("SYST:ERR?").startsWith("-113,\"Undefined header"));
        assertTrue(c.send("SYST:ERR:NEXT?").startsWith("-222,\"Data out of range"));
        assertEquals("0,\"No error\"", c.send("SYST:ERR?"));
        assertEquals("0", c.send("SYST:ERR:COUN?"));
    }

    @Test
    void aFullQueueReplacesItsLastEntryByQueueOverflow() {
        // SCPI-1999 Vol 2 §21.8.1: the most recent slot becomes -350,"Queue overflow"
        c.close();
        c = new Console(TestBench.resistor(), InstrumentOptions.defaults().withTiming(TimingModel.NONE)
                .withErrorQueueDepth(4), Sleeper.THREAD);
        for (String m : List.of("A", "SOUR:FREQ 1E12", "B", "SOUR:VOLT 99", "C", "D")) {
            c.send(m);
        }
        assertEquals("4", c.send("SYST:ERR:COUN?"));
        assertEquals(List.of("-113,\"Undefined header;A\"", "-222", "-113,\"Undefined header;B\"",
                "-350,\"Queue overflow\""), summarise(c.errors()));
        c.send("E");
        assertEquals(List.of(-113), c.codes());
    }

    private static List<String> summarise(List<String> errors) {
        return errors.stream().map(e -> e.startsWith("-222") ? "-222" : e).toList();
    }

    @Test
    void clsClearsTheErrorQueueAndRstDoesNot() {
        // IEEE 488.2 §10.3 (*CLS) and §10.32 (*RST leaves the error queue)
        c.send("BOGUS");
        c.send("*RST");
        assertEquals("1", c.send("SYST:ERR:COUN?"));
        c.send("*CLS");
        assertEquals("0", c.send("SYST:ERR:COUN?"));
    }

    @Test
    void rstRestoresSettingsButNotTheEnableRegisters() {
        // IEEE 488.2 §10.32: *RST does not change *ESE, *SRE or the event registers
        c.send("*ESE 36;*SRE 16;SOUR:FREQ 5E3");
        c.send("*RST");
        assertEquals(1000, c.number("SOUR:FREQ?"));
        assertEquals("36", c.send("*ESE?"));
        assertEquals("16", c.send("*SRE?"));
    }

    @Test
    void theStandardTextsAreExactlyThoseOfScpi1999() {
        // SCPI-1999 Vol 2 §21.8.9–21.8.12
        Map<Integer, String> texts = Map.ofEntries(
                Map.entry(-100, "Command error"), Map.entry(-101, "Invalid character"),
                Map.entry(-102, "Syntax error"), Map.entry(-103, "Invalid separator"),
                Map.entry(-104, "Data type error"), Map.entry(-108, "Parameter not allowed"),
                Map.entry(-109, "Missing parameter"), Map.entry(-112, "Program mnemonic too long"),
                Map.entry(-113, "Undefined header"), Map.entry(-114, "Header suffix out of range"),
                Map.entry(-120, "Numeric data error"), Map.entry(-131, "Invalid suffix"),
                Map.entry(-138, "Suffix not allowed"), Map.entry(-200, "Execution error"),
                Map.entry(-213, "Init ignored"), Map.entry(-221, "Settings conflict"),
                Map.entry(-222, "Data out of range"), Map.entry(-224, "Illegal parameter value"),
                Map.entry(-230, "Data corrupt or stale"), Map.entry(-350, "Queue overflow"),
                Map.entry(-363, "Input buffer overrun"), Map.entry(-410, "Query INTERRUPTED"),
                Map.entry(-420, "Query UNTERMINATED"));
        texts.forEach((code, text) -> assertEquals(text, StandardError.of(code).text(), "text of " + code));
    }

    @Test
    void eachErrorClassSetsItsOneEventStatusBit() {
        // IEEE 488.2 §11.5.1; SCPI-1999 Vol 2 §21.8.9–21.8.12: -1xx CME 32, -2xx EXE 16, -3xx DDE 8, -4xx QYE 4
        c.send("*ESR?"); // clears the power-on bit
        c.send("BOGUS");
        assertEquals("32", c.send("*ESR?"));
        c.send("SOUR:FREQ 1E12");
        assertEquals("16", c.send("*ESR?"));
        c.session.report(StandardError.INPUT_BUFFER_OVERRUN, null);
        assertEquals("8", c.send("*ESR?"));
        c.session.report(StandardError.QUERY_INTERRUPTED, null);
        assertEquals("4", c.send("*ESR?"));
        assertEquals("0", c.send("*ESR?")); // IEEE 488.2 §10.12: reading clears it
    }

    @Test
    void theFirstEventStatusReadShowsPowerOn() {
        // IEEE 488.2 §11.5.1: bit 7 PON is set at power-on
        assertEquals("128", c.send("*ESR?"));
        assertEquals("0", c.send("*ESR?"));
    }

    @Test
    void opcSetsOperationCompleteWhenNothingIsPending() {
        // IEEE 488.2 §10.18 / §12.5.2
        c.send("*ESR?");
        c.send("*OPC");
        assertEquals("1", c.send("*ESR?"));
    }

    @Test
    void theStatusByteShowsErrorQueueMessageAvailableEventSummaryAndMasterSummary() {
        // IEEE 488.2 §11.2 / §10.36; SCPI-1999 Vol 2 §20: EAV bit 2, MAV bit 4, ESB bit 5, MSS bit 6
        c.send("*ESR?");
        assertEquals("0", c.send("*STB?"));
        assertEquals(Instrument.IDENTIFICATION + ";16", c.send("*IDN?;*STB?"));
        c.send("*ESE 32");
        c.send("BOGUS");
        assertEquals("36", c.send("*STB?")); // EAV 4 + ESB 32
        assertEquals("36", c.send("*STB?")); // *STB? clears nothing
        c.send("*SRE 4");
        assertEquals("100", c.send("*STB?")); // + MSS 64
        c.send("*CLS");
        assertEquals("0", c.send("*STB?"));
    }

    @Test
    void serviceRequestEnableIgnoresBitSix() {
        // IEEE 488.2-1992 §11.3.2 (from memory): bit 6 of *SRE reads back 0
        c.send("*SRE 255");
        assertEquals("191", c.send("*SRE?"));
    }

    @Test
    void identificationHasFourFieldsWithinSeventyTwoCharacters() {
        // IEEE 488.2-1992 §10.14; SCPI-1999 Vol 1 §4.1.3.6 (at most 72 characters: restated in conformance
        // chapters, the clause itself from memory)
        String idn = c.send("*IDN?");
        assertEquals(4, idn.split(",", -1).length);
        assertTrue(idn.length() <= 72, idn);
        assertEquals(Instrument.MANUFACTURER, idn.split(",")[0]);
    }

    @Test
    void selfTestPassesAndTheScpiVersionIs1999() {
        // IEEE 488.2 §10.38: 0 = passed; SCPI-1999 Vol 2 §21.21: YYYY.V
        assertEquals("0", c.send("*TST?"));
        assertEquals("1999.0", c.send("SYST:VERS?"));
    }

    @Test
    void operationEventsLatchAndSummariseIntoTheStatusByte() {
        // SCPI-1999 Vol 2 §20.1.4 (event register latches, reading clears), STB bit 7 OPER summary
        c.send("*ESR?");
        c.send("STAT:OPER:ENAB 16");
        assertEquals("16", c.send("STAT:OPER:ENAB?"));
        c.send("READ?");
        assertEquals("128", c.send("*STB?"));
        assertEquals("0", c.send("STAT:OPER:COND?"));
        assertEquals("16", c.send("STAT:OPER?")); // MEASuring happened
        assertEquals("0", c.send("STAT:OPER:EVEN?"));
        c.send("STAT:PRES");
        assertEquals("0", c.send("STAT:OPER:ENAB?")); // SCPI-1999 Vol 2 §20.2
    }

    @Test
    void anOverloadSetsTheQuestionableOverloadBit() {
        // SCPI-1999 Vol 2 §20: QUEStionable bits 9–12 are designer-defined; we use bit 9 for overload
        c.send("IMP:RANG 1"); // the 100 Ω resistor overloads the 1 Ω range
        c.send("READ?");
        assertEquals("512", c.send("STAT:QUES:COND?"));
        assertEquals("512", c.send("STAT:QUES?"));
        c.send("STAT:QUES:ENAB 512");
        assertEquals("0", c.send("STAT:QUES?"));
        c.send("IMP:RANG:AUTO ON;:READ?");
        assertEquals("0", c.send("STAT:QUES:COND?"));
    }
}
