package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.URISyntaxException;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

/** {@code zweep probe} on the in-process simulator (no sockets; the simulator's timing off). */
class ProbeCommandTest {
    private final StringWriter out = new StringWriter();
    private final StringWriter err = new StringWriter();

    private int probe(String dialect) {
        return Cli.run(new String[] {"probe", "sim:?timing=none", "--dialect", dialect, "--timeout", "1s"},
                new PrintWriter(out), new PrintWriter(err));
    }

    private List<String> rows(String operation) {
        return out.toString().lines().filter(l -> l.startsWith(operation + " ")).toList();
    }

    @Test
    void everyOperationOfTheStandardDialectWorksOnTheSimulatorAndExitsZero() {
        assertEquals(ExitCode.OK, probe("standard"), out + "\n" + err);
        assertFalse(out.toString().contains("FAILED"), out.toString());
        // every declared command of standard.yaml has its row, ok; the five it leaves out are named (list-current and the three list acquisitions among them)
        for (String op : List.of("identify", "reset", "frequency", "drive-voltage", "drive-current", "averaging",
                "integration-time", "range-hold", "bias-voltage-on", "bias-off", "limit-frequency-max",
                "list-measure", "correction-open", "correction-load", "fixture part", "measure once",
                "measure-again")) {
            assertEquals(1, rows(op).size(), op + " in\n" + out);
            assertTrue(rows(op).get(0).contains(" ok "), rows(op).get(0));
        }
        assertTrue(rows("list-current").get(0).contains("not declared"), out.toString());
        // the probe never applies a bias other than 0: the value it sends is 0.0E+00
        assertTrue(rows("bias-voltage").get(0).endsWith("sent ':SOUR:VOLT:OFFS 0.0E+00'"), out.toString());
        assertTrue(out.toString().strip().endsWith("55 ok, 0 failed, 0 skipped, 5 not declared"), out.toString());
    }

    @Test
    void aDialectWithAWrongCommandNamesThatOperationWithTheMetersOwnErrorAndExitsOne() throws URISyntaxException {
        Path wrong = Path.of(ProbeCommandTest.class.getResource("wrong-averaging.yaml").toURI());
        assertEquals(ExitCode.CHECK_FAILED, probe(wrong.toString()), out + "\n" + err);
        // SCPI-1999 Vol 2 §21.8.9: -113 is "Undefined header" (from memory)
        assertEquals(List.of("averaging                  FAILED         the meter reported -113,\"Undefined header;"
                + "SENS:AVER:CNT\""), rows("averaging"));
        assertTrue(rows("frequency").get(0).contains(" ok "), out.toString());
        assertTrue(rows("bias-off").get(0).contains(" ok "), out.toString());
        assertEquals(List.of(), rows("bias-off at the end"), "bias-off at the end is confirmed:\n" + out);
    }
}
