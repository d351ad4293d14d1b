package org.zweep.driver.transport;

import org.zweep.driver.MeterException;

/** A link could not be opened: refused, unreachable, no such device, no permission, connect timeout. */
public class ConnectFailedException extends MeterException {
    private static final long serialVersionUID = 1L;

    /** @param message one line naming the address and why it could not be opened */
    public ConnectFailedException(String message) {
        super(message);
    }

    /** @param message one line naming the address and why; @param cause the underlying failure */
    public ConnectFailedException(String message, Throwable cause) {
        super(message, cause);
    }
}
