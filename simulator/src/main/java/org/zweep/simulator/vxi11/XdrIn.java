package org.zweep.simulator.vxi11;

import java.nio.BufferUnderflowException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;

/** Reads XDR items (RFC 4506) from one call's arguments; running out is {@link GarbageArgs}. */
final class XdrIn {
    private final ByteBuffer in;

    XdrIn(ByteBuffer in) {
        this.in = in;
    }

    int int32() {
        try {
            return in.getInt();
        } catch (BufferUnderflowException e) {
            throw new GarbageArgs("the arguments end early");
        }
    }

    long uint32() {
        return int32() & 0xffff_ffffL;
    }

    boolean bool() {
        int v = int32();
        if (v != 0 && v != 1) {
            throw new GarbageArgs("boolean " + v);
        }
        return v == 1;
    }

    /** Variable-length opaque data (RFC 4506 §4.10) of at most {@code max} bytes. */
    byte[] opaque(int max) {
        long n = uint32();
        long padded = (n + 3) & ~3L;
        if (n > max || padded > in.remaining()) {
            throw new GarbageArgs("opaque data of " + n + " bytes");
        }
        byte[] b = new byte[(int) n];
        in.get(b);
        in.position(in.position() + (int) (padded - n));
        return b;
    }

    String string(int max) {
        return new String(opaque(max), StandardCharsets.US_ASCII);
    }

    /** The call's arguments do not decode (answered GARBAGE_ARGS). */
    static final class GarbageArgs extends RuntimeException {
        private static final long serialVersionUID = 1L;

        GarbageArgs(String message) {
            super(message);
        }
    }
}
