/**
 * End-to-end checks of the driver against zweep's simulator, the meter on the far side of the
 * wire: the {@code standard} dialect over {@link org.zweep.driver.scpi.ScpiClient} over loopback
 * TCP and over an in-memory stream pair, with and without the simulator's fault injection.
 */
package org.zweep.driver.simulated;
