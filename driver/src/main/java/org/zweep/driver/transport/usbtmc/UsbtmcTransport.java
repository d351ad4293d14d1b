package org.zweep.driver.transport.usbtmc;

import java.nio.file.Path;
import java.util.Arrays;
import org.zweep.driver.MeterException;
import org.zweep.driver.address.UsbtmcAddress;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.Deadline;
import org.zweep.driver.transport.LinkState;
import org.zweep.driver.transport.MessagePieces;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;

/**
 * A USBTMC instrument through the Linux kernel's {@code usbtmc} driver ({@code /dev/usbtmcN}).
 * The driver does the USBTMC framing: one {@code write} is one program message (EOM on its last
 * transfer), one {@code read} returns a response up to EOM or the buffer's size.
 *
 * <p>Timeouts: each read and write first sets the driver's timeout ({@code USBTMC_IOCTL_SET_TIMEOUT})
 * when it changed; the driver's minimum is 100 ms, so shorter timeouts are rounded up to it, and a
 * read that times out (ETIMEDOUT) returns 0. A node without the usbtmc ioctls (a stand-in such as
 * a pseudo-terminal, ENOTTY) is read with {@code poll} and the exact timeout instead. A late reply
 * comes with the next read and the SCPI client's resynchronisation discards it. Device clear,
 * status byte and trigger are the driver's ioctls ({@link #clear}, {@link #readStatusByte},
 * {@link #trigger}).
 *
 * <p>Not thread-safe; {@link #close()} from another thread does not end a read already waiting in
 * the kernel (it ends at the driver's timeout).
 */
public final class UsbtmcTransport implements Transport {
    /** The usbtmc driver's smallest timeout. */
    static final int MIN_KERNEL_TIMEOUT_MILLIS = 100;
    private static final int CHUNK = 64 * 1024;

    private final String name;
    private final String path;
    private final LinuxNode node;
    private final boolean kernelTimeouts;
    private final int writeTimeoutMillis;
    private final byte[] chunk = new byte[CHUNK];
    private int kernelTimeoutMillis = -1;
    private final LinkState state;

    private UsbtmcTransport(String name, String path, LinuxNode node, boolean kernelTimeouts, int writeTimeoutMillis,
            int kernelTimeoutMillis) {
        this.name = name;
        this.state = new LinkState(name);
        this.path = path;
        this.node = node;
        this.kernelTimeouts = kernelTimeouts;
        this.writeTimeoutMillis = writeTimeoutMillis;
        this.kernelTimeoutMillis = kernelTimeoutMillis;
    }

    /**
     * Opens the node (looking a USB identity up under {@code /sys} first).
     *
     * @throws ConnectFailedException if no such device, no permission (explained: a udev rule or a
     *     group), or the node is busy
     */
    public static UsbtmcTransport open(UsbtmcAddress address, TransportOptions options) {
        return open(address, options, Path.of("/sys"), Path.of("/dev"));
    }

    static UsbtmcTransport open(UsbtmcAddress address, TransportOptions options, Path sys, Path dev) {
        String path = address.device() != null ? address.device()
                : UsbtmcNodes.resolve(address.text(), address.usb(), sys, dev).toString();
        LinuxNode node;
        try {
            node = LinuxNode.open(path);
        } catch (LinuxNode.Errno e) {
            throw new ConnectFailedException(openFailure(address.text(), path, e.errno, e.getMessage()), e);
        }
        int writeMs = (int) Math.max(1, Math.min(Integer.MAX_VALUE, options.writeTimeout().toMillis()));
        int kernelMs = Math.max(MIN_KERNEL_TIMEOUT_MILLIS, writeMs);
        boolean kernel;
        try {
            node.ioctlInt("USBTMC_IOCTL_SET_TIMEOUT", LinuxNode.USBTMC_IOCTL_SET_TIMEOUT, kernelMs);
            kernel = true;
        } catch (LinuxNode.Errno e) {
            if (e.errno != LinuxNode.ENOTTY && e.errno != LinuxNode.EINVAL) {
                node.close();
                throw new ConnectFailedException(address.text() + ": cannot set the timeout of " + path + ": "
                        + e.getMessage(), e);
            }
            kernel = false; // not the usbtmc driver: a stand-in node, read with poll
        }
        return new UsbtmcTransport(address.text(), path, node, kernel, writeMs, kernel ? kernelMs : -1);
    }

    /** One line for a failed open, saying what to do. */
    static String openFailure(String address, String path, int errno, String detail) {
        return address + ": " + switch (errno) {
            case LinuxNode.EACCES, LinuxNode.EPERM -> "permission denied on " + path + ": allow your user with a udev"
                    + " rule, e.g. SUBSYSTEM==\"usbmisc\", KERNEL==\"usbtmc*\", GROUP=\"plugdev\", MODE=\"0660\","
                    + " and membership of that group (see README, USBTMC)";
            case LinuxNode.ENOENT, LinuxNode.ENXIO, LinuxNode.ENODEV -> "no device " + path + " (is the instrument"
                    + " plugged in and switched to USBTMC, and the usbtmc kernel module loaded? ls /dev/usbtmc*)";
            case LinuxNode.EBUSY -> path + " is in use by another program";
            default -> "cannot open " + path + ": " + detail;
        };
    }

