/**
 * Byte-level links to a meter: the {@link org.zweep.driver.transport.Transport} interface, the
 * {@link org.zweep.driver.transport.TransportProvider} service interface found through
 * {@link java.util.ServiceLoader} by address scheme, {@link org.zweep.driver.transport.Transports#open}
 * and the typed link failures.
 */
package org.zweep.driver.transport;
