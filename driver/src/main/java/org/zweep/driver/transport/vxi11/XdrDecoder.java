package org.zweep.driver.transport.vxi11;

/** XDR decoding (RFC 4506) of one RPC record; a short or malformed record is an {@link XdrException}. */
final class XdrDecoder {
    private final byte[] bytes;
    private final int end;
    private int pos;

    XdrDecoder(byte[] bytes, int offset, int length) {
        this.bytes = bytes;
        this.pos = offset;
        this.end = offset + length;
    }

    int getInt() {
        need(4, "a 4-byte integer");
        int v = ((bytes[pos] & 0xff) << 24) | ((bytes[pos + 1] & 0xff) << 16) | ((bytes[pos + 2] & 0xff) << 8)
                | (bytes[pos + 3] & 0xff);
        pos += 4;
        return v;
    }

    /** An unsigned 32-bit integer as a long. */
    long getUnsignedInt() {
        return getInt() & 0xffff_ffffL;
    }

    boolean getBoolean() {
        int v = getInt();
        if (v != 0 && v != 1) {
            throw new XdrException("a boolean is " + v + ", not 0 or 1");
        }
        return v == 1;
    }

    /** Variable-length opaque data with at most {@code max} bytes (RFC 4506 §4.10). */
    byte[] getOpaque(int max) {
        long n = getUnsignedInt();
        if (n > max) {
            throw new XdrException("opaque data of " + n + " bytes, more than the " + max + " allowed");
        }
        int padded = (int) ((n + 3) & ~3L);
        need(padded, n + " bytes of opaque data");
        byte[] out = new byte[(int) n];
        System.arraycopy(bytes, pos, out, 0, (int) n);
        pos += padded;
        return out;
    }

    /** Skips opaque data of at most {@code max} bytes (e.g. an authentication body). */
    void skipOpaque(int max) {
        getOpaque(max);
    }

    int remaining() {
        return end - pos;
    }

    private void need(int n, String what) {
        if (end - pos < n) {
            throw new XdrException("the record ends " + (end - pos) + " bytes into " + what);
        }
    }

    /** A record that does not decode as the procedure's result. */
    static final class XdrException extends RuntimeException {
        private static final long serialVersionUID = 1L;

        XdrException(String message) {
            super(message);
        }
    }
}
