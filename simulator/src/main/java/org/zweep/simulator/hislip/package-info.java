/**
 * The simulator served over HiSLIP (IVI-6.1): both channels on one port, each session an
 * in-memory connection to the {@link org.zweep.simulator.server.SimulatorServer}. Written from the
 * specification; shares no code with the driver's client.
 */
package org.zweep.simulator.hislip;
