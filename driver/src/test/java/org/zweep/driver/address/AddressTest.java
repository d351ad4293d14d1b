package org.zweep.driver.address;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.address.SerialParameters.FlowControl;
import org.zweep.driver.address.SerialParameters.Parity;

class AddressTest {

    @Test
    void tcpWithoutPortUsesTheRawScpiPort() {
        TcpAddress a = assertInstanceOf(TcpAddress.class, Address.parse("tcp://192.168.1.50"));
        assertEquals("192.168.1.50", a.host());
        assertEquals(5025, a.port()); // IANA Service Name and Port Number Registry: scpi-raw is 5025/tcp
        assertEquals("tcp", a.scheme());
    }

    @Test
    void tcpKeepsTheTextAsWrittenAndTheGivenPort() {
        TcpAddress a = assertInstanceOf(TcpAddress.class, Address.parse("  TCP://meter.lab:5555 "));
        assertEquals("TCP://meter.lab:5555", a.text());
        assertEquals("meter.lab", a.host());
        assertEquals(5555, a.port());
    }

    @Test
    void tcpAcceptsABracketedIpv6Host() {
        TcpAddress a = assertInstanceOf(TcpAddress.class, Address.parse("tcp://[::1]:6000"));
        assertEquals("::1", a.host());
        assertEquals(6000, a.port());
    }

    @Test
    void visaSocketStringMapsToTcp() {
        TcpAddress a = assertInstanceOf(TcpAddress.class, Address.parse("TCPIP0::192.168.1.50::5025::SOCKET"));
        assertEquals("192.168.1.50", a.host()); // IVI VPP-4.3 (VISA) resource string TCPIP[board]::host::port::SOCKET
        assertEquals(5025, a.port());
        TcpAddress b = assertInstanceOf(TcpAddress.class, Address.parse("tcpip::meter::5026::socket"));
        assertEquals("meter", b.host());
        assertEquals(5026, b.port());
    }

    @Test
    void serialDefaultsAre9600EightNoneOne() {
        SerialAddress a = assertInstanceOf(SerialAddress.class, Address.parse("serial:/dev/ttyUSB0"));
        assertEquals("/dev/ttyUSB0", a.device());
        assertEquals(SerialParameters.DEFAULT, a.parameters());
        assertEquals("9600 8N1", a.parameters().summary());
    }

    @Test
    void serialOptionsSetEveryField() {
        SerialAddress a = assertInstanceOf(SerialAddress.class,
                Address.parse("serial:/dev/ttyS1?baud=115200&data=7&parity=even&stop=2&flow=rtscts"));
        assertEquals(new SerialParameters(115200, 7, Parity.EVEN, 2, FlowControl.RTS_CTS), a.parameters());
    }

