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
    void badInputIsTwoAndMeterOrIoFailureIsThree() {
        assertEquals(ExitCode.USAGE, Cli.exitCodeOf(new InvalidInputException("bad")));
        assertEquals(ExitCode.METER, Cli.exitCodeOf(new MeterException("no reply")));
        assertEquals(ExitCode.METER, Cli.exitCodeOf(new UncheckedIOException(new IOException("disk"))));
    }
}
