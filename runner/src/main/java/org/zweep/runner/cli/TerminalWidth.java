package org.zweep.runner.cli;

import java.io.IOException;
import org.jline.terminal.Terminal;
import org.jline.terminal.TerminalBuilder;

/**
 * The width of the terminal the progress line is drawn on, as JLine reports it (asked again at
 * each call, so a resized window is followed). Opens JLine's system terminal without taking over
 * any signal (Ctrl-C stays with zweep's own handling) and without reading input.
 */
final class TerminalWidth implements AutoCloseable {
    private final Terminal terminal;

    private TerminalWidth(Terminal terminal) {
        this.terminal = terminal;
    }

    /** The system terminal's width, or a width of 0 (unknown) when there is none. */
    static TerminalWidth open() {
        try {
            return new TerminalWidth(TerminalBuilder.builder().system(true).nativeSignals(false).dumb(true)
                    .build());
        } catch (IOException | RuntimeException e) {
            return new TerminalWidth(null);
        }
    }

    /** The width in columns, 0 when unknown. */
    int columns() {
        if (terminal == null) {
            return 0;
        }
        try {
            return terminal.getWidth();
        } catch (RuntimeException e) {
            return 0;
        }
    }

    @Override
    public void close() {
        if (terminal != null) {
            try {
                terminal.close();
            } catch (IOException e) {
                // nothing was changed on the terminal that closing would have to restore
            }
        }
    }
}
