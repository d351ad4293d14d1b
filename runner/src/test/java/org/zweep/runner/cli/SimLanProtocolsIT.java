package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.PipedReader;
import java.io.PipedWriter;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.simulator.scpi.Instrument;

/**
 * {@code zweep sim --vxi11-port 0 --hislip-port 0}: one instrument behind three protocols, each
 * reached by zweep's own clients and by {@code zweep ping}; a setting made over one is read back
 * over the others (the instrument is shared).
 */
class SimLanProtocolsIT {

    @Test
    void oneInstrumentAnswersOverRawTcpVxi11AndHislipAndPingWorksOverEach() throws Exception {
        PipedReader pr = new PipedReader(1 << 16);
        PrintWriter out = new PrintWriter(new PipedWriter(pr), true);
        CompletableFuture<Integer> exit = new CompletableFuture<>();
        Thread sim = new Thread(() -> exit.complete(Cli.run(new String[] {"sim", "--port", "0", "--vxi11-port", "0",
                "--hislip-port", "0", "--ideal", "--timing", "none", "--device", "R1 hi lo 470"}, out,
                new PrintWriter(new StringWriter()))));
        sim.start();
        try {
            BufferedReader lines = new BufferedReader(pr);
            String tcp = address(lines.readLine(), "listening on (tcp://127\\.0\\.0\\.1:\\d+) .*");
            String vxi11 = address(lines.readLine(),
                    "listening on (vxi11://127\\.0\\.0\\.1:\\d+/inst0) \\(portmapper; core channel on port \\d+\\)");
            String hislip = address(lines.readLine(), "listening on (hislip://127\\.0\\.0\\.1:\\d+/hislip0) "
                    + "\\(synchronized mode\\), VISA: TCPIP::127\\.0\\.0\\.1::hislip0,\\d+::INSTR");
            try (ScpiClient a = ScpiClient.open(vxi11, ScpiSettings.DEFAULTS);
                    ScpiClient b = ScpiClient.open(hislip, ScpiSettings.DEFAULTS);
                    ScpiClient c = ScpiClient.open(tcp, ScpiSettings.DEFAULTS)) {
                // *OPC? makes each setting done before another connection looks (writes are not waited for)
                assertEquals("1", a.query(":SOUR:FREQ 2500;*OPC?"));
                assertEquals(2500, b.queryNumber(":SOUR:FREQ?"), 0);
                assertEquals("1", b.query(":SOUR:FREQ 3500;*OPC?"));
                assertEquals(3500, c.queryNumber(":SOUR:FREQ?"), 0);
                assertEquals(470, a.queryNumbers(":READ?")[0], 1e-9); // --ideal: the resistor itself
                assertEquals(Instrument.IDENTIFICATION, b.query("*IDN?"));
            }
            for (String address : new String[] {vxi11, hislip}) {
                StringWriter pingOut = new StringWriter();
                StringWriter pingErr = new StringWriter();
                int code = Cli.run(new String[] {"ping", address, "--count", "20", "--json"}, new PrintWriter(pingOut),
                        new PrintWriter(pingErr));
                assertEquals(ExitCode.OK, code, pingErr.toString());
                JsonNode j = new ObjectMapper().readTree(pingOut.toString());
                assertEquals(20, j.get("count").asInt());
                assertTrue(j.get("median_us").asDouble() > 0, j.toString());
            }
        } finally {
            sim.interrupt();
            assertEquals(ExitCode.OK, exit.get(10, TimeUnit.SECONDS));
        }
    }

    private static String address(String line, String pattern) {
        Matcher m = Pattern.compile(pattern).matcher(line);
        assertTrue(m.matches(), line);
        return m.group(1);
    }
}
