package org.zweep.driver.scpi;

import java.time.Duration;
import java.util.List;

/**
 * A SCPI conversation with one meter: what a meter implementation needs from the SCPI client.
 *
 * <p>Every method blocks until the meter has answered or the operation timed out, and may throw a
 * {@link org.zweep.driver.MeterException}. Implementations hold one conversation at a time: calls
 * from several threads are serialised, never interleaved.
 */
public interface ScpiSession extends AutoCloseable {

    /** The address this session talks to, as the user wrote it (for messages). */
    String address();

    /** Sends one program message (the write terminator is added). */
    void write(String message);

    /** Sends a program message that ends in a query and returns the reply without its terminator. */
    String query(String message);

    /**
     * {@link #query(String)} for a query the meter works on for about {@code expectedWork} before
     * it answers (a measurement, a sweep): the reply is awaited until {@code expectedWork} plus the
     * session's slack (its read timeout) has passed since the query was sent. A session without
     * deadlines of its own ignores {@code expectedWork}.
     */
    default String query(String message, Duration expectedWork) {
        return query(message);
    }

    /** {@link #queryBlock(String)} with the reply awaited as in {@link #query(String, Duration)}. */
    default byte[] queryBlock(String message, Duration expectedWork) {
        return queryBlock(message);
    }

    /**
     * Sends a message that holds {@code queries} queries to a meter that answers each on a line of
     * its own, and returns the lines in order: the first awaited as in {@link #query(String,
     * Duration)}, each further one within the session's slack. The default serves one query only.
     *
     * @throws UnsupportedOperationException when {@code queries > 1} and the session cannot read
     *     several reply lines
     */
    default List<String> queryLines(String message, int queries, Duration expectedWork) {
        if (queries == 1) {
            return List.of(query(message, expectedWork));
        }
        throw new UnsupportedOperationException(address() + ": this session reads one reply line per message");
    }

    /**
     * Sends a query whose reply is an IEEE 488.2 arbitrary block (definite or indefinite length)
     * and returns the block's payload bytes.
     */
    byte[] queryBlock(String message);

    /**
     * The reply to a message of queries answered with arbitrary blocks followed by one answered with
     * text, all on one line separated by {@code ;}.
     *
     * @param blocks the blocks' payloads, in order; fewer than asked when the meter sent no response
     *     to a query that failed (IEEE 488.2 §6.3.2.3), and then {@code text} is what followed
     * @param text the last unit, without the terminator ({@code ""} when there was none)
     */
    record BlocksReply(List<byte[]> blocks, String text) {
        public BlocksReply {
            blocks = List.copyOf(blocks);
        }
    }

    /**
     * Sends a message of {@code blocks} queries answered with definite-length blocks, then one
     * answered with text (e.g. {@code :READ?;:FETC?;:SYST:ERR?} with {@code FORMat REAL,64}), and
     * reads the one reply, awaited as in {@link #query(String, Duration)}.
     *
     * @throws UnsupportedOperationException when the session cannot read such a reply (the default)
     */
    default BlocksReply queryBlocksThenText(String message, int blocks, Duration expectedWork) {
        throw new UnsupportedOperationException(address() + ": this session reads one block per message");
    }

    /**
     * Waits until the meter has finished every pending operation: sends {@code completionQuery}
     * ({@code *OPC?}, IEEE 488.2 §10.19, or a meter's own query of the same meaning) and awaits its
     * answer {@code 1} as in {@link #query(String, Duration)}. The one completion wait of the SCPI
     * layer: {@code ScpiClient} and the dialect's {@code sync} both come here.
     *
     * @throws ScpiProtocolException when the answer is not {@code 1}
     */
    default void waitForCompletion(String completionQuery, Duration expectedWork) {
        String reply = query(completionQuery, expectedWork).strip();
        if (!reply.equals("1") && !reply.equals("+1")) {
            throw new ScpiProtocolException(address() + ": '" + completionQuery + "' answered '"
                    + ScpiValues.abbreviate(reply) + "' instead of 1");
        }
    }

    /** Reads {@code SYSTem:ERRor?} until it returns 0 and returns every entry read, oldest first. */
    List<ScpiError> drainErrors();

    /** Closes the connection; never throws. */
    @Override
    void close();
}
