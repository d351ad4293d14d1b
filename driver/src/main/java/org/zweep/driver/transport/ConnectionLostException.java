package org.zweep.driver.transport;

import org.zweep.driver.MeterException;

/**
 * An open link broke: the peer closed it, it was reset, or the device went away. The connection is
 * unusable afterwards; reconnecting is the caller's decision.
 */
public class ConnectionLostException extends MeterException {
    private static final long serialVersionUID = 1L;

    /** @param message one line naming the address and what was being done */
    public ConnectionLostException(String message) {
        super(message);
    }

    /** @param message one line naming the address and what was being done; @param cause the underlying failure */
    public ConnectionLostException(String message, Throwable cause) {
        super(message, cause);
    }
}
