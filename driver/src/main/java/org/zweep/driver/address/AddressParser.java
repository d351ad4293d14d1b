package org.zweep.driver.address;

import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.address.SerialParameters.FlowControl;
import org.zweep.driver.address.SerialParameters.Parity;

/** The address grammar of {@link Address}; every error names the offending part. */
final class AddressParser {
    private static final String FORMS = "tcp://HOST[:PORT], vxi11://HOST[:PORT][/DEVICE], hislip://HOST[:PORT][/SUBADDRESS], "
            + "serial:DEVICE[?baud=N&...], "
            + "usbtmc:/dev/usbtmcN, sim:[BENCH], TCPIP::HOST::PORT::SOCKET, TCPIP::HOST[::DEVICE]::INSTR, "
            + "TCPIP::HOST::hislip0::INSTR, "
            + "USB::VID::PID::SERIAL::INSTR or ASRL<device>::INSTR";

    private AddressParser() {
    }

    static Address parse(String raw) {
        if (raw == null || raw.isBlank()) {
            throw new InvalidInputException("empty address; expected " + FORMS);
        }
        String text = raw.strip();
        String lower = text.toLowerCase(Locale.ROOT);
        if (lower.startsWith("tcp://")) {
            return tcp(text, text.substring("tcp://".length()));
        }
        if (lower.startsWith("vxi11://")) {
            return vxi11(text, text.substring("vxi11://".length()));
        }
        if (lower.startsWith("hislip://")) {
            return hislip(text, text.substring("hislip://".length()));
        }
        if (lower.startsWith("usbtmc:")) {
            String device = text.substring("usbtmc:".length());
            if (device.isBlank()) {
                throw new InvalidInputException("address '" + text + "': missing device node, e.g. usbtmc:/dev/usbtmc0");
            }
            return new UsbtmcAddress(text, device, null);
        }
        if (lower.startsWith("usb")) {
            return visaUsb(text);
        }
        if (lower.startsWith("serial:")) {
            return serial(text, text.substring("serial:".length()));
        }
        if (lower.equals("sim") || lower.startsWith("sim:")) {
            return new SimAddress(text, lower.equals("sim") ? "" : text.substring("sim:".length()));
        }
        if (lower.startsWith("tcpip")) {
            return visaTcpip(text);
        }
        if (lower.startsWith("asrl")) {
            return visaSerial(text);
        }
        int colon = text.indexOf(':');
        if (colon > 0) {
            throw new InvalidInputException("address '" + text + "': unknown scheme '" + text.substring(0, colon)
                    + "'; expected " + FORMS);
        }
        throw new InvalidInputException("address '" + text + "' has no scheme; expected " + FORMS);
    }

    private static TcpAddress tcp(String text, String authority) {
        if (authority.isEmpty()) {
            throw new InvalidInputException("address '" + text + "': missing host after 'tcp://'");
        }
        int slash = authority.indexOf('/');
        if (slash >= 0) {
            throw new InvalidInputException("address '" + text + "': unexpected path '" + authority.substring(slash)
                    + "' (a raw SCPI socket has none)");
        }
        String[] hostPort = hostAndPort(text, authority, "tcp://[::1]:5025");
        int port = hostPort[1] == null ? TcpAddress.DEFAULT_PORT : port(text, hostPort[1]);
        return new TcpAddress(text, hostPort[0], port);
    }

    /** {@code vxi11://HOST[:PORT][/DEVICE]}: PORT is the portmapper's. */
    private static Vxi11Address vxi11(String text, String rest) {
        int slash = rest.indexOf('/');
        String authority = slash >= 0 ? rest.substring(0, slash) : rest;
        String device = slash >= 0 ? rest.substring(slash + 1) : Vxi11Address.DEFAULT_DEVICE;
        if (authority.isEmpty()) {
            throw new InvalidInputException("address '" + text + "': missing host after 'vxi11://'");
        }
        String[] hostPort = hostAndPort(text, authority, "vxi11://[::1]/inst0");
        int port = hostPort[1] == null ? Vxi11Address.DEFAULT_PORTMAPPER_PORT : port(text, hostPort[1]);
        return new Vxi11Address(text, hostPort[0], port, lanDevice(text, device));
    }

