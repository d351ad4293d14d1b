package org.zweep.runner.live;

import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Clock;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.function.Consumer;
import org.zweep.runner.results.Json;

/**
 * Appends a run's events to {@code DIR/events.jsonl}, one JSON object a line, each with
 * {@code type} and {@code time_ms} (milliseconds since the epoch) and snake_case fields, written
 * by {@link Json#line} (a number that is not finite is {@code null}). The file
 * is opened for appending, so a resumed run, and an answer written by another process, add to it.
 * Thread-safe; each line is written with one call and flushed.
 */
public final class EventLog implements AutoCloseable {
    /** The file name in a run folder. */
    public static final String FILE = "events.jsonl";

    private final Path file;
    private final OutputStream out;
    private final Clock clock;
    private boolean broken;

    private EventLog(Path file, OutputStream out, Clock clock) {
        this.file = file;
        this.out = out;
        this.clock = clock;
    }

    /** Opens (creating it when needed) {@code dir/events.jsonl} for appending. */
    public static EventLog open(Path dir, Clock clock) {
        Path f = dir.resolve(FILE);
        try {
            return new EventLog(f, Files.newOutputStream(f, StandardOpenOption.CREATE, StandardOpenOption.APPEND,
                    StandardOpenOption.WRITE), clock);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot open " + f + ": " + e.getMessage(), e);
        }
    }

    /** The events file. */
    public Path file() {
        return file;
    }

    /**
     * Appends one event of {@code type}, its fields set by {@code fields}. A failure to write (a
     * full disk) is remembered and further events are dropped: the live view must never stop a run.
     */
    public synchronized void write(String type, Consumer<Map<String, Object>> fields) {
        if (broken) {
            return;
        }
        Map<String, Object> n = new LinkedHashMap<>();
        n.put("type", type);
        n.put("time_ms", clock.millis());
        fields.accept(n);
        try {
            out.write((Json.line(n) + "\n").getBytes(StandardCharsets.UTF_8));
            out.flush();
        } catch (IOException e) {
            broken = true;
        }
    }

    /** Appends one event line to {@code dir/events.jsonl} from any process (used for answers from a page). */
    public static void append(Path dir, String type, Consumer<Map<String, Object>> fields) {
        try (EventLog log = open(dir, Clock.systemUTC())) {
            log.write(type, fields);
        }
    }

    @Override
    public synchronized void close() {
        try {
            out.close();
        } catch (IOException e) {
            // nothing more can be written anyway
        }
    }
}
