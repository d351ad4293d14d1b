package org.zweep.runner.results;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * Appends rows to a {@code points.csv}. A row asked to be synced (the last of a trigger: a point,
 * or a whole list sweep) is written to the operating system, with the rows of its trigger before
 * it, before {@link #append} returns, so killing the process ({@code kill -9}, a JVM crash) never
 * loses a trigger's rows once its last was appended. What a power cut or an operating-system crash
 * can lose depends on the {@link Sync} mode (the device cache is trusted to honour {@code fdatasync}):
 * <ul>
 *   <li>{@link Sync#BEHIND} (the run engine's): the sync runs on a background thread while the
 *       caller goes on (the next point is measured meanwhile); the next {@code append} first waits
 *       for it, so at most one sync is ever in flight and a row is durable before the trigger after
 *       next is sent. A power cut loses at most the point in progress <em>and</em> the one
 *       appended just before it (for list sweeps, the sweep in progress and the one before it).
 *   <li>{@link Sync#EACH_ROW}: a row asked to be synced is on the device when {@code append}
 *       returns; a power cut loses at most the point (or list sweep) in progress.
 *   <li>{@link Sync#NONE}: never synced before {@link #close()}; for benchmarks that measure
 *       what syncing costs.
 * </ul>
 * Writes the header when the file is new or empty.
 *
 * <p>Not thread-safe: one run engine writes one file. I/O failures, a background sync's
 * included (reported by the next call, naming the file), are thrown as {@link UncheckedIOException}.
 */
public final class PointsCsvWriter implements AutoCloseable {
    /** When rows reach the storage device; see the class description for what each can lose. */
    public enum Sync {
        /** Synced before {@code append} returns. */
        EACH_ROW,
        /** Synced in the background, at most one sync in flight. */
        BEHIND,
        /** Synced only on close. */
        NONE
    }

    private final Path file;
    private final FileChannel channel;
    private final Sync mode;
    private final ExecutorService syncer;
    private Future<?> inFlight;
    private volatile long durableBytes;
    private long writtenBytes;
    /** Rows of one trigger held back at most this long before they go to the OS anyway. */
    private static final int HAND_OVER_BYTES = 1 << 16;
    private ByteBuffer buffer = ByteBuffer.allocate(4096);

    private PointsCsvWriter(Path file, FileChannel channel, Sync mode) {
        this.file = file;
        this.channel = channel;
        this.mode = mode;
        this.syncer = mode == Sync.BEHIND ? Executors.newSingleThreadExecutor(r -> {
            Thread t = new Thread(r, "zweep-points-sync");
            t.setDaemon(true);
            return t;
        }) : null;
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
     * says (the engine asks once per list sweep, whose rows arrive together). Blocks first until
     * a background sync still in flight has finished.
     */
    public void append(PointRow row, boolean sync) {
        writeLine(PointsCsv.format(row), sync);
    }

    private void writeLine(String line, boolean syncNow) {
        awaitInFlight();
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
        if (syncNow && mode == Sync.BEHIND) {
            long upTo = writtenBytes;
            inFlight = syncer.submit(() -> {
                channel.force(false);
                durableBytes = upTo;
                return null;
            });
        }
    }

    /** How many bytes of the file a finished sync has made durable (for tests). */
    long durableBytes() {
        return durableBytes;
    }

    /** Waits, uninterruptibly, for the background sync in flight; rethrows its failure. */
    private void awaitInFlight() {
        Future<?> f = inFlight;
        if (f == null) {
            return;
        }
        inFlight = null;
        boolean interrupted = false;
        try {
            while (true) {
                try {
                    f.get();
                    return;
                } catch (InterruptedException e) {
                    interrupted = true;
                } catch (ExecutionException e) {
                    Throwable c = e.getCause();
                    throw new UncheckedIOException("cannot sync " + file + ": " + c.getMessage(),
                            c instanceof IOException io ? io : new IOException(c));
                }
            }
        } finally {
            if (interrupted) {
                Thread.currentThread().interrupt();
            }
        }
    }

    /**
     * Waits for a background sync, syncs and closes the file; I/O failures are thrown as
     * {@link UncheckedIOException} (the file is closed all the same).
     */
    @Override
    public void close() {
        UncheckedIOException failure = null;
        try {
            awaitInFlight();
        } catch (UncheckedIOException e) {
            failure = e;
        }
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
        } finally {
            if (syncer != null) {
                syncer.shutdown();
            }
        }
        if (failure != null) {
            throw failure;
        }
    }
}
