package org.zweep.driver.address;

/**
 * A VXI-11 instrument (ONC RPC over TCP, found through the host's portmapper).
 *
 * @param text the address as written
 * @param host host name or IP literal (IPv6 without brackets)
 * @param portmapperPort the portmapper's TCP port, 1 to 65535 (111 unless given)
 * @param device the LAN device name the link is made to, e.g. {@code inst0} or {@code gpib0,5}
 */
public record Vxi11Address(String text, String host, int portmapperPort, String device) implements Address {

    /** The portmapper's well-known port ({@code sunrpc}, RFC 1833). */
    public static final int DEFAULT_PORTMAPPER_PORT = 111;

    /** The LAN device name when none is given (VPP-4.3). */
    public static final String DEFAULT_DEVICE = "inst0";

    @Override
    public String scheme() {
        return "vxi11";
    }

    @Override
    public String toString() {
        return text;
    }
}