    @Override
    public String name() {
        return name;
    }

    /** The device node this transport opened, e.g. {@code /dev/usbtmc0}. */
    public String devicePath() {
        return path;
    }

    /** Whether the node is the kernel's usbtmc driver (timeouts and ioctls), not a stand-in. */
    public boolean kernelDriver() {
        return kernelTimeouts;
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        state.check("write");
        if (length == 0) {
            return;
        }
        try {
            setKernelTimeout(writeTimeoutMillis);
            // the driver frames one write as one message: no piece limit, only what the device did not take again
            MessagePieces.send(length, Long.MAX_VALUE, (from, piece, last) -> {
                byte[] rest = offset + from == 0 && piece == data.length ? data
                        : Arrays.copyOfRange(data, offset + from, offset + from + piece);
                int n = node.write(rest, piece);
                if (n <= 0) {
                    throw fail("the device took no bytes of a " + length + "-byte message");
                }
                return Math.min(n, piece);
            });
        } catch (LinuxNode.Errno e) {
            if (e.errno == LinuxNode.ETIMEDOUT) {
                throw new MeterTimeoutException(name + ": the device did not take the message within "
                        + writeTimeoutMillis + " ms", new byte[0]);
            }
            throw fail("writing failed: " + e.getMessage() + hint(e.errno));
        }
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        state.check("read");
        int t = (int) Math.max(1, Math.min(Integer.MAX_VALUE, timeoutMillis));
        int want = Math.min(length, CHUNK);
        try {
            int n;
            if (kernelTimeouts) {
                setKernelTimeout(Math.max(MIN_KERNEL_TIMEOUT_MILLIS, t));
                Deadline deadline = Deadline.after(t);
                do {
                    n = node.read(chunk, want); // 0: an empty message; ask again while time is left
                } while (n == 0 && !deadline.passed());
            } else {
                if (!node.awaitReadable(t)) {
                    return 0;
                }
                n = node.read(chunk, want);
                if (n == 0) {
                    throw fail("the device node reached its end (the device went away)");
                }
            }
            System.arraycopy(chunk, 0, buffer, offset, n);
            return n;
        } catch (LinuxNode.Errno e) {
            if (e.errno == LinuxNode.ETIMEDOUT) {
                return 0;
            }
            throw fail("reading failed: " + e.getMessage() + hint(e.errno));
        }
    }

    /**
     * Device clear ({@code USBTMC_IOCTL_CLEAR}: INITIATE_CLEAR and CHECK_CLEAR_STATUS): the device
     * empties its input and output buffers.
     *
     * @throws MeterException if the node is not the kernel's usbtmc driver
     */
    public void clear() {
        ioctl("device clear", LinuxNode.USBTMC_IOCTL_CLEAR);
    }

    /** USB488 trigger ({@code USBTMC488_IOCTL_TRIGGER}, the same as {@code *TRG}). */
    public void trigger() {
        ioctl("trigger", LinuxNode.USBTMC488_IOCTL_TRIGGER);
    }

    /** The status byte through USB488 READ_STATUS_BYTE ({@code USBTMC488_IOCTL_READ_STB}), 0 to 255. */
    public int readStatusByte() {
        state.check("read the status byte");
        requireKernel("reading the status byte");
        try {
            return node.ioctlReadByte("USBTMC488_IOCTL_READ_STB", LinuxNode.USBTMC488_IOCTL_READ_STB);
        } catch (LinuxNode.Errno e) {
            throw failed("reading the status byte", e);
        }
    }

    private void ioctl(String what, long request) {
        state.check(what);
        requireKernel(what);
        try {
            node.ioctl(what, request);
        } catch (LinuxNode.Errno e) {
            throw failed(what, e);
        }
    }

    private MeterException failed(String what, LinuxNode.Errno e) {
        if (e.errno == LinuxNode.ETIMEDOUT) {
            return new MeterTimeoutException(name + ": " + what + " timed out", new byte[0]);
        }
        return fail(what + " failed: " + e.getMessage() + hint(e.errno));
    }

    private void requireKernel(String what) {
        if (!kernelTimeouts) {
            throw new MeterException(name + ": " + what + " needs the kernel's usbtmc driver; " + path + " is not one");
        }
    }

    private void setKernelTimeout(int millis) throws LinuxNode.Errno {
        if (kernelTimeouts && millis != kernelTimeoutMillis) {
            node.ioctlInt("USBTMC_IOCTL_SET_TIMEOUT", LinuxNode.USBTMC_IOCTL_SET_TIMEOUT, millis);
            kernelTimeoutMillis = millis;
        }
    }

    private static String hint(int errno) {
        return switch (errno) {
            case LinuxNode.ENODEV, LinuxNode.ESHUTDOWN, LinuxNode.EIO, LinuxNode.EPIPE ->
                    " (was the instrument unplugged, switched off or reset?)";
            default -> "";
        };
    }

    private ConnectionLostException fail(String why) {
        return state.broke(why);
    }

    @Override
    public void close() {
        state.close();
        node.close();
    }
}
