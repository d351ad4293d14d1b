package org.zweep.simulator.hislip;

import java.io.DataInputStream;
import java.io.EOFException;
import java.io.IOException;
import java.io.OutputStream;

/** One HiSLIP message (IVI-6.1): the 16-byte header and its payload, read and written whole. */
record Frame(int type, int control, int parameter, byte[] payload) {

    /**
     * The next message; null at a clean end of stream.
     *
     * @throws BadHeader when the prologue is not {@code HS} or the payload is longer than {@code maxPayload}
     */
    static Frame read(DataInputStream in, long maxPayload) throws IOException {
        int h;
        try {
            h = in.readUnsignedByte();
        } catch (EOFException e) {
            return null;
        }
        int s = in.readUnsignedByte();
        int type = in.readUnsignedByte();
        int control = in.readUnsignedByte();
        int parameter = in.readInt();
        long length = in.readLong();
        if (h != 'H' || s != 'S') {
            throw new BadHeader(1, "no HS prologue");
        }
        if (length < 0 || length > maxPayload) {
            throw new BadHeader(-1, "a " + Long.toUnsignedString(length) + "-byte message, more than the "
                    + maxPayload + " accepted");
        }
        byte[] payload = new byte[(int) length];
        in.readFully(payload);
        return new Frame(type, control, parameter, payload);
    }

    static void write(OutputStream out, int type, int control, int parameter, byte[] payload, int off, int len)
            throws IOException {
        byte[] m = new byte[16 + len];
        m[0] = 'H';
        m[1] = 'S';
        m[2] = (byte) type;
        m[3] = (byte) control;
        m[4] = (byte) (parameter >>> 24);
        m[5] = (byte) (parameter >>> 16);
        m[6] = (byte) (parameter >>> 8);
        m[7] = (byte) parameter;
        long l = len;
        for (int i = 15; i >= 8; i--) {
            m[i] = (byte) l;
            l >>>= 8;
        }
        System.arraycopy(payload, off, m, 16, len);
        out.write(m);
        out.flush();
    }

    /** A header the server cannot accept: answered by FatalError (code 1) or Error (4, too large). */
    static final class BadHeader extends IOException {
        private static final long serialVersionUID = 1L;
        final int fatalCode;

        BadHeader(int fatalCode, String message) {
            super(message);
            this.fatalCode = fatalCode;
        }
    }
}
