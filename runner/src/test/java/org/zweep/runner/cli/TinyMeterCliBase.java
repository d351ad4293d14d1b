package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import org.junit.jupiter.api.AfterEach;

/** Shared setup of the command-line tests against a {@link TinyMeter}: captured output, one meter per test. */
abstract class TinyMeterCliBase {
    final TinyMeter meter = new TinyMeter();
    final StringWriter out = new StringWriter();
    final StringWriter err = new StringWriter();

    @AfterEach
    void stopMeter() throws Exception {
        meter.close();
    }

    /** Runs {@code zweep args} with captured output; returns the exit code. */
    int zweep(String... args) {
        return Cli.run(args, new PrintWriter(out), new PrintWriter(err));
    }
}
