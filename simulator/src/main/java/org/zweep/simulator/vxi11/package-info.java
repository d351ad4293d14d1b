/**
 * The simulator served over VXI-11 (VXI-11 rev. 1.0): its own portmapper (RFC 1833), the core and
 * abort channels as ONC RPC programs (RFC 5531, XDR per RFC 4506), each link an in-memory
 * connection to the {@link org.zweep.simulator.server.SimulatorServer}, so faults and state behave
 * as over raw TCP. Written from the specifications; shares no code with the driver's client.
 */
package org.zweep.simulator.vxi11;
