package org.zweep.runner.sim;

import org.zweep.driver.address.Address;
import org.zweep.driver.transport.Transport;
import org.zweep.driver.transport.TransportOptions;
import org.zweep.driver.transport.TransportProvider;

/**
 * The {@code sim:} scheme: each open starts a fresh in-process simulator from the address's bench
 * file and connects to it; closing the transport stops that simulator. {@code sim:tcp://HOST:PORT}
 * connects to a simulator already serving over TCP (its options, such as {@code seed}, are
 * applied only by {@link MeterLinks}). Stateless and thread-safe.
 */
public final class SimTransportProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "sim";
    }

    @Override
    public Transport open(Address address, TransportOptions options) {
        String text = address.text().substring("sim:".length());
        if (text.startsWith("tcp://")) {
            int q = text.indexOf('?');
            return org.zweep.driver.transport.Transports.open(q >= 0 ? text.substring(0, q) : text, options);
        }
        InProcessSimulator sim = InProcessSimulator.start(address.text());
        Transport t = sim.connectTransport();
        return new Transport() {
            @Override
            public String name() {
                return t.name();
            }

            @Override
            public void write(byte[] data, int offset, int length) {
                t.write(data, offset, length);
            }

            @Override
            public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
                return t.read(buffer, offset, length, timeoutMillis);
            }

            @Override
            public void close() {
                t.close();
                sim.close();
            }
        };
    }
}
