package org.zweep.simulator.scpi;

import java.nio.charset.StandardCharsets;

/** One response message unit (IEEE 488.2 §8.4): ASCII text or a definite-length block. */
public final class Response {
    private final byte[] bytes;

    private Response(byte[] bytes) {
        this.bytes = bytes;
    }

    /** A response unit of ASCII text (NR1, NR3, a quoted string, character data, ...). */
    public static Response text(String text) {
        return new Response(text.getBytes(StandardCharsets.US_ASCII));
    }

    /** An IEEE 488.2 §8.7.9 definite-length arbitrary block carrying {@code payload}. */
    public static Response block(byte[] payload) {
        String len = Integer.toString(payload.length);
        byte[] header = ("#" + len.length() + len).getBytes(StandardCharsets.US_ASCII);
        byte[] out = new byte[header.length + payload.length];
        System.arraycopy(header, 0, out, 0, header.length);
        System.arraycopy(payload, 0, out, header.length, payload.length);
        return new Response(out);
    }

    /** A quoted string response (§8.7.8): embedded double quotes are doubled. */
    public static Response string(String s) {
        return text("\"" + s.replace("\"", "\"\"") + "\"");
    }

    byte[] bytes() {
        return bytes;
    }
}
