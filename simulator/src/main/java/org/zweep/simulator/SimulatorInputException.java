package org.zweep.simulator;

/**
 * A device or bench description the simulator cannot accept: a netlist with a syntax error, a bad
 * value or a circuit that has no impedance between its terminals, or a bench file with a missing,
 * unknown or malformed entry. The message is one line fit to show a user as it is, and says where:
 * {@code source:line:column: what} (column left out when unknown).
 */
public class SimulatorInputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** @param message what was wrong and where, one line */
    public SimulatorInputException(String message) {
        super(message);
    }

    /** @param message what was wrong and where, one line; @param cause the underlying failure */
    public SimulatorInputException(String message, Throwable cause) {
        super(message, cause);
    }

    /**
     * An error at a place in a text.
     *
     * @param source file name or description of the text, e.g. {@code "device.cir"}
     * @param line 1-based line
     * @param column 1-based column, or 0 if unknown
     * @param what what was wrong
     */
    public static SimulatorInputException at(String source, int line, int column, String what) {
        String where = column > 0 ? source + ":" + line + ":" + column : source + ":" + line;
        return new SimulatorInputException(where + ": " + what);
    }

    /**
     * {@code text} with line ends and other control characters written as escapes ({@code \n},
     * {@code \u0000}), for quoting input in a one-line message (the config toolkit's rule).
     */
    public static String oneLine(String text) {
        return org.zweep.config.BoundedYaml.oneLine(text);
    }
}
