package org.zweep.runner.engine;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import org.zweep.driver.InvalidInputException;

/** Asks the operator to do something at the fixture and waits until it is done. */
@FunctionalInterface
public interface Prompter {

    /**
     * Shows {@code instruction} and blocks until the operator confirms.
     *
     * @throws RunInterruptedException when the operator ends input instead (end of file)
     */
    void prompt(String instruction);

    /**
     * Whether prompts go to the operator on the simulator too (the live view's prompter), instead
     * of passing by themselves while the simulator switches its fixture.
     */
    default boolean onSimulator() {
        return false;
    }

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

    /** Answers every prompt at once ({@code --yes}), showing it on {@code out}. */
    static Prompter yes(PrintWriter out) {
        return instruction -> {
            out.println(">> " + instruction + " (--yes: going on)");
            out.flush();
        };
    }

    /** Refuses to prompt: for a real meter without a terminal and without {@code --yes}. */
    static Prompter refusing() {
        return instruction -> {
            throw new InvalidInputException("the sequence needs an operator (\"" + instruction
                    + "\") but there is no terminal; answer prompts with --yes");
        };
    }
}
