package org.zweep.driver.scpi;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;

class ScpiClientTest {
    private final ScriptedTransport meter = new ScriptedTransport();

    private ScpiClient client() {
        return client(ScpiSettings.builder().clearOnConnect(false).build());
    }

    private ScpiClient client(ScpiSettings settings) {
        return ScpiClient.connect(meter, settings);
    }

    private static byte[] ascii(String s) {
        return s.getBytes(StandardCharsets.ISO_8859_1);
    }

    private static byte[] concat(byte[]... parts) {
        int n = 0;
        for (byte[] p : parts) {
            n += p.length;
        }
        byte[] out = new byte[n];
        int at = 0;
        for (byte[] p : parts) {
            System.arraycopy(p, 0, out, at, p.length);
            at += p.length;
        }
        return out;
    }

    @Test
    void connectSendsClearStatusByDefault() {
        ScpiClient.connect(meter, ScpiSettings.DEFAULTS);
        assertEquals(List.of("*CLS\n"), meter.written());
    }

    @Test
    void connectCanSkipClearStatus() {
        client();
        assertEquals(List.of(), meter.written());
    }

    @Test
    void queryAppendsLfAndStripsTheTerminator() {
        meter.send("Korvane Passives,KP-LCR-1,0001,1.0\n");
        assertEquals("Korvane Passives,KP-LCR-1,0001,1.0", client().query("*IDN?"));
        assertEquals(List.of("*IDN?\n"), meter.written());
    }

    @Test
    void crBeforeLfIsDropped() {
        meter.send("1.5\r\n");
        assertEquals("1.5", client().query("VOLT?"));
    }

    @Test
    void replySplitIntoSingleBytesIsReassembled() {
        meter.sendInChunks(ascii("+1.000000E+03\r\n"), 1);
        assertEquals("+1.000000E+03", client().query("FREQ?"));
    }

    @Test
    void terminatorsAreConfigurable() {
        meter.send("42\r");
        ScpiClient c = client(ScpiSettings.builder().clearOnConnect(false).writeTerminator("\r\n")
                .readTerminator("\r").build());
        assertEquals("42", c.query("COUN?"));
        assertEquals(List.of("COUN?\r\n"), meter.written());
    }

    @Test
    void multiByteReadTerminatorSplitAcrossChunks() {
        meter.send("abc\r").send("\ndef\r\n");
        ScpiClient c = client(ScpiSettings.builder().clearOnConnect(false).readTerminator("\r\n").build());
        assertEquals("abc", c.query("A?"));
        assertEquals("def", c.query("B?"));
    }

    @Test
    void numbersInEveryResponseFormAndScpiSpecialValues() {
        meter.send("5\n").send("-0.025\n").send("+1.234E+03\n").send("9.91E37\n").send("9.9E37\n")
                .send("-9.9E37\n");
        ScpiClient c = client();
        assertEquals(5.0, c.queryNumber("A?")); // IEEE 488.2 §8.7.2 NR1
        assertEquals(-0.025, c.queryNumber("B?")); // §8.7.3 NR2
        assertEquals(1234.0, c.queryNumber("C?")); // §8.7.4 NR3
        assertTrue(Double.isNaN(c.queryNumber("D?"))); // SCPI-1999 Vol 1 §7.2.1.5: NAN = 9.91E37
        assertEquals(Double.POSITIVE_INFINITY, c.queryNumber("E?")); // §7.2.1.4: INFinity = 9.9E37
        assertEquals(Double.NEGATIVE_INFINITY, c.queryNumber("F?")); // §7.2.1.4: NINFinity = -9.9E37
    }

    @Test
    void aReplyThatIsNotANumberIsAProtocolErrorNamingIt() {
        meter.send("OVLD\n");
        ScpiProtocolException e = assertThrows(ScpiProtocolException.class, () -> client().queryNumber("FETC?"));
        assertTrue(e.getMessage().contains("'FETC?'") && e.getMessage().contains("'OVLD'"), e.getMessage());
    }

