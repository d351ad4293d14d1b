package org.zweep.driver.transport.usbtmc;

import org.zweep.driver.address.Address;
import org.zweep.driver.address.UsbtmcAddress;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.TransportProvider;

/** The {@code usbtmc} scheme ({@code usbtmc:/dev/usbtmcN} and VISA {@code USB…::INSTR} addresses). */
public final class UsbtmcTransportProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "usbtmc";
    }

    @Override
    public Transport open(Address address, TransportOptions options) {
        return UsbtmcTransport.open((UsbtmcAddress) address, options);
    }
}
