package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.PipedReader;
import java.io.PipedWriter;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.scpi.Instrument;

/**
 * An independent VXI-11 client against {@code zweep sim --vxi11-port 111}: pyvisa with the
 * pyvisa-py backend (Debian {@code python3-pyvisa-py}), which has its own ONC RPC, XDR and
 * portmapper code, identifies the simulator, sets a frequency, triggers over the bus and reads an
 * impedance through {@code TCPIP::127.0.0.1::INSTR}. pyvisa-py always asks the portmapper on port
 * 111, so the test needs that port (CI runs as root); without it the test is skipped, saying why.
 */
class Vxi11PyvisaIT {
    private static final Path PYTHON = Path.of("/usr/bin/python3");
    private static final Path SCRIPT = Path.of("src/test/python/pyvisa_vxi11_client.py");

    @Test
    void pyvisaPyQueriesSetsTriggersAndReadsOverVxi11() throws Exception {
        assumePort111();
        assertTrue(Files.isExecutable(PYTHON) && pyvisaPyInstalled(),
                "pyvisa-py is missing: install the Debian package python3-pyvisa-py (.ci/run does)");
        PipedReader pr = new PipedReader(1 << 16);
        PrintWriter out = new PrintWriter(new PipedWriter(pr), true);
        CompletableFuture<Integer> exit = new CompletableFuture<>();
        StringWriter err = new StringWriter();
        Thread sim = new Thread(() -> {
            exit.complete(Cli.run(new String[] {"sim", "--port", "0", "--vxi11-port", "111", "--ideal", "--timing",
                "none", "--device", "R1 hi a 10; C1 a lo 100n"}, out, new PrintWriter(err, true)));
            out.close();
        });
        sim.start();
        try {
            BufferedReader lines = new BufferedReader(pr);
            String first = lines.readLine();
            if (first == null) { // the simulator ended without listening
                // another build on this machine may have taken port 111 between the check and the start
                assumeTrue(!err.toString().contains("Address already in use"),
                        "skipped: port 111 was taken by another process just now: " + err.toString().strip());
                throw new AssertionError("zweep sim did not start: " + err);
            }
            assertTrue(first.startsWith("listening on tcp://127.0.0.1:"), first);
            String vxi = lines.readLine();
            assertTrue(vxi.startsWith("listening on vxi11://127.0.0.1:111/inst0 (portmapper; core channel on port ")
                    && vxi.endsWith("VISA: TCPIP::127.0.0.1::INSTR"), vxi);
            Process p = new ProcessBuilder(PYTHON.toString(), SCRIPT.toString(), "TCPIP::127.0.0.1::INSTR")
                    .redirectErrorStream(true).start();
            assertTrue(p.waitFor(60, TimeUnit.SECONDS), "pyvisa-py client did not finish in 60 s");
            String output = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
            assertEquals(0, p.exitValue(), output);
            JsonNode r = new ObjectMapper().readTree(output.lines().reduce((a, b) -> b).orElseThrow());
            assertEquals(Instrument.IDENTIFICATION, r.get("idn").asText());
            assertEquals(1000, Double.parseDouble(r.get("frequency").asText()), 0);
            String[] z = r.get("reading").asText().split(",");
            // series R = 10 ohm, C = 100 nF at 1 kHz: X = -1/(2 pi f C) = -1591.549 ohm, common practice, no source
            assertEquals(10, Double.parseDouble(z[0]), 1e-6);
            assertEquals(-1 / (2 * Math.PI * 1000 * 100e-9), Double.parseDouble(z[1]), 1e-6);
            assertEquals("0,\"No error\"", r.get("error").asText()); // SCPI-1999 Vol 2, SYSTem:ERRor: 0 is no error
            assertEquals(0, r.get("stb").asInt(), "status byte with nothing to read and no events");
            assertEquals("1", r.get("after_clear").asText());
        } finally {
            sim.interrupt();
            int code = exit.get(10, TimeUnit.SECONDS);
            if (!err.toString().contains("Address already in use")) {
                assertEquals(ExitCode.OK, code, err.toString());
            }
        }
    }

    private static void assumePort111() {
        try (ServerSocket s = new ServerSocket()) {
            s.setReuseAddress(true);
            s.bind(new InetSocketAddress(InetAddress.getLoopbackAddress(), 111));
        } catch (IOException e) {
            assumeTrue(false, "skipped: pyvisa-py looks the portmapper up on port 111, which cannot be bound here ("
                    + e.getMessage() + "; it needs root or CAP_NET_BIND_SERVICE, and no rpcbind running)");
        }
    }

    private static boolean pyvisaPyInstalled() throws IOException, InterruptedException {
        Process p = new ProcessBuilder(PYTHON.toString(), "-c", "import pyvisa, pyvisa_py").redirectErrorStream(true)
                .start();
        return p.waitFor(30, TimeUnit.SECONDS) && p.exitValue() == 0;
    }
}
