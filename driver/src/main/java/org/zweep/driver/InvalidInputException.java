package org.zweep.driver;

/**
 * Input from a person or a file that zweep cannot accept: a malformed quantity, address, dialect
 * or sequence. The message says what was wrong and where (for files {@code file:line:column}),
 * in one line fit to show a user as it is. The command line maps it to exit code 2.
 */
public class InvalidInputException extends RuntimeException {
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
