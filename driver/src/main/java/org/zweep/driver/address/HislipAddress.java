package org.zweep.driver.address;

/**
 * A HiSLIP instrument (IVI-6.1).
 *
 * @param text the address as written
 * @param host host name or IP literal (IPv6 without brackets)
 * @param port the TCP port of both channels, 1 to 65535 (4880 unless given)
 * @param subAddress the HiSLIP sub-address, e.g. {@code hislip0}
 */
public record HislipAddress(String text, String host, int port, String subAddress) implements Address {

    /** The IANA-registered HiSLIP port. */
    public static final int DEFAULT_PORT = 4880;

    /** The sub-address when none is given. */
    public static final String DEFAULT_SUB_ADDRESS = "hislip0";

    @Override
    public String scheme() {
        return "hislip";
    }

    @Override
    public String toString() {
        return text;
    }
}
