package org.zweep.runner.cli;

import picocli.CommandLine.Parameters;

/**
 * {@code ADDRESS}, the first parameter of the commands that talk to one meter ({@code scpi},
 * {@code ping}, {@code probe}, {@code measure}); {@link #FORMS} is also {@code run --meter}'s help.
 */
final class MeterAddress {
    /** The address forms, for the help. */
    static final String FORMS = "tcp://HOST[:PORT], serial:DEVICE[?baud=N&...], vxi11://HOST, hislip://HOST,"
            + " usbtmc:DEVICE, sim:[BENCH_FILE][?timing=real|none][&seed=N], sim:tcp://HOST:PORT, or a VISA"
            + " resource string (TCPIP::HOST::PORT::SOCKET, ASRL<device>::INSTR, ...)";

    @Parameters(index = "0", paramLabel = "ADDRESS", description = "the meter: " + FORMS)
    String address;

    /** The address as given. */
    String get() {
        return address;
    }
}
