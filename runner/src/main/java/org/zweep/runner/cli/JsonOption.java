package org.zweep.runner.cli;

import picocli.CommandLine.Option;

/** {@code --json}: the command's result as JSON on standard output (through {@code results.Json}). */
final class JsonOption {
    @Option(names = "--json", description = "print the result as JSON on standard output instead of text")
    boolean json;

    /** Whether JSON was asked for. */
    boolean on() {
        return json;
    }
}
