package org.zweep.driver.address;

/**
 * A raw SCPI socket.
 *
 * @param text the address as written
 * @param host host name or IP literal (IPv6 without brackets)
 * @param port TCP port, 1 to 65535
 */
public record TcpAddress(String text, String host, int port) implements Address {

    /** The IANA-registered port of SCPI over a raw socket ({@code scpi-raw}). */
    public static final int DEFAULT_PORT = 5025;

    @Override
    public String scheme() {
        return "tcp";
    }

    @Override
    public String toString() {
        return text;
    }
}
