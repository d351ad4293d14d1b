/**
 * The physics of the simulated bench: the device (netlist or part model), the fixture and the
 * meter model that measures them. This is what the SCPI server asks for each point.
 */
package org.zweep.simulator.bench;
