package org.zweep.driver.scpi;

import java.util.List;
import org.zweep.driver.MeterException;

/** The meter's error queue held entries: every one read by {@code SYSTem:ERRor?}, oldest first. */
public class MeterErrorException extends MeterException {
    private static final long serialVersionUID = 1L;

    private final List<ScpiError> errors;

    /**
     * @param message one line naming the address and what was being done
     * @param errors the entries read, oldest first (not empty)
     */
    public MeterErrorException(String message, List<ScpiError> errors) {
        super(message);
        this.errors = List.copyOf(errors);
    }

    /** Every error read from the queue, oldest first. */
    public List<ScpiError> errors() {
        return errors;
    }
}
