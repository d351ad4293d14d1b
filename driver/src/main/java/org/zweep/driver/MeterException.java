package org.zweep.driver;

/**
 * Something went wrong talking to a meter: the link broke, a reply did not come in time, a reply
 * made no sense, or the meter reported an error. The message names the address and what was being
 * done. The command line maps every subtype to exit code 3.
 */
public class MeterException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** @param message one line naming the address and the operation */
    public MeterException(String message) {
        super(message);
    }

    /** @param message one line naming the address and the operation; @param cause the underlying failure */
    public MeterException(String message, Throwable cause) {
        super(message, cause);
    }
}
