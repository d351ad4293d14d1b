package org.zweep.runner.live;

import java.io.IOException;
import java.io.RandomAccessFile;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Follows an events file ({@link EventLog#FILE}): each {@link #read()} returns the complete lines
 * appended since the last one; a last line still being written waits for its line break. The one
 * reader of a growing {@code events.jsonl} ({@code zweep watch}, the live page's stream, a prompt
 * waiting for its answer). Not thread-safe: one follower per thread.
 */
public final class EventTail {
    /** The most read at once (a longer backlog comes over several reads). */
    private static final int CHUNK = 1 << 20;

    private final Path file;
    private long offset;

    /** Follows {@code file} from byte {@code offset} (0: the beginning; the file need not exist yet). */
    public EventTail(Path file, long offset) {
        this.file = file;
        this.offset = offset;
    }

    /** Follows {@code file} from its current end: only what is appended from now on. */
    public static EventTail fromEnd(Path file) {
        return new EventTail(file, file.toFile().length());
    }

    /**
     * One complete line of the file.
     *
     * @param text the line without its line break
     * @param end the byte offset just after its line break (where a follower that has seen it resumes)
     */
    public record Line(String text, long end) {
    }

    /**
     * The complete lines appended since the last read, in order; empty when there are none. A file
     * shorter than what was read already is a new file, read from its beginning.
     */
    public List<Line> read() throws IOException {
        List<Line> lines = new ArrayList<>();
        if (!Files.exists(file)) {
            return lines;
        }
        try (RandomAccessFile f = new RandomAccessFile(file.toFile(), "r")) {
            long len = f.length();
            if (len < offset) {
                offset = 0;
            }
            if (len == offset) {
                return lines;
            }
            f.seek(offset);
            byte[] b = new byte[(int) Math.min(len - offset, CHUNK)];
            f.readFully(b);
            int start = 0;
            for (int i = 0; i < b.length; i++) {
                if (b[i] == '\n') {
                    lines.add(new Line(new String(b, start, i - start, StandardCharsets.UTF_8), offset + i + 1));
                    start = i + 1;
                }
            }
            offset += start;
        }
        return lines;
    }
}
