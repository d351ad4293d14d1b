package org.zweep.driver.transport;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PipedInputStream;
import java.io.PipedOutputStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;

/** {@link Transport#ofStreams} over in-memory pipes, as an in-process simulator would connect. */
class StreamTransportIT {

    /** Two pipes: host to meter and meter to host. */
    private static final class Pipes {
        final PipedOutputStream meterOut = new PipedOutputStream();
        final PipedInputStream hostIn;
        final PipedInputStream meterIn = new PipedInputStream();
        final PipedOutputStream hostOut;

        Pipes() throws java.io.IOException {
            hostIn = new PipedInputStream(meterOut);
            hostOut = new PipedOutputStream(meterIn);
        }
    }

    @Test
    void carriesBytesBothWaysTimesOutAndReportsTheEnd() throws Exception {
        Pipes p = new Pipes();
        PipedOutputStream meterOut = p.meterOut;
        PipedInputStream meterIn = p.meterIn;
        try (Transport t = Transport.ofStreams(p.hostIn, p.hostOut, "sim:")) {
            t.write("*IDN?\n".getBytes(StandardCharsets.ISO_8859_1), 0, 6);
            byte[] got = new byte[6];
            assertEquals(6, meterIn.read(got));
            assertEquals("*IDN?\n", new String(got, StandardCharsets.ISO_8859_1));

            byte[] buf = new byte[16];
            assertEquals(0, t.read(buf, 0, buf.length, 30));
            meterOut.write("ok\n".getBytes(StandardCharsets.ISO_8859_1));
            meterOut.flush();
            assertEquals(3, t.read(buf, 0, buf.length, 2000));
            meterOut.close();
            ConnectionLostException e = assertThrows(ConnectionLostException.class,
                    () -> t.read(buf, 0, buf.length, 2000));
            assertTrue(e.getMessage().startsWith("sim:: the peer closed"), e.getMessage());
        }
    }

    @Test
    void scpiClientRunsOverStreams() throws Exception {
        Pipes p = new Pipes();
        PipedOutputStream meterOut = p.meterOut;
        PipedInputStream meterIn = p.meterIn;
        Thread meter = new Thread(() -> {
            try {
                byte[] b = new byte[64];
                int n = meterIn.read(b);
                if (new String(b, 0, n, StandardCharsets.ISO_8859_1).equals("FREQ?\n")) {
                    meterOut.write("1.0E+03\n".getBytes(StandardCharsets.ISO_8859_1));
                    meterOut.flush();
                }
            } catch (java.io.IOException e) {
                throw new java.io.UncheckedIOException(e);
            }
        });
        meter.start();
        try (ScpiClient c = ScpiClient.connect(Transport.ofStreams(p.hostIn, p.hostOut, "sim:"),
                ScpiSettings.builder().clearOnConnect(false).build())) {
            assertEquals(1000.0, c.queryNumber("FREQ?"));
        }
        meter.join(2000);
    }
}
