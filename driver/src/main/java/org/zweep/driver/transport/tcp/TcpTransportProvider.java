package org.zweep.driver.transport.tcp;

import org.zweep.driver.address.Address;
import org.zweep.driver.address.TcpAddress;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.TransportProvider;

/** The {@code tcp} scheme ({@code tcp://} and VISA {@code TCPIP…::SOCKET} addresses). */
public final class TcpTransportProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "tcp";
    }

    @Override
    public Transport open(Address address, TransportOptions options) {
        return TcpTransport.connect((TcpAddress) address, options);
    }
}
