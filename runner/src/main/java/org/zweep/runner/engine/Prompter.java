package org.zweep.runner.engine;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;

/** Asks the operator to do something at the fixture and waits until it is done. */
@FunctionalInterface
public interface Prompter {

    /**
     * Shows {@code instruction} and blocks until the operator confirms.
     *
     * @throws RunInterruptedException when the operator ends input instead (end of file)
     */
    void prompt(String instruction);

    /** Waits for Enter on {@code in}, showing the instruction on {@code out}. */
    static Prompter terminal(BufferedReader in, PrintWriter out) {
        return instruction -> {
            out.print(">> " + instruction + " - press Enter when done: ");
            out.flush();
            try {
                if (in.readLine() == null) {
                    throw new RunInterruptedException("input ended at an operator prompt");
                }
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        };
    }
}