    /** {@code hislip://HOST[:PORT][/SUBADDRESS]}. */
    private static HislipAddress hislip(String text, String rest) {
        int slash = rest.indexOf('/');
        String authority = slash >= 0 ? rest.substring(0, slash) : rest;
        String sub = slash >= 0 ? rest.substring(slash + 1) : HislipAddress.DEFAULT_SUB_ADDRESS;
        if (authority.isEmpty()) {
            throw new InvalidInputException("address '" + text + "': missing host after 'hislip://'");
        }
        String[] hostPort = hostAndPort(text, authority, "hislip://[::1]/hislip0");
        int port = hostPort[1] == null ? HislipAddress.DEFAULT_PORT : port(text, hostPort[1]);
        return new HislipAddress(text, hostPort[0], port, lanDevice(text, sub));
    }

    /** A LAN device name: {@code inst0}, {@code gpib0,5}; no separators, spaces or slashes. */
    private static String lanDevice(String text, String device) {
        if (device.isEmpty()) {
            throw new InvalidInputException("address '" + text + "': empty device name (leave it out for inst0)");
        }
        if (!device.chars().allMatch(c -> c > ' ' && c < 0x7f && c != '/' && c != ':')) {
            throw new InvalidInputException("address '" + text + "': device name '" + device
                    + "' must be printable ASCII without spaces, '/' or ':', e.g. inst0 or gpib0,5");
        }
        return device;
    }

    /** Splits {@code HOST[:PORT]} or {@code [V6HOST][:PORT]}; the port text is null when absent. */
    private static String[] hostAndPort(String text, String authority, String v6Example) {
        String host;
        String portText = null;
        if (authority.startsWith("[")) {
            int close = authority.indexOf(']');
            if (close < 0) {
                throw new InvalidInputException("address '" + text + "': IPv6 host '" + authority + "' lacks its ']'");
            }
            host = authority.substring(1, close);
            String after = authority.substring(close + 1);
            if (!after.isEmpty()) {
                if (!after.startsWith(":")) {
                    throw new InvalidInputException("address '" + text + "': unexpected '" + after + "' after the host");
                }
                portText = after.substring(1);
            }
        } else {
            int colon = authority.lastIndexOf(':');
            if (colon >= 0 && authority.indexOf(':') != colon) {
                throw new InvalidInputException("address '" + text + "': an IPv6 host must be written in brackets, "
                        + "e.g. " + v6Example);
            }
            host = colon >= 0 ? authority.substring(0, colon) : authority;
            portText = colon >= 0 ? authority.substring(colon + 1) : null;
        }
        if (host.isEmpty()) {
            throw new InvalidInputException("address '" + text + "': missing host");
        }
        return new String[] {host, portText};
    }

    private static int port(String text, String portText) {
        int port = -1;
        if (!portText.isEmpty() && portText.length() <= 5 && portText.chars().allMatch(Character::isDigit)) {
            port = Integer.parseInt(portText);
        }
        if (port < 1 || port > 65535) {
            throw new InvalidInputException("address '" + text + "': port '" + portText
                    + "' is not a number from 1 to 65535");
        }
        return port;
    }

    private static SerialAddress serial(String text, String rest) {
        int q = rest.indexOf('?');
        String device = q >= 0 ? rest.substring(0, q) : rest;
        if (device.isBlank()) {
            throw new InvalidInputException("address '" + text + "': missing serial device, e.g. serial:/dev/ttyUSB0");
        }
        return new SerialAddress(text, device, options(text, q >= 0 ? rest.substring(q + 1) : null));
    }

    private static SerialParameters options(String text, String query) {
        SerialParameters p = SerialParameters.DEFAULT;
        if (query == null) {
            return p;
        }
        Map<String, String> seen = new LinkedHashMap<>();
        for (String pair : query.split("&", -1)) {
            int eq = pair.indexOf('=');
            if (eq <= 0) {
                throw new InvalidInputException("address '" + text + "': serial option '" + pair
                        + "' is not NAME=VALUE");
            }
            String name = pair.substring(0, eq).toLowerCase(Locale.ROOT);
            String value = pair.substring(eq + 1).toLowerCase(Locale.ROOT);
            if (seen.put(name, value) != null) {
                throw new InvalidInputException("address '" + text + "': serial option '" + name + "' given twice");
            }
            p = switch (name) {
                case "baud" -> new SerialParameters(number(text, name, value, 1, 20_000_000), p.dataBits(),
                        p.parity(), p.stopBits(), p.flowControl());
                case "data" -> new SerialParameters(p.baudRate(), number(text, name, value, 5, 8), p.parity(),
                        p.stopBits(), p.flowControl());
                case "parity" -> new SerialParameters(p.baudRate(), p.dataBits(), parity(text, value), p.stopBits(),
                        p.flowControl());
                case "stop" -> new SerialParameters(p.baudRate(), p.dataBits(), p.parity(),
                        number(text, name, value, 1, 2), p.flowControl());
                case "flow" -> new SerialParameters(p.baudRate(), p.dataBits(), p.parity(), p.stopBits(),
                        flow(text, value));
                default -> throw new InvalidInputException("address '" + text + "': unknown serial option '" + name
                        + "' (known: baud, data, parity, stop, flow)");
            };
        }
        return p;
    }

