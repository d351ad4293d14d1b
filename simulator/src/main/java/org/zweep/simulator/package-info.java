/**
 * A software impedance meter with a fixture and a device in it, behind its own SCPI server. It
 * shares no code with the host side: its parser, physics and correction math are its own.
 */
package org.zweep.simulator;
