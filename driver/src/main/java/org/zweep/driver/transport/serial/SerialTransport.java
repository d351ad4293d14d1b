package org.zweep.driver.transport.serial;

import com.fazecast.jSerialComm.SerialPort;
import com.fazecast.jSerialComm.SerialPortInvalidPortException;
import org.zweep.driver.address.SerialAddress;
import org.zweep.driver.address.SerialParameters;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;

/**
 * A serial port opened with jSerialComm, in its semi-blocking read mode: a read returns as soon as
 * any byte has arrived, or after the timeout, without busy-waiting.
 *
 * <p>Timeout granularity: on Linux the library's read timeouts work in steps of 100 ms, so every
 * read timeout here is rounded up to the next multiple of 100 ms (a 50 ms timeout waits 100 ms).
 * Writes block until the driver has taken the bytes, at most
 * {@link TransportOptions#writeTimeout()} (hardware or software flow control can hold them back).
 *
 * <p>jSerialComm extracts a native library into the temporary folder ({@code java.io.tmpdir}, or
 * {@code ~/.jSerialComm}) when first used; if that folder is mounted {@code noexec} loading fails,
 * which is reported as a {@link ConnectFailedException} saying how to point it elsewhere.
 * Not thread-safe; see {@link Transport}.
 */
public final class SerialTransport implements Transport {
    private static final int EACCES = 13;
    private static final int ENOENT = 2;
    private static final int EBUSY = 16;
    private static final int GRANULARITY_MS = 100;

    private final String name;
    private final SerialPort port;
    private final int writeTimeoutMillis;
    private int readTimeoutMillis;

    private SerialTransport(String name, SerialPort port, int readTimeoutMillis, int writeTimeoutMillis) {
        this.name = name;
        this.port = port;
        this.readTimeoutMillis = readTimeoutMillis;
        this.writeTimeoutMillis = writeTimeoutMillis;
    }

    /**
     * Opens and configures the port named by {@code address}.
     *
     * @throws ConnectFailedException if there is no such port, no permission, it is busy, or the
     *     native library cannot be loaded
     */
    public static SerialTransport open(SerialAddress address, TransportOptions options) {
        String name = address.text();
        SerialParameters p = address.parameters();
        SerialPort port;
        try {
            port = SerialPort.getCommPort(address.device());
        } catch (SerialPortInvalidPortException e) {
            throw new ConnectFailedException(name + ": no serial port '" + address.device() + "'", e);
        } catch (LinkageError e) {
            throw new ConnectFailedException(name + ": the serial library could not load its native part ("
                    + e.getMessage() + "); it unpacks it into java.io.tmpdir, which must not be mounted noexec: "
                    + "start Java with -Djava.io.tmpdir=DIR or -DjSerialComm.library.path=DIR on an executable "
                    + "folder", e);
        }
        int writeMs = (int) Math.min(Integer.MAX_VALUE, Math.max(1, options.writeTimeout().toMillis()));
        int readMs = GRANULARITY_MS;
        port.setComPortParameters(p.baudRate(), p.dataBits(), stopBits(p.stopBits()), parity(p.parity()));
        port.setFlowControl(flow(p.flowControl()));
        port.setComPortTimeouts(SerialPort.TIMEOUT_READ_SEMI_BLOCKING | SerialPort.TIMEOUT_WRITE_BLOCKING,
                readMs, writeMs);
        if (!port.openPort()) {
            throw new ConnectFailedException(name + ": cannot open serial port '" + address.device() + "': "
                    + openFailure(port.getLastErrorCode(), port.getLastErrorLocation()));
        }
        return new SerialTransport(name, port, readMs, writeMs);
    }

    static String openFailure(int errno, int location) {
        return switch (errno) {
            case EACCES -> "permission denied; on Linux the user must be in the 'dialout' group "
                    + "(sudo usermod -aG dialout $USER, then log in again)";
            case ENOENT -> "no such device (is it plugged in? list ports with ls /dev/tty*)";
            case EBUSY -> "it is in use by another program";
            default -> "error " + errno + " (jSerialComm location " + location + ")";
        };
    }

    private static int stopBits(int n) {
        return n == 2 ? SerialPort.TWO_STOP_BITS : SerialPort.ONE_STOP_BIT;
    }

    private static int parity(SerialParameters.Parity p) {
        return switch (p) {
            case NONE -> SerialPort.NO_PARITY;
            case EVEN -> SerialPort.EVEN_PARITY;
            case ODD -> SerialPort.ODD_PARITY;
        };
    }

    private static int flow(SerialParameters.FlowControl f) {
        return switch (f) {
            case NONE -> SerialPort.FLOW_CONTROL_DISABLED;
            case RTS_CTS -> SerialPort.FLOW_CONTROL_RTS_ENABLED | SerialPort.FLOW_CONTROL_CTS_ENABLED;
            case XON_XOFF -> SerialPort.FLOW_CONTROL_XONXOFF_IN_ENABLED | SerialPort.FLOW_CONTROL_XONXOFF_OUT_ENABLED;
        };
    }

    @Override
    public String name() {
        return name;
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        int done = 0;
        while (done < length) {
            int n = port.writeBytes(data, length - done, offset + done);
            if (n < 0) {
                throw new ConnectionLostException(name + ": serial write failed (error " + port.getLastErrorCode()
                        + "); was the device unplugged?");
            }
            if (n == 0) {
                throw new MeterTimeoutException(name + ": the serial port took no bytes within " + writeTimeoutMillis
                        + " ms while sending (is flow control holding the line?)", new byte[0]);
            }
            done += n;
        }
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        int t = (int) Math.min(Integer.MAX_VALUE - GRANULARITY_MS,
                (Math.max(1, timeoutMillis) + GRANULARITY_MS - 1) / GRANULARITY_MS * GRANULARITY_MS);
        if (t != readTimeoutMillis) {
            port.setComPortTimeouts(SerialPort.TIMEOUT_READ_SEMI_BLOCKING | SerialPort.TIMEOUT_WRITE_BLOCKING,
                    t, writeTimeoutMillis);
            readTimeoutMillis = t;
        }
        int n = port.readBytes(buffer, length, offset);
        if (n < 0 || !port.isOpen()) {
            throw new ConnectionLostException(name + ": serial read failed (error " + port.getLastErrorCode()
                    + "); was the device unplugged or the other end closed?");
        }
        return n;
    }

    @Override
    public void close() {
        port.closePort();
    }
}
