package org.zweep.driver.transport.serial;

import org.zweep.driver.address.Address;
import org.zweep.driver.address.SerialAddress;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.TransportProvider;

/** The {@code serial} scheme ({@code serial:} and VISA {@code ASRL…::INSTR} addresses). */
public final class SerialTransportProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "serial";
    }

    @Override
    public Transport open(Address address, TransportOptions options) {
        return SerialTransport.open((SerialAddress) address, options);
    }
}
