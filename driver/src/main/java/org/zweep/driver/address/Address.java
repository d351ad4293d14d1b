package org.zweep.driver.address;

import org.zweep.driver.InvalidInputException;

/**
 * Where a meter is: a parsed connection address. Values are immutable and thread-safe.
 *
 * <p>Grammar (schemes are case-insensitive):
 * <pre>
 *   tcp://HOST[:PORT]                       raw SCPI socket, PORT defaults to 5025
 *   serial:DEVICE[?OPTION=VALUE&amp;...]       OPTION: baud, data, parity, stop, flow
 *   sim:[BENCH]                             the built-in simulator, in this process
 *   vxi11://HOST[:PORT][/DEVICE]            VXI-11; PORT is the portmapper's (111), DEVICE inst0
 *   TCPIP[board]::HOST::PORT::SOCKET        VISA raw socket, same as tcp://HOST:PORT
 *   TCPIP[board]::HOST[::DEVICE][::INSTR]   VISA VXI-11, same as vxi11://HOST/DEVICE
 *   hislip://HOST[:PORT][/SUBADDRESS]        HiSLIP; PORT 4880, SUBADDRESS hislip0
 *   TCPIP[board]::HOST::hislipN[,PORT]::INSTR  VISA HiSLIP, same as hislip://HOST:PORT/hislipN
 *   usbtmc:/dev/usbtmcN                     USBTMC through the Linux kernel driver
 *   USB[board]::VID::PID::SERIAL[::INTFC][::INSTR]  VISA USBTMC, found under /sys
 *   ASRL&lt;device&gt;[::INSTR][?OPTION=...]     VISA serial, same as serial:DEVICE
 * </pre>
 * An IPv6 host is written in brackets: {@code tcp://[::1]:5025}.
 */
public sealed interface Address permits TcpAddress, SerialAddress, SimAddress, Vxi11Address, UsbtmcAddress, HislipAddress {

    /** The address exactly as the user wrote it (trimmed), for messages. */
    String text();

    /** The transport scheme that opens it: {@code tcp}, {@code serial}, {@code sim}, {@code vxi11}, {@code hislip} or {@code usbtmc}. */
    String scheme();

    /**
     * Parses an address.
     *
     * @throws InvalidInputException naming the part of {@code text} that is wrong
     */
    static Address parse(String text) {
        return AddressParser.parse(text);
    }
}
