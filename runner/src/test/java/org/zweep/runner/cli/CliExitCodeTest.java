package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.io.UncheckedIOException;
import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.MeterException;

class CliExitCodeTest {

    @Test
    void aBugInZweepIsExitFourNeverAMeterFailure() {
        assertEquals(ExitCode.INTERNAL, Cli.exitCodeOf(new IllegalStateException("boom")));
        assertEquals(ExitCode.INTERNAL, Cli.exitCodeOf(new ArithmeticException("overflow")));
    }

    @Test
    void runningOutOfMemoryIsOneLineAskingForAReportAndExitFourWithoutATrace() {
        java.io.StringWriter err = new java.io.StringWriter();
        int code = Cli.guarded(() -> {
            throw new OutOfMemoryError("Java heap space");
        }, new java.io.PrintWriter(err), false);
        assertEquals(ExitCode.INTERNAL, code);
        assertEquals("zweep: internal error: out of memory (Java heap space); this is a bug in zweep, please report"
                + " it with the output of the same command run with --debug", err.toString().strip());
    }

    @Test
    void anErrorThrownOutOfACommandIsExitFourWithOneLine() {
        java.io.StringWriter err = new java.io.StringWriter();
        int code = Cli.guarded(() -> {
            throw new StackOverflowError();
        }, new java.io.PrintWriter(err), false);
        assertEquals(ExitCode.INTERNAL, code);
        assertEquals(1, err.toString().strip().lines().count(), err.toString());
        assertEquals(true, err.toString().startsWith("zweep: internal error: stack overflow; "), err.toString());
    }

    @Test
    void badInputIsTwoAndMeterOrIoFailureIsThree() {
        assertEquals(ExitCode.USAGE, Cli.exitCodeOf(new InvalidInputException("bad")));
        assertEquals(ExitCode.METER, Cli.exitCodeOf(new MeterException("no reply")));
        assertEquals(ExitCode.METER, Cli.exitCodeOf(new UncheckedIOException(new IOException("disk"))));
    }
}
