package org.zweep.simulator.scpi;

import java.io.IOException;
import java.io.InputStream;
import java.util.Arrays;

/**
 * Cuts a byte stream into program messages at the LF terminator (IEEE 488.2 §7.5; raw TCP has no
 * END), never inside a definite-length block (§7.7.6) whose bytes may contain LF. A message
 * longer than the bound is skipped up to the next LF and reported as an overrun, so input can
 * never exhaust memory. Not thread-safe.
 */
public final class MessageFramer {
    /** One message read, or an overrun. */
    public record Message(byte[] bytes, boolean overrun) {
    }

    private final InputStream in;
    private final int maxBytes;
    private final byte[] buf = new byte[8192];
    private int bufPos;
    private int bufLen;
    private byte[] msg = new byte[256];
    private final Cut cut = new Cut();
    /** The longest message buffer kept between messages. */
    private static final int KEPT_BYTES = 64 << 10;
    private final Cut look = new Cut();

    /**
     * @param in the stream to read
     * @param maxBytes the longest message accepted, terminator excluded
     */
    public MessageFramer(InputStream in, int maxBytes) {
        this.in = in;
        this.maxBytes = maxBytes;
    }

    /** Whether bytes after the last message returned are already read in (more is on its way). */
    public boolean buffered() {
        return bufPos < bufLen;
    }

    /** Whether a whole message (or the end of an overrun) is already read in: {@link #next()} will not block. */
    public boolean messageBuffered() {
        look.reset();
        for (int i = bufPos; i < bufLen; i++) {
            if (look.ends(buf[i] & 0xFF, maxBytes)) {
                return true;
            }
        }
        return false;
    }

    /**
     * Blocks until a whole message has arrived.
     *
     * @return the message without its LF, or {@code null} at end of stream (a partial message is dropped)
     * @throws IOException as the stream throws it (a read timeout included)
     */
    public Message next() throws IOException {
        cut.reset();
        while (true) {
            if (bufPos == bufLen) {
                bufLen = in.read(buf, 0, buf.length);
                bufPos = 0;
                if (bufLen <= 0) {
                    bufLen = 0;
                    return null;
                }
            }
            int b = buf[bufPos++] & 0xFF;
            int len = cut.len;
            if (cut.ends(b, maxBytes)) {
                Message m = cut.overrun ? new Message(null, true) : new Message(Arrays.copyOf(msg, len), false);
                if (msg.length > KEPT_BYTES) {
                    msg = new byte[256]; // a long message's buffer is not kept for the connection's life
                }
                return m;
            }
            if (cut.len > len) {
                if (len == msg.length) {
                    msg = Arrays.copyOf(msg, Math.min(maxBytes, msg.length * 2));
                }
                msg[len] = (byte) b;
            }
        }
    }

    /** Where one message ends: its LF, outside quoted strings and definite-length blocks. */
    private static final class Cut {
        int len;
        boolean overrun;
        int quote;
        int blockState; // 0 none, 1 after '#', 2 in length digits, 3 in data
        int digitsLeft;
        long bytesLeft;

        void reset() {
            len = 0;
            overrun = false;
            quote = 0;
            blockState = 0;
            digitsLeft = 0;
            bytesLeft = 0;
        }

        /**
         * Takes the message's next byte: whether it ends the message (its LF, or the first LF
         * after an overrun). {@link #len} grows by one when the byte belongs to the message.
         */
        boolean ends(int b, int maxBytes) {
            if (overrun) {
                return b == '\n';
            }
            boolean text = true; // false for a byte of a block's header or data
            if (blockState == 1) {
                if (b >= '1' && b <= '9') {
                    digitsLeft = b - '0';
                    bytesLeft = 0;
                    blockState = 2;
                    text = false;
                } else {
                    blockState = 0; // a lone '#': what follows is ordinary text, an LF ends the message
                }
            } else if (blockState == 2) {
                if (b >= '0' && b <= '9') {
                    bytesLeft = Math.min(bytesLeft * 10 + (b - '0'), Integer.MAX_VALUE);
                    if (--digitsLeft == 0) {
                        blockState = bytesLeft > 0 ? 3 : 0;
                    }
                    text = false;
                } else {
                    blockState = 0;
                }
            } else if (blockState == 3) {
                if (--bytesLeft == 0) {
                    blockState = 0;
                }
                text = false;
            }
            if (text) {
                if (b == '\n') {
                    return true;
                }
                if (quote != 0) {
                    if (b == quote) {
                        quote = 0;
                    }
                } else if (b == '"' || b == '\'') {
                    quote = b;
                } else if (b == '#') {
                    blockState = 1;
                }
            }
            if (len == maxBytes) {
                overrun = true;
                return false;
            }
            len++;
            return false;
        }
    }
}
