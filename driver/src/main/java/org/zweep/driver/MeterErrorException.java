package org.zweep.driver;

import java.util.List;
import org.zweep.driver.scpi.ScpiError;

/**
 * The meter reported one or more errors in its error queue (for example {@code -222,"Data out of
 * range"}) after a command was sent. The message names the address, the operation and every entry.
 */
public class MeterErrorException extends MeterException {
    private static final long serialVersionUID = 1L;

    private final List<ScpiError> errors;

    /**
     * @param message one line naming the address and the operation, with the entries
     * @param errors every entry read from the queue, oldest first (not empty)
     */
    public MeterErrorException(String message, List<ScpiError> errors) {
        super(message);
        this.errors = List.copyOf(errors);
    }

    /** Every entry read from the meter's error queue, oldest first. */
    public List<ScpiError> errors() {
        return errors;
    }
}
