package org.zweep.driver.transport;

/**
 * Sends one program message in pieces: at most the peer's maximum per piece, the last one flagged
 * (HiSLIP DataEnd, VXI-11 END, ...), and whatever the peer did not take offered again. The one
 * write loop of the transports.
 */
public final class MessagePieces {
    private MessagePieces() {
    }

    /**
     * Sends one piece of the message.
     *
     * @param <E> what sending may throw (an {@code IOException}, an errno, or only unchecked failures)
     */
    @FunctionalInterface
    public interface PieceSender<E extends Exception> {
        /**
         * Sends bytes {@code from} to {@code from + length} of the message.
         *
         * @param last whether this piece ends the message
         * @return how many of the {@code length} bytes the peer took: 1 to {@code length}, or 0 only
         *     for an empty message (a sender throws when the peer takes nothing of a non-empty piece)
         */
        int send(int from, int length, boolean last) throws E;
    }

    /**
     * Sends a message of {@code length} bytes (an empty one as one empty last piece) in pieces of at
     * most {@code maxPiece} bytes.
     *
     * @throws IllegalStateException if the sender reports taking no bytes or more than offered (a bug)
     */
    public static <E extends Exception> void send(int length, long maxPiece, PieceSender<E> sender) throws E {
        int done = 0;
        do {
            int piece = (int) Math.min(length - done, Math.max(1, maxPiece));
            int taken = sender.send(done, piece, done + piece == length);
            if (taken > piece || taken < 0 || (taken == 0 && piece > 0)) {
                throw new IllegalStateException("a piece sender took " + taken + " of " + piece + " bytes");
            }
            done += taken;
        } while (done < length);
    }
}
