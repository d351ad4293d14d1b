/**
 * The host side of a bench: addresses and transports that carry SCPI bytes, the SCPI client, the
 * {@link org.zweep.driver.meter.Meter} abstraction and the impedance domain.
 */
package org.zweep.driver;
