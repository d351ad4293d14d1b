package org.zweep.driver.transport.usbtmc;

import com.sun.jna.LastErrorException;
import com.sun.jna.Library;
import com.sun.jna.Memory;
import com.sun.jna.Native;
import com.sun.jna.NativeLong;
import com.sun.jna.Pointer;
import com.sun.jna.ptr.ByteByReference;
import com.sun.jna.ptr.IntByReference;

/**
 * The C library calls on a Linux character device, wrapped once (JNA): {@code open}, {@code read},
 * {@code write}, {@code poll}, {@code close} and the kernel {@code usbtmc} driver's ioctls
 * ({@code <linux/usb/tmc.h>}). Every failure is an {@link Errno} with the C error number, turned
 * into a typed driver exception by {@link UsbtmcTransport}. Not thread-safe.
 */
final class LinuxNode {
    static final int EPERM = 1;
    static final int ENOENT = 2;
    static final int EINTR = 4;
    static final int EIO = 5;
    static final int ENXIO = 6;
    static final int EACCES = 13;
    static final int EBUSY = 16;
    static final int ENODEV = 19;
    static final int EINVAL = 22;
    static final int ENOTTY = 25;
    static final int EPIPE = 32;
    static final int ESHUTDOWN = 108;
    static final int ETIMEDOUT = 110;

    private static final int O_RDWR = 2;
    private static final int O_NOCTTY = 0x100;
    private static final int O_CLOEXEC = 0x80000;
    private static final short POLLIN = 1;
    private static final short POLLERR = 8;
    private static final short POLLHUP = 0x10;

    // <linux/usb/tmc.h>, generic Linux ioctl encoding (magic '[' = 91)
    static final long USBTMC_IOCTL_CLEAR = 0x5B02L;
    static final long USBTMC_IOCTL_SET_TIMEOUT = 0x40045B0AL;
    static final long USBTMC488_IOCTL_READ_STB = 0x80015B12L;
    static final long USBTMC488_IOCTL_TRIGGER = 0x5B16L;

    /** The C library, bound on first use. */
    private interface C extends Library {
        int open(String path, int flags) throws LastErrorException;

        NativeLong read(int fd, byte[] buffer, NativeLong count) throws LastErrorException;

        NativeLong write(int fd, byte[] buffer, NativeLong count) throws LastErrorException;

        int poll(Pointer fds, NativeLong count, int timeoutMillis) throws LastErrorException;

        int ioctl(int fd, NativeLong request, Pointer argument) throws LastErrorException;

        int close(int fd);
    }

    private static final class Holder {
        static final C C = Native.load("c", C.class);
    }

    /** A failed system call: its name and C error number. */
    static final class Errno extends Exception {
        private static final long serialVersionUID = 1L;
        final String call;
        final int errno;

        Errno(String call, int errno, String text) {
            super(call + ": " + text);
            this.call = call;
            this.errno = errno;
        }
    }

    private final int fd;
    private final Memory pollfd = new Memory(8);
    private volatile boolean closed;

    private LinuxNode(int fd) {
        this.fd = fd;
    }

    /** Opens {@code path} for reading and writing (never as a controlling terminal). */
    static LinuxNode open(String path) throws Errno {
        try {
            return new LinuxNode(c().open(path, O_RDWR | O_NOCTTY | O_CLOEXEC));
        } catch (LastErrorException e) {
            throw errno("open", e);
        }
    }

    private static C c() throws Errno {
        try {
            return Holder.C;
        } catch (LinkageError e) {
            throw new Errno("load libc", EIO, "cannot load the C library through JNA (" + e.getMessage()
                    + "); a temp folder mounted noexec breaks JNA's native part: set -Djna.tmpdir to another folder");
        }
    }

    /** One {@code read(2)}: blocks as the node does (the usbtmc driver: up to its timeout, then ETIMEDOUT). */
    int read(byte[] buffer, int length) throws Errno {
        try {
            return c().read(fd, buffer, new NativeLong(length)).intValue();
        } catch (LastErrorException e) {
            throw errno("read", e);
        }
    }

    /** One {@code write(2)}; returns the bytes taken (the usbtmc driver takes a whole message). */
    int write(byte[] buffer, int length) throws Errno {
        try {
            return c().write(fd, buffer, new NativeLong(length)).intValue();
        } catch (LastErrorException e) {
            throw errno("write", e);
        }
    }

    /**
     * Waits up to {@code timeoutMillis} for the node to be readable ({@code poll(2)}, POLLIN).
     *
     * @return true when a read will not block (data, end of file or an error to report)
     */
    boolean awaitReadable(int timeoutMillis) throws Errno {
        pollfd.setInt(0, fd);
        pollfd.setShort(4, POLLIN);
        pollfd.setShort(6, (short) 0);
        try {
            int n = c().poll(pollfd, new NativeLong(1), timeoutMillis);
            return n > 0 && (pollfd.getShort(6) & (POLLIN | POLLERR | POLLHUP)) != 0;
        } catch (LastErrorException e) {
            if (e.getErrorCode() == EINTR) {
                return false;
            }
            throw errno("poll", e);
        }
    }

    /** An ioctl without an argument. */
    void ioctl(String name, long request) throws Errno {
        try {
            c().ioctl(fd, new NativeLong(request), Pointer.NULL);
        } catch (LastErrorException e) {
            throw errno(name, e);
        }
    }

    /** An ioctl that takes a {@code __u32}. */
    void ioctlInt(String name, long request, int value) throws Errno {
        IntByReference v = new IntByReference(value);
        try {
            c().ioctl(fd, new NativeLong(request), v.getPointer());
        } catch (LastErrorException e) {
            throw errno(name, e);
        }
    }

    /** An ioctl that returns a {@code __u8}. */
    int ioctlReadByte(String name, long request) throws Errno {
        ByteByReference v = new ByteByReference();
        try {
            c().ioctl(fd, new NativeLong(request), v.getPointer());
            return v.getValue() & 0xff;
        } catch (LastErrorException e) {
            throw errno(name, e);
        }
    }

    void close() {
        if (!closed) {
            closed = true;
            try {
                c().close(fd);
            } catch (Errno e) {
                // closing is best effort
            }
        }
    }

    private static Errno errno(String call, LastErrorException e) {
        int code = e.getErrorCode();
        String text = e.getMessage();
        int bracket = text == null ? -1 : text.indexOf(']');
        return new Errno(call, code, bracket >= 0 ? text.substring(bracket + 1).strip() : String.valueOf(text));
    }
}
