package org.zweep.runner.cli;

import java.nio.file.Path;
import picocli.CommandLine.Option;

/** {@code --trace FILE}: appends the SCPI traffic to FILE; shared by the commands that talk to a meter. */
final class TraceOption {
    @Option(names = "--trace", paramLabel = "FILE",
            description = "append the SCPI traffic to FILE, one timestamped line per chunk sent (>) or received (<)"
                    + " and per event (!)")
    Path file;

    /** The file, or null for no trace. */
    Path get() {
        return file;
    }
}
