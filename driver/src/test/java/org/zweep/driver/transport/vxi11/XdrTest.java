package org.zweep.driver.transport.vxi11;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

/** XDR as RFC 4506 lays it out, byte by byte. */
class XdrTest {

    @Test
    void integersAreFourBytesBigEndian() {
        // RFC 4506 §4.1, §4.2: 32-bit two's complement / unsigned, most significant byte first
        assertArrayEquals(new byte[] {0x00, 0x06, 0x07, (byte) 0xAF, (byte) 0xFF, (byte) 0xFF, (byte) 0xFF, (byte) 0xFE},
                new XdrEncoder().putInt(0x0607AF).putInt(-2).toByteArray());
    }

    @Test
    void opaqueDataIsLengthThenBytesThenZeroPaddingToFour() {
        // RFC 4506 §4.10: n, the n bytes, then (4 - n mod 4) mod 4 zero bytes
        assertArrayEquals(new byte[] {0, 0, 0, 5, 'i', 'n', 's', 't', '0', 0, 0, 0},
                new XdrEncoder().putString("inst0").toByteArray());
        assertArrayEquals(new byte[] {0, 0, 0, 4, '*', 'I', 'D', 'N'},
                new XdrEncoder().putOpaque("*IDN".getBytes(), 0, 4).toByteArray());
    }

    @Test
    void decodingReadsBackWhatWasEncodedAndSkipsThePadding() {
        byte[] b = new XdrEncoder().putString("gpib0,5").putBoolean(true).putInt(-7).toByteArray();
        XdrDecoder d = new XdrDecoder(b, 0, b.length);
        assertEquals("gpib0,5", new String(d.getOpaque(64)));
        assertEquals(true, d.getBoolean());
        assertEquals(-7, d.getInt());
        assertEquals(0, d.remaining());
    }

    @Test
    void aShortRecordOrAnOversizedOpaqueIsRefused() {
        byte[] b = {0, 0, 0, 9, 'a', 'b'};
        assertThrows(XdrDecoder.XdrException.class, () -> new XdrDecoder(b, 0, b.length).getOpaque(64));
        assertThrows(XdrDecoder.XdrException.class, () -> new XdrDecoder(b, 0, b.length).getOpaque(8));
        byte[] notBool = {0, 0, 0, 2};
        assertThrows(XdrDecoder.XdrException.class, () -> new XdrDecoder(notBool, 0, 4).getBoolean());
    }
}
