package org.zweep.driver.address;

/**
 * A USBTMC instrument on Linux, reached through the kernel's {@code usbtmc} driver: either a device
 * node ({@code usbtmc:/dev/usbtmc0}) or the instrument's USB identity (VISA
 * {@code USB[board]::VID::PID::SERIAL[::INTFC]::INSTR}), looked up under {@code /sys} when opened.
 *
 * @param text the address as written
 * @param device the device node, or {@code null} when {@code usb} names the instrument
 * @param usb the USB identity, or {@code null} when {@code device} is given
 */
public record UsbtmcAddress(String text, String device, UsbId usb) implements Address {

    /**
     * A USB instrument's identity as VISA writes it.
     *
     * @param vendorId the USB vendor id, 0 to 0xFFFF
     * @param productId the USB product id, 0 to 0xFFFF
     * @param serial the USB serial number string, as the device reports it
     * @param interfaceNumber the USBTMC interface's number (0 unless the device has several)
     */
    public record UsbId(int vendorId, int productId, String serial, int interfaceNumber) {
        @Override
        public String toString() {
            return String.format("0x%04X::0x%04X::%s::%d", vendorId, productId, serial, interfaceNumber);
        }
    }

    @Override
    public String scheme() {
        return "usbtmc";
    }

    @Override
    public String toString() {
        return text;
    }
}
