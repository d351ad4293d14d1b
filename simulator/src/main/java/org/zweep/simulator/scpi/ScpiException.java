package org.zweep.simulator.scpi;

/**
 * Raised by the parser or a command handler to report a SCPI error; the session puts it in the
 * error queue and sets the matching Standard Event Status bit.
 */
public final class ScpiException extends RuntimeException {
    private final StandardError error;
    private final String info;

    /**
     * @param error the standard error
     * @param info device-dependent detail appended after {@code ;} in the queue entry, or {@code null}
     */
    public ScpiException(StandardError error, String info) {
        super(info == null ? error.text() : error.text() + ";" + info, null, false, false);
        this.error = error;
        this.info = info;
    }

    /** The standard error. */
    public StandardError error() {
        return error;
    }

    /** The device-dependent detail, or {@code null}. */
    public String info() {
        return info;
    }
}
