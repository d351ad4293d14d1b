package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.io.OutputStream;
import java.io.PipedReader;
import java.io.PipedWriter;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.scpi.Instrument;

/** {@code zweep sim} in the foreground: ready line, serving, clean stop, bad input. */
class SimCommandIT {

    @Test
    void itPrintsWhereItListensServesScpiAndStopsWhenInterrupted() throws Exception {
        PipedReader pr = new PipedReader(1 << 16);
        PrintWriter out = new PrintWriter(new PipedWriter(pr), true);
        StringWriter err = new StringWriter();
        CompletableFuture<Integer> exit = new CompletableFuture<>();
        Thread t = new Thread(() -> exit.complete(Cli.run(new String[] {"sim", "--port", "0", "--ideal", "--timing",
                "none", "--device", "R1 hi lo 220"}, out, new PrintWriter(err))));
        t.start();
        BufferedReader lines = new BufferedReader(pr);
        String first = lines.readLine();
        Matcher m = Pattern.compile("listening on tcp://127\\.0\\.0\\.1:(\\d+) .*").matcher(first);
        assertTrue(m.matches(), first);
        try (Socket s = new Socket("127.0.0.1", Integer.parseInt(m.group(1)))) {
            OutputStream o = s.getOutputStream();
            o.write("*IDN?;:READ?\n".getBytes(StandardCharsets.US_ASCII));
            BufferedReader r = new BufferedReader(new InputStreamReader(s.getInputStream(), StandardCharsets.US_ASCII));
            String[] reply = r.readLine().split(";");
            assertEquals(Instrument.IDENTIFICATION, reply[0]);
            assertEquals(220, Double.parseDouble(reply[1].split(",")[0]), 1e-6); // --ideal: the resistor itself
        }
        assertTrue(lines.readLine().contains("connection 1 from 127.0.0.1"));
        t.interrupt();
        assertEquals(ExitCode.OK, exit.get(5, TimeUnit.SECONDS));
    }

    @Test
    void aBadNetlistIsAUsageErrorWithItsLocation() {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Cli.run(new String[] {"sim", "--port", "0", "--device", "R1 hi lo"}, new PrintWriter(out), new PrintWriter(err));
        assertEquals(ExitCode.USAGE, code);
        assertTrue(err.toString().startsWith("zweep: --device"), err.toString());
        assertEquals(1, err.toString().strip().lines().count(), err.toString());
    }

    @Test
    void aBadFaultSpecIsAUsageError() {
        StringWriter err = new StringWriter();
        int code = Cli.run(new String[] {"sim", "--port", "0", "--fault", "explode"}, new PrintWriter(new StringWriter()),
                new PrintWriter(err));
        assertEquals(ExitCode.USAGE, code);
        assertTrue(err.toString().contains("explode"), err.toString());
    }
}
