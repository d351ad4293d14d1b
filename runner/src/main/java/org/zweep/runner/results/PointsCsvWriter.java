package org.zweep.runner.results;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * Appends rows to a {@code points.csv}, each one written, flushed and synced to the storage device
 * ({@link FileChannel#force}) before {@link #append} returns, so a power cut loses at most the row
 * being written. Writes the header when the file is new or empty.
 *
 * <p>Not thread-safe: one run engine writes one file. I/O failures are thrown as
 * {@link UncheckedIOException}.
 */
public final class PointsCsvWriter implements AutoCloseable {
    private final Path file;
    private final FileChannel channel;
    private final boolean sync;
    private ByteBuffer buffer = ByteBuffer.allocate(1024);

    private PointsCsvWriter(Path file, FileChannel channel, boolean sync) {
        this.file = file;
        this.channel = channel;
        this.sync = sync;
    }

    /**
     * Opens {@code file} for appending (creating it with a header when missing or empty). A torn
     * last line must have been removed first, see {@link PointsCsvReader#recover}.
     */
    public static PointsCsvWriter open(Path file) {
        return open(file, true);
    }

    /**
     * As {@link #open(Path)}, choosing whether each row is synced to the device; {@code false} only
     * for benchmarks that measure what the sync costs.
     */
    public static PointsCsvWriter open(Path file, boolean syncEachRow) {
        try {
            FileChannel ch = FileChannel.open(file, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                    StandardOpenOption.APPEND);
            PointsCsvWriter w = new PointsCsvWriter(file, ch, syncEachRow);
            if (ch.size() == 0) {
                w.writeLine(PointsCsv.HEADER);
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

    /** Appends {@code row} and syncs it to the device before returning. */
    public void append(PointRow row) {
        append(row, true);
    }

    /**
     * Appends {@code row}; when {@code sync} is true, syncs it and every row before it to the device
     * before returning (used once per list sweep, whose rows arrive together).
     */
    public void append(PointRow row, boolean sync) {
        writeLine(PointsCsv.format(row), sync);
    }

    private void writeLine(String line) {
        writeLine(line, true);
    }

    private void writeLine(String line, boolean syncNow) {
        byte[] bytes = (line + "\n").getBytes(StandardCharsets.UTF_8);
        if (buffer.capacity() < bytes.length) {
            buffer = ByteBuffer.allocate(bytes.length * 2);
        }
        buffer.clear();
        buffer.put(bytes).flip();
        try {
            while (buffer.hasRemaining()) {
                channel.write(buffer);
            }
            if (sync && syncNow) {
                channel.force(false);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }

    /** Syncs and closes the file; I/O failures are thrown as {@link UncheckedIOException}. */
    @Override
    public void close() {
        try {
            if (channel.isOpen()) {
                channel.force(true);
                channel.close();
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot close " + file + ": " + e.getMessage(), e);
        }
    }
}
