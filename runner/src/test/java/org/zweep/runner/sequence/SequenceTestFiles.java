package org.zweep.runner.sequence;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.zweep.runner.plan.Plan;

/** Builds small sequences in a temporary folder that holds a placeholder bench file. */
final class SequenceTestFiles {
    private SequenceTestFiles() {
    }

    /** Writes {@code b.bench.yaml} into {@code dir} (the loader checks only that it exists). */
    static void bench(Path dir) {
        try {
            Files.writeString(dir.resolve("b.bench.yaml"), "# placeholder: the loader only checks that the file exists\n");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** A sequence with the given {@code safety:} and {@code part:} flow mappings and {@code steps:} block. */
    static Plan load(Path dir, String safety, String part, String rest) {
        bench(dir);
        String text = "format: zweep-sequence/1\n"
                + "meter: {bench: b.bench.yaml}\n"
                + "safety: " + safety + "\n"
                + "part: " + part + "\n"
                + rest;
        return SequenceLoader.parse(text, dir.resolve("s.yaml"));
    }
}
