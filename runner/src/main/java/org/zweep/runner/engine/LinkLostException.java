package org.zweep.runner.engine;

import org.zweep.driver.MeterException;

/** The link to the meter broke and could not be re-opened within the reconnect budget. */
public final class LinkLostException extends MeterException {
    private static final long serialVersionUID = 1L;

    /** @param message what was being done and how reconnecting went; @param cause the last failure */
    public LinkLostException(String message, Throwable cause) {
        super(message, cause);
    }
}