    private static int number(String text, String name, String value, int min, int max) {
        if (!value.isEmpty() && value.length() <= 9 && value.chars().allMatch(Character::isDigit)) {
            int n = Integer.parseInt(value);
            if (n >= min && n <= max) {
                return n;
            }
        }
        throw new InvalidInputException("address '" + text + "': serial option " + name + "='" + value
                + "' is not a whole number from " + min + " to " + max);
    }

    private static Parity parity(String text, String value) {
        return switch (value) {
            case "none" -> Parity.NONE;
            case "even" -> Parity.EVEN;
            case "odd" -> Parity.ODD;
            default -> throw new InvalidInputException("address '" + text + "': serial option parity='" + value
                    + "' is not none, even or odd");
        };
    }

    private static FlowControl flow(String text, String value) {
        return switch (value) {
            case "none" -> FlowControl.NONE;
            case "rtscts" -> FlowControl.RTS_CTS;
            case "xonxoff" -> FlowControl.XON_XOFF;
            default -> throw new InvalidInputException("address '" + text + "': serial option flow='" + value
                    + "' is not none, rtscts or xonxoff");
        };
    }

    /**
     * {@code TCPIP[board]::HOST::PORT::SOCKET} and {@code TCPIP[board]::HOST[::DEVICE][::INSTR]}
     * (VPP-4.3); the HiSLIP form ({@code hislip} device names) is refused by name.
     */
    private static Address visaTcpip(String text) {
        // an IPv6 host is bracketed and may itself contain "::"
        String bracketed = null;
        String splittable = text;
        int open = text.indexOf("::[");
        int close = open < 0 ? -1 : text.indexOf(']', open);
        if (close > 0) {
            bracketed = text.substring(open + 3, close);
            splittable = text.substring(0, open + 2) + "v6" + text.substring(close + 1);
        }
        String[] parts = splittable.split("::", -1);
        if (bracketed != null && parts.length > 1) {
            parts[1] = bracketed;
        }
        String board = parts[0].substring("TCPIP".length());
        if (!board.chars().allMatch(Character::isDigit)) {
            throw new InvalidInputException("address '" + text + "': '" + parts[0]
                    + "' is not TCPIP followed by an optional board number");
        }
        String last = parts[parts.length - 1];
        if (last.equalsIgnoreCase("SOCKET")) {
            if (parts.length != 4) {
                throw new InvalidInputException("address '" + text + "': a VISA socket address is "
                        + "TCPIP[board]::HOST::PORT::SOCKET (" + parts.length + " fields given, 4 expected)");
            }
            if (parts[1].isEmpty()) {
                throw new InvalidInputException("address '" + text + "': missing host");
            }
            return new TcpAddress(text, parts[1], port(text, parts[2]));
        }
        int fields = last.equalsIgnoreCase("INSTR") ? parts.length - 1 : parts.length;
        if (fields < 2 || fields > 3) {
            throw new InvalidInputException("address '" + text + "': a VISA LAN instrument is "
                    + "TCPIP[board]::HOST[::DEVICE]::INSTR or TCPIP[board]::HOST::PORT::SOCKET");
        }
        if (parts[1].isEmpty()) {
            throw new InvalidInputException("address '" + text + "': missing host");
        }
        String device = fields == 3 ? parts[2] : Vxi11Address.DEFAULT_DEVICE;
        if (!device.isEmpty() && device.chars().allMatch(Character::isDigit)) {
            throw new InvalidInputException("address '" + text + "': '" + device + "' looks like a port; a raw "
                    + "socket is TCPIP::" + parts[1] + "::" + device + "::SOCKET");
        }
        if (device.toLowerCase(Locale.ROOT).startsWith("hislip")) {
            // hislipN or hislipN,PORT (VPP-4.3)
            int comma = device.indexOf(',');
            String sub = comma >= 0 ? device.substring(0, comma) : device;
            int port = comma >= 0 ? port(text, device.substring(comma + 1)) : HislipAddress.DEFAULT_PORT;
            return new HislipAddress(text, parts[1], port, lanDevice(text, sub));
        }
        return new Vxi11Address(text, parts[1], Vxi11Address.DEFAULT_PORTMAPPER_PORT, lanDevice(text, device));
    }

