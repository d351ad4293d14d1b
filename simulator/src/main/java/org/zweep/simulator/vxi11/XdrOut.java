package org.zweep.simulator.vxi11;

import java.io.ByteArrayOutputStream;

/** Writes XDR items (RFC 4506): 4-byte big-endian units, opaque data padded with zeros. */
final class XdrOut {
    private final ByteArrayOutputStream out = new ByteArrayOutputStream(64);

    XdrOut int32(int v) {
        out.write(v >>> 24);
        out.write(v >>> 16);
        out.write(v >>> 8);
        out.write(v);
        return this;
    }

    XdrOut uint32(long v) {
        return int32((int) v);
    }

    XdrOut opaque(byte[] b, int off, int len) {
        int32(len);
        out.write(b, off, len);
        for (int pad = (4 - (len & 3)) & 3; pad > 0; pad--) {
            out.write(0);
        }
        return this;
    }

    byte[] bytes() {
        return out.toByteArray();
    }
}
