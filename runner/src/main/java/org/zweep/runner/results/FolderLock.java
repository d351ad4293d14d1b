package org.zweep.runner.results;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.UnknownHostException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.channels.OverlappingFileLockException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Instant;
import org.zweep.driver.InvalidInputException;

/**
 * The exclusive lock a run holds on its run folder, so that a second run or resume on the same
 * folder is refused instead of writing into it too. It is an operating-system lock on
 * {@code run.lock} inside the folder (released by the system when the process ends, however it
 * ends); the file holds who took it (process id, host, time) for the refusal message. The file
 * itself stays when the lock is released: removing it would let two later runs lock two
 * different files of the same name.
 */
public final class FolderLock implements AutoCloseable {
    /** The lock file's name inside a run folder. */
    public static final String FILE = "run.lock";

    /**
     * The folders this process holds, with their holder line. The operating system's lock belongs
     * to the process, and closing any descriptor of the lock file in the process releases it: a
     * second attempt from this process must therefore be refused from here, without opening the
     * file.
     */
    private static final java.util.concurrent.ConcurrentHashMap<Path, String> HELD =
            new java.util.concurrent.ConcurrentHashMap<>();

    private final Path key;
    private final FileChannel channel;
    private final FileLock lock;
    private boolean closed;

    private FolderLock(Path key, FileChannel channel, FileLock lock) {
        this.key = key;
        this.channel = channel;
        this.lock = lock;
    }

    /**
     * Takes the lock on {@code dir} (which must exist) without waiting.
     *
     * @param now the time recorded as the holder's start
     * @throws InvalidInputException naming the holder (pid, host, since) when another run holds it
     */
    public static FolderLock acquire(Path dir, Instant now) {
        Path file = dir.resolve(FILE);
        Path key;
        try {
            key = dir.toRealPath();
        } catch (IOException e) {
            throw new InvalidInputException("cannot lock the run folder " + dir + ": " + reason(e));
        }
        String who = "pid " + ProcessHandle.current().pid() + " on " + host() + " since " + now;
        String inProcess = HELD.putIfAbsent(key, who);
        if (inProcess != null) {
            throw refusal(dir, inProcess);
        }
        try {
            return lockFile(dir, file, key, who);
        } catch (RuntimeException e) {
            HELD.remove(key);
            throw e;
        }
    }

    private static InvalidInputException refusal(Path dir, String holder) {
        return new InvalidInputException(dir + ": in use by another zweep run (" + holder
                + "); wait for it to end or choose another folder");
    }

    private static FolderLock lockFile(Path dir, Path file, Path key, String who) {
        FileChannel ch;
        try {
            ch = FileChannel.open(file, StandardOpenOption.CREATE, StandardOpenOption.READ, StandardOpenOption.WRITE);
        } catch (IOException e) {
            throw new InvalidInputException("cannot lock the run folder " + dir + ": cannot open " + file + ": "
                    + reason(e));
        }
        try {
            FileLock l;
            try {
                l = ch.tryLock();
            } catch (OverlappingFileLockException e) {
                l = null;
            }
            if (l == null) {
                String holder = holder(ch);
                ch.close();
                throw refusal(dir, holder);
            }
            ch.truncate(0);
            ByteBuffer b = ByteBuffer.wrap((who + "\n").getBytes(StandardCharsets.UTF_8));
            while (b.hasRemaining()) {
                ch.write(b, b.position());
            }
            ch.force(false);
            return new FolderLock(key, ch, l);
        } catch (IOException e) {
            try {
                ch.close();
            } catch (IOException ignored) {
                // the lock goes with the channel
            }
            throw new UncheckedIOException("cannot lock the run folder " + dir + ": " + reason(e), e);
        }
    }

    /** Whether {@code name} is the lock file (which does not make a folder "used"). */
    static boolean isLockFile(Path p) {
        return p.getFileName() != null && p.getFileName().toString().equals(FILE);
    }

    /** Releases the lock; the file stays. */
    @Override
    public synchronized void close() {
        if (closed) {
            return;
        }
        closed = true;
        try {
            if (lock.isValid()) {
                lock.release();
            }
            channel.close();
        } catch (IOException e) {
            // closing the channel releases the lock whatever happens
        } finally {
            HELD.remove(key);
        }
    }

    private static String holder(FileChannel ch) throws IOException {
        ByteBuffer b = ByteBuffer.allocate(512);
        ch.read(b, 0);
        String s = new String(b.array(), 0, b.position(), StandardCharsets.UTF_8).strip();
        return s.isEmpty() ? "holder unknown" : s;
    }

    static String reason(IOException e) {
        if (e instanceof java.nio.file.AccessDeniedException) {
            return "permission denied";
        }
        if (e instanceof java.nio.file.NoSuchFileException) {
            return "no such file or folder";
        }
        if (e instanceof java.nio.file.NotDirectoryException) {
            return "not a folder";
        }
        if (e instanceof java.nio.file.FileSystemException f && f.getReason() != null) {
            return f.getReason().toLowerCase(java.util.Locale.ROOT);
        }
        return e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
    }

    private static String host() {
        try {
            return InetAddress.getLocalHost().getHostName();
        } catch (UnknownHostException e) {
            String h = System.getenv("HOSTNAME");
            return h == null ? "unknown host" : h;
        }
    }
}