    /** {@code USB[board]::VID::PID::SERIAL[::INTFC][::INSTR]} (VPP-4.3); ids in hex (0x…) or decimal. */
    private static UsbtmcAddress visaUsb(String text) {
        String[] parts = text.split("::", -1);
        String board = parts[0].substring("USB".length());
        if (!board.chars().allMatch(Character::isDigit)) {
            throw new InvalidInputException("address '" + text + "': '" + parts[0]
                    + "' is not USB followed by an optional board number");
        }
        String last = parts[parts.length - 1];
        if (last.equalsIgnoreCase("RAW")) {
            throw new InvalidInputException("address '" + text + "': USB RAW resources are not supported; "
                    + "a USBTMC instrument is USB::VID::PID::SERIAL::INSTR");
        }
        int fields = last.equalsIgnoreCase("INSTR") ? parts.length - 1 : parts.length;
        if (fields < 4 || fields > 5) {
            throw new InvalidInputException("address '" + text + "': a VISA USB instrument is "
                    + "USB[board]::VID::PID::SERIAL[::INTERFACE]::INSTR, e.g. USB0::0x1234::0x5678::SN0001::INSTR");
        }
        int vendor = usbNumber(text, "vendor id", parts[1], 0xFFFF);
        int product = usbNumber(text, "product id", parts[2], 0xFFFF);
        if (parts[3].isEmpty()) {
            throw new InvalidInputException("address '" + text + "': missing serial number");
        }
        int intf = fields == 5 ? usbNumber(text, "interface number", parts[4], 0xFF) : 0;
        return new UsbtmcAddress(text, null, new UsbtmcAddress.UsbId(vendor, product, parts[3], intf));
    }

    private static int usbNumber(String text, String what, String s, int max) {
        String lower = s.toLowerCase(Locale.ROOT);
        boolean hex = lower.startsWith("0x");
        String digits = hex ? lower.substring(2) : lower;
        int radix = hex ? 16 : 10;
        if (!digits.isEmpty() && digits.length() <= 6 && digits.chars().allMatch(c -> Character.digit(c, radix) >= 0)) {
            int v = Integer.parseInt(digits, radix);
            if (v <= max) {
                return v;
            }
        }
        throw new InvalidInputException("address '" + text + "': " + what + " '" + s + "' is not a number from 0 to 0x"
                + Integer.toHexString(max).toUpperCase(Locale.ROOT) + " (hex with 0x, or decimal)");
    }

    /** {@code ASRL<device>[::INSTR][?options]}; the device is a path or port name, not a VISA board number. */
    private static SerialAddress visaSerial(String text) {
        int q = text.indexOf('?');
        String resource = q >= 0 ? text.substring(0, q) : text;
        String body = resource.substring("ASRL".length());
        int sep = body.indexOf("::");
        String device = sep >= 0 ? body.substring(0, sep) : body;
        if (sep >= 0 && !body.substring(sep + 2).equalsIgnoreCase("INSTR")) {
            throw new InvalidInputException("address '" + text + "': unexpected '" + body.substring(sep)
                    + "' after the device; a VISA serial address is ASRL<device>::INSTR");
        }
        if (device.isEmpty()) {
            throw new InvalidInputException("address '" + text + "': missing device after ASRL, "
                    + "e.g. ASRL/dev/ttyUSB0::INSTR");
        }
        if (device.chars().allMatch(Character::isDigit)) {
            throw new InvalidInputException("address '" + text + "': 'ASRL" + device + "' is a VISA board number, "
                    + "which names no fixed device here; write the device, e.g. ASRL/dev/ttyS0::INSTR or ASRLCOM"
                    + device + "::INSTR");
        }
        return new SerialAddress(text, device, options(text, q >= 0 ? text.substring(q + 1) : null));
    }
}
