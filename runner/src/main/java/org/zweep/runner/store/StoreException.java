package org.zweep.runner.store;

/** The results database could not be reached or refused a read or write; the message is one line. */
public final class StoreException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** With the message people see and its cause. */
    public StoreException(String message, Throwable cause) {
        super(message, cause);
    }
}
