package org.zweep.driver.transport.hislip;

import org.zweep.driver.address.Address;
import org.zweep.driver.address.HislipAddress;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.TransportProvider;

/** The {@code hislip} scheme ({@code hislip://} and VISA {@code TCPIP…::hislipN::INSTR} addresses). */
public final class HislipTransportProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "hislip";
    }

    @Override
    public Transport open(Address address, TransportOptions options) {
        return HislipTransport.connect((HislipAddress) address, options);
    }
}
