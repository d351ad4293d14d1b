package org.zweep.runner.cli;

/** The exit codes of every {@code zweep} subcommand. */
public final class ExitCode {
    /** Everything worked and every check passed. */
    public static final int OK = 0;
    /** The command ran but a check did not prove a pass (it failed, or passed or failed only conditionally). */
    public static final int CHECK_FAILED = 1;
    /** Bad usage, a bad value or a file that does not validate. */
    public static final int USAGE = 2;
    /** The meter or the connection to it failed (or the results database could not be reached). */
    public static final int METER = 3;
    /** zweep itself failed (a bug): the message asks for a report. */
    public static final int INTERNAL = 4;

    /** The exit-code list shown at the end of every {@code --help}. */
    static final String HELP_LIST = "%nExit codes:%n"
            + "  0  ok, every check passed%n"
            + "  1  a check did not pass (fail, conditional fail or conditional pass)%n"
            + "  2  usage or validation error%n"
            + "  3  meter or connection failure (or the results database)%n"
            + "  4  internal error (a bug in zweep: please report it)%n";

    private ExitCode() {
    }
}
