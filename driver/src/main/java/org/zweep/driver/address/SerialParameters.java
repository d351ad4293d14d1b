package org.zweep.driver.address;

/**
 * Line settings of a serial port.
 *
 * @param baudRate bits per second (positive)
 * @param dataBits data bits per character, 5 to 8
 * @param parity parity bit
 * @param stopBits stop bits, 1 or 2
 * @param flowControl hardware, software or no flow control
 */
public record SerialParameters(int baudRate, int dataBits, Parity parity, int stopBits, FlowControl flowControl) {

    /** The defaults when an address gives no options: 9600 baud, 8 data bits, no parity, 1 stop bit, no flow control. */
    public static final SerialParameters DEFAULT = new SerialParameters(9600, 8, Parity.NONE, 1, FlowControl.NONE);

    /** Parity of each character. */
    public enum Parity {
        /** No parity bit ({@code parity=none}). */
        NONE,
        /** Even parity ({@code parity=even}). */
        EVEN,
        /** Odd parity ({@code parity=odd}). */
        ODD
    }

    /** Flow control of the line. */
    public enum FlowControl {
        /** None ({@code flow=none}). */
        NONE,
        /** Hardware RTS/CTS handshake ({@code flow=rtscts}). */
        RTS_CTS,
        /** Software XON/XOFF ({@code flow=xonxoff}). */
        XON_XOFF
    }

    /** Compact form for messages, e.g. {@code 9600 8N1}. */
    public String summary() {
        return baudRate + " " + dataBits + parity.name().charAt(0) + stopBits
                + (flowControl == FlowControl.NONE ? "" : " " + flowControl.name().toLowerCase(java.util.Locale.ROOT));
    }
}
