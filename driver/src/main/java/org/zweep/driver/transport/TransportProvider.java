package org.zweep.driver.transport;

import org.zweep.driver.address.Address;

/**
 * Opens transports for one address scheme. Implementations are found with
 * {@link java.util.ServiceLoader}: list the class in
 * {@code META-INF/services/org.zweep.driver.transport.TransportProvider}. They need a public
 * no-argument constructor and must be thread-safe (one instance serves every open).
 */
public interface TransportProvider {

    /** The scheme this provider opens, as {@link Address#scheme()} gives it: {@code tcp}, {@code serial}, {@code sim}. */
    String scheme();

    /**
     * Opens a link to {@code address}; blocks up to the connect timeout.
     *
     * @param address an address whose {@link Address#scheme()} equals {@link #scheme()}
     * @throws ConnectFailedException if the link cannot be opened
     */
    Transport open(Address address, TransportOptions options);
}