    @Test
    void integersAcceptNr1AndIntegralNr3Only() {
        meter.send("+12\n").send("1.6E+01\n").send("1.5\n");
        ScpiClient c = client();
        assertEquals(12, c.queryInteger("A?"));
        assertEquals(16, c.queryInteger("B?"));
        assertThrows(ScpiProtocolException.class, () -> c.queryInteger("C?"));
    }

    @Test
    void listsSplitOutsideQuotes() {
        meter.send("1,2.5,-3E-3\n").send("\"a,b\",CS,9.91E37\n");
        ScpiClient c = client();
        assertArrayEquals(new double[] {1, 2.5, -0.003}, c.queryNumbers("DATA?"));
        assertEquals(List.of("\"a,b\"", "CS", "9.91E37"), c.queryList("STAT?"));
    }

    @Test
    void definiteBlockFromTheStandardsExample() {
        meter.send("#210ABCDEFGHIJ\n").send("#800000010ABCDEFGHIJ\n"); // IEEE 488.2-1992 §8.7.9: #<n><n digits of length><bytes>
        ScpiClient c = client();
        assertArrayEquals(ascii("ABCDEFGHIJ"), c.queryBlock("DATA?"));
        assertArrayEquals(ascii("ABCDEFGHIJ"), c.queryBlock("DATA?"));
    }

    @Test
    void definiteBlockMayCarryTerminatorBytes() {
        byte[] payload = {'\n', 0, '\r', '\n', (byte) 0xff};
        meter.sendBytes(concat(ascii("#15"), payload, ascii("\n")));
        assertArrayEquals(payload, client().queryBlock("DATA?"));
    }

    @ParameterizedTest(name = "payload of {0} bytes")
    @ValueSource(ints = {ScpiClient.BUFFER_SIZE - 7, ScpiClient.BUFFER_SIZE - 6, ScpiClient.BUFFER_SIZE,
        ScpiClient.BUFFER_SIZE + 1, 3 * ScpiClient.BUFFER_SIZE})
    void blocksAtBufferBoundariesParse(int size) {
        byte[] payload = new byte[size];
        for (int i = 0; i < size; i++) {
            payload[i] = (byte) (i * 31);
        }
        String header = "#" + String.valueOf(size).length() + size;
        // chunks exactly the size of the client's buffer, so header, payload and terminator straddle refills
        meter.sendInChunks(concat(ascii(header), payload, ascii("\n")), ScpiClient.BUFFER_SIZE);
        meter.send("after\n");
        ScpiClient c = client();
        assertArrayEquals(payload, c.queryBlock("DATA?"));
        assertEquals("after", c.query("NEXT?"));
    }

    @Test
    void lineOfExactlyTheBufferSizeParses() {
        String text = "x".repeat(ScpiClient.BUFFER_SIZE - 1);
        meter.sendInChunks(ascii(text + "\n"), ScpiClient.BUFFER_SIZE);
        assertEquals(text, client().query("A?"));
    }

    @Test
    void indefiniteBlockEndsAtTheTerminator() {
        meter.send("#0HELLO\n"); // IEEE 488.2 §8.7.10
        assertArrayEquals(ascii("HELLO"), client().queryBlock("DATA?"));
    }

    @Test
    void blocksThenTextOnOneLineAreReadAsTheyCame() {
        // IEEE 488.2 §8.4.2: definite-length blocks, response units separated by ';', one terminator
        byte[] first = {'\n', ';', 0, (byte) 0xff};
        byte[] second = ascii("AB;\n");
        meter.sendBytes(concat(ascii("#14"), first, ascii(";#14"), second, ascii(";0,\"No error\"\n")));
        meter.send("ok\n");
        ScpiClient c = client();
        ScpiSession.BlocksReply r = c.queryBlocksThenText("READ?;FETC?;SYST:ERR?", 2, java.time.Duration.ZERO);
        assertEquals(2, r.blocks().size());
        assertArrayEquals(first, r.blocks().get(0));
        assertArrayEquals(second, r.blocks().get(1));
        assertEquals("0,\"No error\"", r.text());
        assertEquals("ok", c.query("NEXT?"));
    }

