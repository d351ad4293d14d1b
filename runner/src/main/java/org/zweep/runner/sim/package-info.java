/**
 * The {@code sim:} address: the zweep simulator in the same process, loaded from a bench file
 * and reached through an in-memory connection that behaves like a TCP one. Registered as a
 * {@link org.zweep.driver.transport.TransportProvider}; the runner also opens meter links on it
 * directly so that reconnecting reaches the same simulated meter.
 */
package org.zweep.runner.sim;
