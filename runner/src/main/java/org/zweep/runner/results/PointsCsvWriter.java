package org.zweep.runner.results;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * Appends rows to a {@code points.csv}. A row asked to be synced (the last of a trigger: a point,
 * or a whole list sweep) is written to the operating system, with the rows of its trigger before
 * it, before {@link #append} returns, so killing the process ({@code kill -9}, a JVM crash) never
 * loses a trigger's rows once its last was appended. With {@link Sync#EACH_ROW} it is also on the
 * storage device by then (the device cache is trusted to honour {@code fdatasync}); the run engine
 * calls it on a thread of its own while the meter measures (see
 * {@link org.zweep.runner.engine.RowSync}). Writes the header when the file is new or empty.
 *
 * <p>Not thread-safe: one run engine writes one file. I/O failures are thrown as
 * {@link UncheckedIOException} naming the file.
 */
public final class PointsCsvWriter implements AutoCloseable {
    /** When rows reach the storage device; see the class description for what each can lose. */
    public enum Sync {
        /** Synced before {@code append} returns. */
        EACH_ROW,
        /** Synced only on close; for benchmarks that measure what syncing costs. */
        NONE
    }

    private final Path file;
    private final FileChannel channel;
    private final Sync mode;
    private long durableBytes;
    private long writtenBytes;
    /** Rows of one trigger held back at most this long before they go to the OS anyway. */
    private static final int HAND_OVER_BYTES = 1 << 16;
    private ByteBuffer buffer = ByteBuffer.allocate(4096);

    private PointsCsvWriter(Path file, FileChannel channel, Sync mode) {
        this.file = file;
        this.channel = channel;
        this.mode = mode;
    }

    /**
     * Opens {@code file} for appending with {@link Sync#EACH_ROW} (creating it with a header when
     * missing or empty). A torn last line must have been removed first, see {@link PointsCsvReader#recover}.
     */
    public static PointsCsvWriter open(Path file) {
        return open(file, Sync.EACH_ROW);
    }

    /** As {@link #open(Path)}, with rows synced as {@code mode} says. */
    public static PointsCsvWriter open(Path file, Sync mode) {
        try {
            FileChannel ch = FileChannel.open(file, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                    StandardOpenOption.APPEND);
            PointsCsvWriter w = new PointsCsvWriter(file, ch, mode);
            w.writtenBytes = ch.size();
            w.durableBytes = w.writtenBytes;
            if (ch.size() == 0) {
                w.writeLine(PointsCsv.HEADER, true);
            }
            return w;
        } catch (IOException e) {
            throw new UncheckedIOException("cannot open " + file + " for writing: " + e.getMessage(), e);
        }
    }

    /** The file written. */
    public Path file() {
        return file;
    }

    /** The sync mode. */
    public Sync mode() {
        return mode;
    }

    /** Appends {@code row} and syncs it (and every row before it) as the mode says. */
    public void append(PointRow row) {
        append(row, true);
    }

    /**
     * Appends {@code row}; when {@code sync} is true, syncs it and every row before it as the mode
     * says (the engine asks once per list sweep, whose rows arrive together).
     */
    public void append(PointRow row, boolean sync) {
        writeLine(PointsCsv.format(row), sync);
    }

    private void writeLine(String line, boolean syncNow) {
        byte[] bytes = line.getBytes(StandardCharsets.UTF_8);
        if (buffer.remaining() < bytes.length + 1) {
            ByteBuffer bigger = ByteBuffer.allocate(Math.max(buffer.capacity() * 2, buffer.position() + bytes.length + 1));
            buffer.flip();
            buffer = bigger.put(buffer);
        }
        buffer.put(bytes).put((byte) '\n');
        if (!syncNow && buffer.position() < HAND_OVER_BYTES) {
            return; // more rows of this trigger follow: they go to the OS together, with the last
        }
        try {
            buffer.flip();
            while (buffer.hasRemaining()) {
                writtenBytes += channel.write(buffer);
            }
            buffer.clear();
            if (syncNow && mode == Sync.EACH_ROW) {
                channel.force(false);
                durableBytes = writtenBytes;
            }
        } catch (IOException e) {
            buffer.clear();
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }

    /** How many bytes of the file a finished sync has made durable (for tests). */
    long durableBytes() {
        return durableBytes;
    }

    /**
     * Syncs and closes the file; I/O failures are thrown as {@link UncheckedIOException} (the file
     * is closed all the same).
     */
    @Override
    public void close() {
        UncheckedIOException failure = null;
        try {
            if (channel.isOpen()) {
                buffer.flip();
                while (buffer.hasRemaining()) {
                    writtenBytes += channel.write(buffer);
                }
                buffer.clear();
                channel.force(true);
                durableBytes = writtenBytes;
                channel.close();
            }
        } catch (IOException e) {
            if (failure == null) {
                failure = new UncheckedIOException("cannot close " + file + ": " + e.getMessage(), e);
            }
        }
        if (failure != null) {
            throw failure;
        }
    }
}