    @Test
    void visaSerialStringTakesADeviceAndQueryOptions() {
        SerialAddress a = assertInstanceOf(SerialAddress.class,
                Address.parse("ASRL/dev/ttyUSB0::INSTR?baud=19200&flow=xonxoff"));
        assertEquals("/dev/ttyUSB0", a.device());
        assertEquals(19200, a.parameters().baudRate());
        assertEquals(FlowControl.XON_XOFF, a.parameters().flowControl());
        SerialAddress b = assertInstanceOf(SerialAddress.class, Address.parse("ASRLCOM3::INSTR"));
        assertEquals("COM3", b.device());
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        // VPP-4.3: TCPIP[board]::host address[::LAN device name][::INSTR], device inst0 by default
        "TCPIP::192.168.1.50::INSTR           | 192.168.1.50 | 111  | inst0",
        "TCPIP0::192.168.1.50::inst0::INSTR   | 192.168.1.50 | 111  | inst0",
        "tcpip3::meter.lab::gpib0,5::INSTR    | meter.lab    | 111  | gpib0,5",
        "TCPIP::meter.lab                     | meter.lab    | 111  | inst0",
        "TCPIP::meter.lab::inst1              | meter.lab    | 111  | inst1",
        "TCPIP::[fe80::1]::INSTR              | fe80::1      | 111  | inst0",
        "vxi11://meter.lab                    | meter.lab    | 111  | inst0",
        "VXI11://127.0.0.1:4111/inst2         | 127.0.0.1    | 4111 | inst2",
        "vxi11://[::1]:111                    | ::1          | 111  | inst0",
    })
    void vxi11FormsGiveHostPortmapperPortAndDevice(String text, String host, int port, String device) {
        Vxi11Address a = assertInstanceOf(Vxi11Address.class, Address.parse(text));
        assertEquals(new Vxi11Address(text, host, port, device), a);
        assertEquals("vxi11", a.scheme());
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        // VPP-4.3: USB[board]::manufacturer ID::model code::serial number[::USB interface number][::INSTR]
        "USB0::0x1234::0x5678::SN0001::INSTR    | 4660  | 22136 | SN0001 | 0",
        "usb::0X1234::0x5678::SN0001            | 4660  | 22136 | SN0001 | 0",
        "USB1::4660::22136::MY-42::3::INSTR     | 4660  | 22136 | MY-42  | 3",
        "USB::0xFFFF::0x0000::A::255            | 65535 | 0     | A      | 255",
    })
    void visaUsbStringsGiveVendorProductSerialAndInterface(String text, int vendor, int product, String serial,
            int intf) {
        UsbtmcAddress a = assertInstanceOf(UsbtmcAddress.class, Address.parse(text));
        assertEquals(new UsbtmcAddress(text, null, new UsbtmcAddress.UsbId(vendor, product, serial, intf)), a);
        assertEquals("usbtmc", a.scheme());
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        // VPP-4.3: the LAN device name hislip<N>[,<port>]; IVI-6.1: port 4880
        "TCPIP::192.168.1.50::hislip0::INSTR      | 192.168.1.50 | 4880 | hislip0",
        "TCPIP0::meter.lab::HISLIP1,4881::INSTR   | meter.lab    | 4881 | HISLIP1",
        "TCPIP::[::1]::hislip0                    | ::1          | 4880 | hislip0",
        "hislip://meter.lab                       | meter.lab    | 4880 | hislip0",
        "hislip://127.0.0.1:5000/hislip2          | 127.0.0.1    | 5000 | hislip2",
    })
    void hislipFormsGiveHostPortAndSubAddress(String text, String host, int port, String sub) {
        HislipAddress a = assertInstanceOf(HislipAddress.class, Address.parse(text));
        assertEquals(new HislipAddress(text, host, port, sub), a);
        assertEquals("hislip", a.scheme());
    }

    @Test
    void usbtmcTakesADeviceNode() {
        assertEquals(new UsbtmcAddress("usbtmc:/dev/usbtmc0", "/dev/usbtmc0", null), Address.parse("usbtmc:/dev/usbtmc0"));
    }

    @Test
    void simWithAndWithoutBench() {
        assertEquals("", assertInstanceOf(SimAddress.class, Address.parse("sim:")).bench());
        assertEquals("", assertInstanceOf(SimAddress.class, Address.parse("sim")).bench());
        assertEquals("benches/rc.yaml",
                assertInstanceOf(SimAddress.class, Address.parse("sim:benches/rc.yaml")).bench());
    }

    @ParameterizedTest(name = "{0} -> {1}")
    @CsvSource(delimiter = '|', value = {
        "''                                  | empty address",
        "tcp://                              | missing host",
        "tcp://:5025                         | missing host",
        "tcp://meter:0                       | port '0'",
        "tcp://meter:70000                   | port '70000'",
        "tcp://meter:50x                     | port '50x'",
        "tcp://meter:5025/inst0              | path '/inst0'",
        "tcp://::1                           | brackets",
        "serial:                             | missing serial device",
        "serial:/dev/ttyS0?baud=fast         | baud='fast'",
        "serial:/dev/ttyS0?parity=mark       | parity='mark'",
        "serial:/dev/ttyS0?stop=3            | stop='3'",
        "serial:/dev/ttyS0?data=9            | data='9'",
        "serial:/dev/ttyS0?flow=dtr          | flow='dtr'",
        "serial:/dev/ttyS0?speed=9600        | unknown serial option 'speed'",
        "serial:/dev/ttyS0?baud=9600&baud=1  | 'baud' given twice",
        "serial:/dev/ttyS0?baud              | 'baud' is not NAME=VALUE",
        "TCPIP0::10.0.0.5::hislip0,x::INSTR  | port 'x'",
        "hislip://                           | missing host after 'hislip://'",
        "hislip://h:70000                    | port '70000'",
        "TCPIP0::10.0.0.5::5025              | TCPIP::10.0.0.5::5025::SOCKET",
        "TCPIP0::::INSTR                     | missing host",
        "TCPIP0::h::inst0::x::INSTR          | TCPIP[board]::HOST[::DEVICE]::INSTR",
        "usbtmc:                             | missing device node",
        "USB::0x1234::0x5678::INSTR          | USB[board]::VID::PID::SERIAL[::INTERFACE]::INSTR",
        "USB::0x12345::0x5678::SN::INSTR     | vendor id '0x12345'",
        "USB::0x1234::xyz::SN::INSTR         | product id 'xyz'",
        "USB::0x1234::0x5678::::INSTR        | missing serial number",
        "USB::0x1234::0x5678::SN::256::INSTR | interface number '256'",
        "USB0::0x1234::0x5678::SN::RAW       | USB RAW resources are not supported",
        "USBx::0x1234::0x5678::SN::INSTR     | 'USBx'",
        "vxi11://                            | missing host after 'vxi11://'",
        "vxi11://meter:0                     | port '0'",
        "vxi11://meter/                      | empty device name",
        "vxi11://meter/inst 0                | device name 'inst 0'",
        "vxi11://::1/inst0                   | brackets, e.g. vxi11://[::1]/inst0",
        "TCPIP0::10.0.0.5::SOCKET            | 3 fields given",
        "TCPIPx::10.0.0.5::5025::SOCKET      | 'TCPIPx'",
        "ASRL1::INSTR                        | VISA board number",
        "ASRL::INSTR                         | missing device",
        "ASRL/dev/ttyS0::RAW                 | unexpected '::RAW'",
        "udp://meter                         | unknown scheme 'udp'",
        "meter.lab                           | has no scheme",
    })
    void badAddressNamesTheWrongPart(String text, String expected) {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Address.parse(text));
        assertTrue(e.getMessage().contains(expected), e.getMessage());
        assertTrue(!e.getMessage().contains("\n"), "one line");
    }
}