    @Test
    void aFailedQueryLeavesOnlyTheTextAndTheConversationStaysInStep() {
        // IEEE 488.2 §6.3.2.3: a query that fails sends no response; the error query still answers
        meter.send("-230,\"Data corrupt or stale\"\n").send("#12AB\n").send("ok\n");
        ScpiClient c = client();
        ScpiSession.BlocksReply r = c.queryBlocksThenText("READ?;FETC?;SYST:ERR?", 2, java.time.Duration.ZERO);
        assertEquals(List.of(), r.blocks());
        assertEquals("-230,\"Data corrupt or stale\"", r.text());
        ScpiSession.BlocksReply only = c.queryBlocksThenText("READ?", 1, java.time.Duration.ZERO);
        assertArrayEquals(ascii("AB"), only.blocks().get(0));
        assertEquals("", only.text());
        assertEquals("ok", c.query("NEXT?"));
    }

    @Test
    void aReplyThatIsNotABlockIsAProtocolErrorAndTheConversationStaysInStep() {
        meter.send("1.0,2.0\n").send("ok\n");
        ScpiClient c = client();
        ScpiProtocolException e = assertThrows(ScpiProtocolException.class, () -> c.queryBlock("DATA?"));
        assertTrue(e.getMessage().contains("not an arbitrary block"), e.getMessage());
        assertEquals("ok", c.query("NEXT?"));
    }

    @Test
    void real64InBothByteOrders() {
        // IEEE 754 binary64: 1.5 = 0x3FF8000000000000, -2.0 = 0xC000000000000000
        byte[] normal = {0x3F, (byte) 0xF8, 0, 0, 0, 0, 0, 0, (byte) 0xC0, 0, 0, 0, 0, 0, 0, 0};
        byte[] swapped = {0, 0, 0, 0, 0, 0, (byte) 0xF8, 0x3F, 0, 0, 0, 0, 0, 0, 0, (byte) 0xC0};
        meter.sendBytes(concat(ascii("#216"), normal, ascii("\n")));
        meter.sendBytes(concat(ascii("#216"), swapped, ascii("\n")));
        ScpiClient c = client();
        assertArrayEquals(new double[] {1.5, -2.0}, c.queryReal64("DATA?", BlockByteOrder.NORMAL));
        assertArrayEquals(new double[] {1.5, -2.0}, c.queryReal64("DATA?", BlockByteOrder.SWAPPED));
    }

    @Test
    void real64MapsScpiNotANumber() {
        byte[] nan = ByteBuffer.allocate(8).putDouble(9.91e37).array(); // SCPI-1999 Vol 1 §7.2.1.5
        meter.sendBytes(concat(ascii("#18"), nan, ascii("\n")));
        assertTrue(Double.isNaN(client().queryReal64("DATA?", BlockByteOrder.NORMAL)[0]));
    }

    @Test
    void real64RejectsAPayloadThatIsNotWholeValues() {
        meter.send("#15ABCDE\n");
        assertThrows(ScpiProtocolException.class, () -> client().queryReal64("DATA?", BlockByteOrder.NORMAL));
    }

    @Test
    void queryBytesReadsADefiniteBlockByItsLength() {
        meter.sendBytes(concat(ascii("#13"), new byte[] {'\n', 'a', '\n'}, ascii("\n"))).send("plain\n");
        ScpiClient c = client();
        assertArrayEquals(concat(ascii("#13"), new byte[] {'\n', 'a', '\n'}), c.queryBytes("DATA?"));
        assertArrayEquals(ascii("plain"), c.queryBytes("X?"));
    }

