package org.zweep.driver.transport.vxi11;

import org.zweep.driver.address.Address;
import org.zweep.driver.address.Vxi11Address;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.TransportProvider;

/** The {@code vxi11} scheme ({@code vxi11://} and VISA {@code TCPIP…::INSTR} addresses other than HiSLIP). */
public final class Vxi11TransportProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "vxi11";
    }

    @Override
    public Transport open(Address address, TransportOptions options) {
        return Vxi11Transport.connect((Vxi11Address) address, options);
    }
}
