package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The limits a meter states itself ({@code MIN}/{@code MAX} queries the dialect declares) refuse a
 * plan before its first point, as the dialect's do.
 */
class MeterStatedLimitsIT {
    static final Path SEQ = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");

    @TempDir
    Path dir;

    @Test
    void sequenceBeyondTheMetersOwnBiasMaximumIsRefusedBeforeTheFirstPoint() throws Exception {
        // the meter's bias source reaches 10 V; the dialect allows 40 V and the sequence goes to 25 V
        Path bench = dir.resolve("ten-volt.bench.yaml");
        String text = Files.readString(Sims.benchOf(SEQ));
        assertTrue(text.contains("bias_voltage_max_v: 40"));
        Files.writeString(bench, text.replace("bias_voltage_max_v: 40", "bias_voltage_max_v: 10"));
        Path out = dir.resolve("out");
        Path trace = dir.resolve("trace.txt");
        Sims.Result r = Sims.zweep("run", SEQ.toString(), "--meter", "sim:" + bench + "?timing=none", "--dialect",
                Sims.dialect(), "--out", out.toString(), "--trace", trace.toString(), "--quiet");
        assertEquals(2, r.code(), r.out() + r.err());
        assertEquals("zweep: step 'bias-derating', point 60: DC bias 12.5 V is outside what the meter can do"
                + " (-10 V to 10 V, as the meter states its limits); nothing was measured", r.err().strip());
        String sent = Files.readString(trace);
        assertTrue(sent.contains(":SOUR:VOLT:OFFS? MAX"), sent);
        assertFalse(sent.contains(":READ?"), "nothing measured");
        assertFalse(Files.exists(out), "no run folder left behind");
    }

    @Test
    void sequenceWithinTheMetersOwnLimitsRuns() throws Exception {
        Path bench = dir.resolve("thirty-volt.bench.yaml");
        Files.writeString(bench, Files.readString(Sims.benchOf(SEQ)).replace("bias_voltage_max_v: 40",
                "bias_voltage_max_v: 30"));
        Sims.Result r = Sims.zweep("run", SEQ.toString(), "--meter", "sim:" + bench + "?timing=none", "--dialect",
                Sims.dialect(), "--out", dir.resolve("out").toString(), "--quiet");
        assertEquals(0, r.code(), r.out() + r.err());
    }
}
