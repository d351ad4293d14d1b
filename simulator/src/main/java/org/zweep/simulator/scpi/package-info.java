/**
 * The simulated meter's SCPI side: an IEEE 488.2 / SCPI-1999 message parser, a command tree
 * declared as data, the status and error model, and the impedance meter's command set that turns
 * settings into {@link org.zweep.simulator.bench.Bench} requests. No sockets here: {@link
 * org.zweep.simulator.scpi.Session} executes one program message at a time for one connection.
 */
package org.zweep.simulator.scpi;
