package org.zweep.driver.scpi;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class ErrorQueueTest {

    @Test
    void errorReplyThatIsNoErrorWithCharactersReplacedIsTakenForCorruptionNotAMeterError() {
        // seen from the simulator's garble fault: 0,"No error" with the code and both quotes replaced
        assertTrue(ErrorQueue.nearNoError("6,=No errHr:"));
        assertTrue(ErrorQueue.nearNoError("8,\"No error\""));
        // real errors (SCPI-1999 Vol 2 §21.8, -222 "Data out of range"; a device-specific one) are not
        assertFalse(ErrorQueue.nearNoError("-222,\"Data out of range\""));
        assertFalse(ErrorQueue.nearNoError("1,\"Overload\""));
    }

    @Test
    void anEntryIsParsedWithItsDoubledQuotesUndone() {
        // SCPI-1999 Vol 2 §21.8 entry form; IEEE 488.2 §7.7.5 doubled quote
        assertEquals(new ScpiError(-222, "Data out of range"), ErrorQueue.parse("m", "-222,\"Data out of range\"", "x"));
        assertEquals(new ScpiError(24, "JIG wants \"PART\""), ErrorQueue.parse("m", "+24,\"JIG wants \"\"PART\"\"\"", "x"));
        assertEquals(new ScpiError(0, "none"), ErrorQueue.parse("m", "0,\"none\"", "x"));
        assertEquals(new ScpiError(0, ""), ErrorQueue.parse("m", "0", "x"));
    }

    @Test
    void aMeasurementTakenForAnErrorReplyIsRefusedNamingTheReply() {
        ScpiProtocolException e = assertThrows(ScpiProtocolException.class,
                () -> ErrorQueue.parse("tcp://m", "1.59e+03,-8.99e+01", "measuring at 1000 Hz"));
        assertEquals("tcp://m: reply '1.59e+03,-8.99e+01' to the error query is not 'code,\"text\"' while measuring"
                + " at 1000 Hz", e.getMessage());
    }
}
