package org.zweep.driver.address;

import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.address.SerialParameters.FlowControl;
import org.zweep.driver.address.SerialParameters.Parity;

/** The address grammar of {@link Address}; every error names the offending part. */
final class AddressParser {
    private static final String FORMS = "tcp://HOST[:PORT], serial:DEVICE[?baud=N&...], sim:[BENCH], "
            + "TCPIP::HOST::PORT::SOCKET or ASRL<device>::INSTR";

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
                        + "e.g. tcp://[::1]:5025");
            }
            host = colon >= 0 ? authority.substring(0, colon) : authority;
            portText = colon >= 0 ? authority.substring(colon + 1) : null;
        }
        if (host.isEmpty()) {
            throw new InvalidInputException("address '" + text + "': missing host");
        }
        int port = portText == null ? TcpAddress.DEFAULT_PORT : port(text, portText);
        return new TcpAddress(text, host, port);
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

    /** {@code TCPIP[board]::HOST::PORT::SOCKET} (VPP-4.3); the VXI-11 and HiSLIP forms are refused by name. */
    private static TcpAddress visaTcpip(String text) {
        String[] parts = text.split("::", -1);
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
        throw new InvalidInputException("address '" + text + "': VXI-11 and HiSLIP (TCPIP...::INSTR) are not "
                + "supported; use the raw socket, TCPIP::HOST::5025::SOCKET or tcp://HOST");
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
