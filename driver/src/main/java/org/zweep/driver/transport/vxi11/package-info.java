/**
 * VXI-11 (ONC RPC over TCP) as a byte-stream transport: {@code vxi11://HOST[:PORT][/DEVICE]} and
 * {@code TCPIP[board]::HOST[::DEVICE]::INSTR}, where PORT is the portmapper's (111) and DEVICE
 * defaults to {@code inst0}. XDR (RFC 4506), RPC record marking (RFC 5531) and the portmapper
 * (RFC 1833) are implemented here, from the specifications; nothing is shared with the simulator's
 * server side.
 */
package org.zweep.driver.transport.vxi11;
