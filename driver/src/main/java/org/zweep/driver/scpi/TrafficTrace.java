package org.zweep.driver.scpi;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Clock;
import org.zweep.driver.InvalidInputException;

/**
 * A traffic log: one line per chunk, {@code <ISO instant> <dir> <bytes>}, where dir is {@code >}
 * sent, {@code <} received, {@code !} an event (timeout, resynchronisation). Bytes are escaped by
 * {@link ScpiValues#escape}. Each line is flushed, so the trace survives a crash.
 */
final class TrafficTrace implements AutoCloseable {
    static final int SHOWN_BYTES = 1024;

    private final Writer out;
    private final Clock clock;

    TrafficTrace(Writer out, Clock clock) {
        this.out = out;
        this.clock = clock;
    }

    static TrafficTrace open(Path file) {
        try {
            return new TrafficTrace(Files.newBufferedWriter(file, StandardCharsets.UTF_8, StandardOpenOption.CREATE,
                    StandardOpenOption.APPEND), Clock.systemUTC());
        } catch (IOException e) {
            throw new InvalidInputException("cannot write the trace file " + file + ": " + e.getMessage(), e);
        }
    }

    synchronized void sent(byte[] data, int offset, int length) {
        line('>', ScpiValues.escape(data, offset, length, SHOWN_BYTES));
    }

    synchronized void received(byte[] data, int offset, int length) {
        line('<', ScpiValues.escape(data, offset, length, SHOWN_BYTES));
    }

    synchronized void event(String text) {
        line('!', text);
    }

    private void line(char dir, String text) {
        try {
            out.write(clock.instant().toString() + ' ' + dir + ' ' + text + '\n');
            out.flush();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the traffic trace", e);
        }
    }

    @Override
    public synchronized void close() {
        try {
            out.close();
        } catch (IOException e) {
            // the trace is a debugging aid: losing its tail must not hide the real outcome
        }
    }
}