    @Test
    void drainErrorsReadsUntilNoErrorOldestFirst() {
        // SCPI-1999 Vol 2 §21.8: <code>,"<description>", 0,"No error" when empty
        meter.send("-113,\"Undefined header\"\n").send("-222,\"Data out of range;FREQ 5E9 > max 2E6\"\n")
                .send("+0,\"No error\"\n");
        List<ScpiError> errors = client().drainErrors();
        assertEquals(List.of(new ScpiError(-113, "Undefined header"),
                new ScpiError(-222, "Data out of range;FREQ 5E9 > max 2E6")), errors);
        assertEquals(List.of("SYST:ERR?\n", "SYST:ERR?\n", "SYST:ERR?\n"), meter.written());
    }

    @Test
    void checkErrorsThrowsOneExceptionCarryingEveryEntry() {
        meter.send("-113,\"Undefined header\"\n").send("-350,\"Queue overflow\"\n").send("0,\"No error\"\n");
        MeterErrorException e = assertThrows(MeterErrorException.class,
                () -> client().checkErrors("applying the setting"));
        assertEquals(2, e.errors().size());
        assertTrue(e.getMessage().contains("2 errors after applying the setting"), e.getMessage());
        assertTrue(e.getMessage().contains("-113,\"Undefined header\"; -350,\"Queue overflow\""), e.getMessage());
    }

    @Test
    void checkErrorsIsQuietWhenTheQueueIsEmpty() {
        meter.send("0,\"No error\"\n");
        client().checkErrors("nothing");
        assertEquals(List.of("SYST:ERR?\n"), meter.written());
    }

