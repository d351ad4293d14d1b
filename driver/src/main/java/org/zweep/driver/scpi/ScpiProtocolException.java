package org.zweep.driver.scpi;

import org.zweep.driver.MeterException;

/**
 * A reply broke the rules of the conversation: not a number where one was asked for, a malformed
 * block header, a reply longer than the configured maximum, a meter that never stops sending.
 */
public class ScpiProtocolException extends MeterException {
    private static final long serialVersionUID = 1L;

    /** @param message one line naming the address, the operation and what was wrong */
    public ScpiProtocolException(String message) {
        super(message);
    }

    /** @param message one line naming the address, the operation and what was wrong; @param cause the underlying failure */
    public ScpiProtocolException(String message, Throwable cause) {
        super(message, cause);
    }
}
