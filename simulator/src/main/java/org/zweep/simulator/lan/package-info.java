/**
 * What the simulator's LAN instrument protocols (VXI-11, HiSLIP) need from the instrument besides
 * bytes: where a response message ends (for END) and the status byte (for a status query).
 */
package org.zweep.simulator.lan;