    @Test
    void timeoutWithNothingReceivedHintsAtTheTerminators() {
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> client().query("*IDN?"));
        assertTrue(e.getMessage().startsWith("test:scripted: no reply to '*IDN?' (waited 5.0 s; nothing received;"),
                e.getMessage());
        assertTrue(e.getMessage().contains("terminators") && e.getMessage().contains("read LF"), e.getMessage());
        assertEquals(0, e.received().length);
    }

    @Test
    void timeoutOfALongMeasurementSaysWhatWasExpectedAndDoesNotBlameTheTerminators() {
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class,
                () -> client().query(":READ?", java.time.Duration.ofMillis(12_500)));
        assertEquals("test:scripted: no reply to ':READ?' (the meter was expected to take about 12.5 s; waited"
                + " 17.5 s, 5.0 s beyond that; nothing received)", e.getMessage());
    }

    @Test
    void timeoutKeepsTheBytesReceivedSoFar() {
        meter.send("1.23");
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> client().query("FREQ?"));
        assertArrayEquals(ascii("1.23"), e.received());
        assertTrue(e.getMessage().contains("4 bytes without the read terminator LF"), e.getMessage());
        assertTrue(!e.getMessage().contains("check the"), "no terminator hint once something arrived: " + e.getMessage());
    }

    @Test
    void lateReplyAfterATimeoutIsNotTheAnswerToTheNextQuery() {
        ScpiClient c = client();
        assertThrows(MeterTimeoutException.class, () -> c.query("SLOW?"));
        meter.send("stale\n").stall().send("1\n").send("fresh\n");
        assertEquals("fresh", c.query("FAST?"));
        assertEquals(List.of("SLOW?\n", "*OPC?\n", "FAST?\n"), meter.written());
    }

    @Test
    void opcResyncSkipsALateReplyThatArrivesAfterTheDrain() {
        ScpiClient c = client();
        assertThrows(MeterTimeoutException.class, () -> c.query("SLOW?"));
        meter.stall().send("stale\n1\n").send("fresh\n");
        assertEquals("fresh", c.query("FAST?"));
    }

    @Test
    void drainResyncSendsNothingExtra() {
        ScpiClient c = client(ScpiSettings.builder().clearOnConnect(false).resync(Resync.DRAIN).build());
        assertThrows(MeterTimeoutException.class, () -> c.query("SLOW?"));
        meter.send("sta").send("le\n").stall().send("fresh\n");
        assertEquals("fresh", c.query("FAST?"));
        assertEquals(List.of("SLOW?\n", "FAST?\n"), meter.written());
    }

    @Test
    void overLongReplyIsAProtocolErrorAndTheRestIsDiscarded() {
        ScpiClient c = client(ScpiSettings.builder().clearOnConnect(false).maxResponseBytes(10).build());
        meter.send("0123456789A").send("BCDEF\n").stall().send("1\n").send("ok\n");
        ScpiProtocolException e = assertThrows(ScpiProtocolException.class, () -> c.query("BIG?"));
        assertTrue(e.getMessage().contains("longer than 10 bytes"), e.getMessage());
        assertEquals("ok", c.query("SMALL?"));
    }

    @Test
    void replyOfExactlyTheMaximumSizeIsAccepted() {
        ScpiClient c = client(ScpiSettings.builder().clearOnConnect(false).maxResponseBytes(10).build());
        meter.send("0123456789\r\n");
        assertEquals("0123456789", c.query("A?"));
    }

    @Test
    void blockAnnouncingMoreThanTheMaximumIsRefusedBeforeAllocating() {
        ScpiClient c = client(ScpiSettings.builder().clearOnConnect(false).maxResponseBytes(1000).build());
        meter.send("#9999999999");
        ScpiProtocolException e = assertThrows(ScpiProtocolException.class, () -> c.queryBlock("DATA?"));
        assertTrue(e.getMessage().contains("999999999 bytes"), e.getMessage());
    }

    @Test
    void malformedBlockHeaderIsAProtocolError() {
        meter.send("#2A1xyz\n");
        assertThrows(ScpiProtocolException.class, () -> client().queryBlock("DATA?"));
    }

    @Test
    void blockThatStopsShortIsATimeoutKeepingThePayloadSoFar() {
        meter.send("#210ABC");
        MeterTimeoutException e = assertThrows(MeterTimeoutException.class, () -> client().queryBlock("DATA?"));
        assertArrayEquals(ascii("ABC"), e.received());
        assertTrue(e.getMessage().contains("3 of 10 bytes"), e.getMessage());
    }

    @Test
    void peerClosingMidReplyIsConnectionLostAndLaterCallsFailAtOnce() {
        meter.send("Korvane").end();
        ScpiClient c = client();
        ConnectionLostException e = assertThrows(ConnectionLostException.class, () -> c.query("*IDN?"));
        assertTrue(e.getMessage().contains("'*IDN?'") && e.getMessage().contains("7 bytes received"),
                e.getMessage());
        ConnectionLostException again = assertThrows(ConnectionLostException.class, () -> c.write("*RST"));
        assertTrue(again.getMessage().contains("lost earlier"), again.getMessage());
        assertEquals(List.of("*IDN?\n"), meter.written());
    }

    @Test
    void waitForCompletionExpectsOne() {
        meter.send("1\n").send("0\n");
        ScpiClient c = client();
        c.waitForCompletion(java.time.Duration.ofSeconds(1));
        assertThrows(ScpiProtocolException.class, () -> c.waitForCompletion(java.time.Duration.ofSeconds(1)));
    }

    @Test
    void callsAfterCloseFailAsConnectionLost() {
        ScpiClient c = client();
        c.close();
        c.close();
        assertTrue(meter.closed());
        assertThrows(ConnectionLostException.class, () -> c.query("*IDN?"));
    }

    @Test
    void queryBytesOnABlockWithoutLengthDigitsReadsTheLine() {
        meter.send("#0abc\n");
        assertEquals("#0abc", new String(client().queryBytes("X?"), StandardCharsets.ISO_8859_1));
    }
}
