package org.zweep.driver.transport;

import java.util.ArrayList;
import java.util.List;
import java.util.ServiceLoader;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.address.Address;

/** Opens a transport from an address through the {@link TransportProvider}s on the class path. */
public final class Transports {
    private Transports() {
    }

    /**
     * Parses {@code address} and opens it.
     *
     * @throws InvalidInputException if the address is malformed or no provider handles its scheme
     * @throws ConnectFailedException if the link cannot be opened
     */
    public static Transport open(String address, TransportOptions options) {
        return open(Address.parse(address), options);
    }

    /**
     * Opens {@code address} with the provider for its scheme; blocks up to the connect timeout.
     *
     * @throws InvalidInputException if no provider handles its scheme (e.g. {@code sim:} outside the runner)
     * @throws ConnectFailedException if the link cannot be opened
     */
    public static Transport open(Address address, TransportOptions options) {
        List<String> known = new ArrayList<>();
        for (TransportProvider p : ServiceLoader.load(TransportProvider.class)) {
            if (p.scheme().equalsIgnoreCase(address.scheme())) {
                return p.open(address, options);
            }
            known.add(p.scheme());
        }
        throw new InvalidInputException("address '" + address.text() + "': no transport for scheme '"
                + address.scheme() + "' is installed (available: " + String.join(", ", known) + ")");
    }
}
