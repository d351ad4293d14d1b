package org.zweep.driver.transport;

import org.zweep.driver.MeterException;

/**
 * A reply did not arrive (completely) in time. Keeps the bytes that did arrive; the link itself is
 * still open, but the conversation is out of step until the client resynchronises.
 */
public class MeterTimeoutException extends MeterException {
    private static final long serialVersionUID = 1L;

    private final byte[] received;

    /**
     * @param message one line naming the address, the operation and the timeout
     * @param received the bytes received before the timeout (copied; may be empty)
     */
    public MeterTimeoutException(String message, byte[] received) {
        super(message);
        this.received = received.clone();
    }

    /** The bytes received before the timeout, possibly none (a copy). */
    public byte[] received() {
        return received.clone();
    }
}
