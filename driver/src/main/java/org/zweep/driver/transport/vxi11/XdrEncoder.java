package org.zweep.driver.transport.vxi11;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;

/** XDR encoding (RFC 4506): big-endian 4-byte units, variable-length opaque data padded to 4 bytes. */
final class XdrEncoder {
    private byte[] bytes = new byte[64];
    private int length;

    /** An unsigned or signed 32-bit integer (RFC 4506 §4.1, §4.2); also enums and booleans. */
    XdrEncoder putInt(int value) {
        ensure(4);
        bytes[length++] = (byte) (value >>> 24);
        bytes[length++] = (byte) (value >>> 16);
        bytes[length++] = (byte) (value >>> 8);
        bytes[length++] = (byte) value;
        return this;
    }

    /** A boolean (RFC 4506 §4.4): an int, 0 or 1. */
    XdrEncoder putBoolean(boolean value) {
        return putInt(value ? 1 : 0);
    }

    /** Variable-length opaque data (RFC 4506 §4.10): its length, the bytes, zero padding to a multiple of 4. */
    XdrEncoder putOpaque(byte[] data, int offset, int count) {
        putInt(count);
        ensure(count + 3);
        System.arraycopy(data, offset, bytes, length, count);
        length += count;
        while ((length & 3) != 0) {
            bytes[length++] = 0;
        }
        return this;
    }

    /** A string (RFC 4506 §4.11), ASCII. */
    XdrEncoder putString(String s) {
        byte[] b = s.getBytes(StandardCharsets.US_ASCII);
        return putOpaque(b, 0, b.length);
    }

    int length() {
        return length;
    }

    byte[] toByteArray() {
        return Arrays.copyOf(bytes, length);
    }

    /** The encoded bytes, valid up to {@link #length()}; not a copy. */
    byte[] buffer() {
        return bytes;
    }

    private void ensure(int more) {
        if (length + more > bytes.length) {
            bytes = Arrays.copyOf(bytes, Math.max(bytes.length * 2, length + more));
        }
    }
}
