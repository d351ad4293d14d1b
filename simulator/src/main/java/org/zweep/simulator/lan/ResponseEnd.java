package org.zweep.simulator.lan;

/**
 * Finds where each response message ends in the simulator's reply bytes, so that a
 * {@code device_read} can set END there: at a newline outside a definite-length block
 * (IEEE 488.2 §8.7.9, §8.7.10). A block is recognised only where a data element starts (at the
 * start of the message or after ',' or ';') and only with a well-formed header, so that a reply
 * garbled by a fault still ends at its newline. Fed byte by byte, across reads. Not thread-safe.
 */
public final class ResponseEnd {
    private static final int ELEMENT_START = 0;
    private static final int TEXT = 1;
    private static final int HASH = 2;
    private static final int LENGTH_DIGITS = 3;
    private static final int BLOCK = 4;

    private int state = ELEMENT_START;
    private int digitsLeft;
    private long length;

    /** Whether {@code b} ends a response message. */
    public boolean endsAt(byte b) {
        switch (state) {
            case HASH -> {
                if (b >= '1' && b <= '9') {
                    digitsLeft = b - '0';
                    length = 0;
                    state = LENGTH_DIGITS;
                    return false;
                }
                return text(b); // #0 (indefinite block, ends at the newline) or no block at all
            }
            case LENGTH_DIGITS -> {
                if (b < '0' || b > '9') {
                    return text(b);
                }
                length = length * 10 + (b - '0');
                if (--digitsLeft == 0) {
                    state = length == 0 ? TEXT : BLOCK;
                }
                return false;
            }
            case BLOCK -> {
                if (--length == 0) {
                    state = TEXT;
                }
                return false;
            }
            case ELEMENT_START -> {
                if (b == '#') {
                    state = HASH;
                    return false;
                }
                return text(b);
            }
            default -> {
                return text(b);
            }
        }
    }

    private boolean text(byte b) {
        state = b == ',' || b == ';' || b == '\n' ? ELEMENT_START : TEXT;
        return b == '\n';
    }

    /** Forgets a half-seen message (device clear). */
    public void reset() {
        state = ELEMENT_START;
    }
}
