/**
 * Connection addresses: one string naming the link to a meter ({@code tcp://}, {@code serial:},
 * {@code sim:} and the IVI VISA {@code TCPIP…::SOCKET} / {@code ASRL…::INSTR} forms), parsed into
 * typed values that the transports open.
 */
package org.zweep.driver.address;
