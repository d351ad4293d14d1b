/**
 * HiSLIP (IVI-6.1) as a byte-stream transport: {@code hislip://HOST[:PORT][/SUBADDRESS]} and
 * {@code TCPIP[board]::HOST::hislipN[,PORT]::INSTR} (port 4880, sub-address {@code hislip0} by
 * default). Written from the specification; nothing is shared with the simulator's server side.
 */
package org.zweep.driver.transport.hislip;
