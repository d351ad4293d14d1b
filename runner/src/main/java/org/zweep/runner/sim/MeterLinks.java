package org.zweep.runner.sim;

import org.zweep.driver.address.Address;
import org.zweep.driver.address.SimAddress;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.engine.ScpiMeterLink;

/** Opens a meter link for any address the driver accepts, {@code sim:} included. */
public final class MeterLinks {
    private MeterLinks() {
    }

    /**
     * Connects to the meter at {@code address} speaking {@code dialect}. For a {@code sim:}
     * address one in-process simulator is started and every reconnect reaches that same meter;
     * closing the link stops it.
     *
     * @throws org.zweep.driver.InvalidInputException when the address or dialect is malformed
     * @throws org.zweep.driver.MeterException when the meter cannot be reached
     */
    public static ScpiMeterLink open(String address, String dialect, ScpiSettings settings) {
        Address a = Address.parse(address);
        if (a instanceof SimAddress) {
            InProcessSimulator sim = InProcessSimulator.start(address);
            try {
                return ScpiMeterLink.open(address, dialect, () -> sim.connect(settings), sim::close);
            } catch (RuntimeException e) {
                sim.close();
                throw e;
            }
        }
        return ScpiMeterLink.open(address, dialect, () -> ScpiClient.open(a, settings), () -> { });
    }
}
