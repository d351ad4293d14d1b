/**
 * Devices given as SPICE element lines (R, L, C, K) between the terminals {@code hi} and
 * {@code lo}, and their impedance by modified nodal analysis.
 */
package org.zweep.simulator.netlist;
