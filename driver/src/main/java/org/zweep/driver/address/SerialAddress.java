package org.zweep.driver.address;

/**
 * A serial port.
 *
 * @param text the address as written
 * @param device the device path ({@code /dev/ttyUSB0}) or port name ({@code COM3})
 * @param parameters line speed, framing and flow control
 */
public record SerialAddress(String text, String device, SerialParameters parameters) implements Address {

    @Override
    public String scheme() {
        return "serial";
    }

    @Override
    public String toString() {
        return text;
    }
}
