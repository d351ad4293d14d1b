package org.zweep.driver;

import org.zweep.config.ConfigException;

/**
 * Input from a person or a file that zweep cannot accept: a malformed quantity, address, dialect
 * or sequence. The message says what was wrong and where (for files {@code file:line:column}),
 * in one line fit to show a user as it is. The command line maps it to exit code 2.
 */
public class InvalidInputException extends ConfigException {
    private static final long serialVersionUID = 1L;

    /** @param message what was wrong and where, one line */
    public InvalidInputException(String message) {
        super(message);
    }

    /** @param message what was wrong and where, one line; @param cause the underlying failure */
    public InvalidInputException(String message, Throwable cause) {
        super(message, cause);
    }
}
