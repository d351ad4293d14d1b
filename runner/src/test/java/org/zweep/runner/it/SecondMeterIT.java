package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Path;
import java.util.Locale;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.zweep.runner.testsupport.QuillfenMeter;

/**
 * zweep's "any meter by a file" promise, end to end against a meter that is not the simulator:
 * the Quillfen TQ-7 test meter (a Python program sharing no code with zweep: its own command
 * words, polar replies, one reply line per query, a spot correction, a motorised jig), driven only
 * through its shipped dialect file. Its device is a capacitor of series R 0.1 ohm, L 2 nH and
 * C 10 nF behind a fixture of 30 mohm + 15 nH in series and 3 pF across; both host-side and
 * meter-side open/short compensation must recover the device within 0.5 % on C and 5 % on ESR and
 * ESL (the acceptance figures; uncorrected, the fixture adds 30 % to ESR and 750 % to ESL).
 */
class SecondMeterIT {
    @TempDir
    Path dir;

    @ParameterizedTest(name = "{0}-side open/short compensation")
    @ValueSource(strings = {"host", "meter"})
    void theShippedDialectDrivesTheSecondMeterAndCompensationRecoversItsDevice(String mode) throws Exception {
        try (QuillfenMeter meter = QuillfenMeter.start(mode.equals("host") ? 7 : 11, 1.0)) { // its own noise draw each
            Path seq = QuillfenMeter.folder().resolve("c10n-" + mode + ".yaml");
            Path out = dir.resolve(mode);
            Sims.Result run = Sims.zweep("run", seq.toString(), "--meter", meter.address(), "--out", out.toString());
            assertEquals(0, run.code(), run.out() + run.err());
            assertTrue(run.out().contains("verdict: pass"), run.out());
            // zweep sent the meter nothing outside its dialect: its own error queue is empty
            assertEquals("0,\"none\"", faultQuery(meter.port()));

            Sims.Result analyzed = Sims.zweep("analyze", out.toString(), "--json");
            assertEquals(0, analyzed.code(), analyzed.err());
            JsonNode step = new ObjectMapper().readTree(analyzed.out()).path("steps").path(0);
            JsonNode p = step.path("parameters");
            double c = p.path("c_f").asDouble();
            double esr = p.path("esr_ohm").asDouble();
            double esl = p.path("esl_h").asDouble();
            System.out.printf(Locale.ROOT, "second meter, %s-side compensation: C %.5g F (%+.3f %%), ESR %.5g ohm"
                    + " (%+.2f %%), ESL %.5g H (%+.2f %%)%n", mode, c, rel(c, QuillfenMeter.C_F), esr,
                    rel(esr, QuillfenMeter.R_OHM), esl, rel(esl, QuillfenMeter.L_H));
            assertTrue(Math.abs(rel(c, QuillfenMeter.C_F)) <= 0.5, "C " + c);
            assertTrue(Math.abs(rel(esr, QuillfenMeter.R_OHM)) <= 5, "ESR " + esr);
            assertTrue(Math.abs(rel(esl, QuillfenMeter.L_H)) <= 5, "ESL " + esl);
        }
    }

    @org.junit.jupiter.api.Test
    void probeFindsEveryOperationTheShippedDialectDeclaresWorking() {
        try (QuillfenMeter meter = QuillfenMeter.start(5, 1.0)) {
            Sims.Result r = Sims.zweep("probe", meter.address(), "--dialect", QuillfenMeter.dialect().toString());
            assertEquals(0, r.code(), r.out() + r.err());
            assertTrue(r.out().contains(" 0 failed"), r.out());
            // the jig is driven through the dialect's fixture section, and the standards acquired with it
            assertTrue(r.out().matches("(?s).*fixture open\\s+ok.*correction-open\\s+ok.*"), r.out());
            // and each standard over a list of frequencies in one message (the dialect's list acquisition)
            assertTrue(r.out().matches("(?s).*correction-open-list\\s+ok.*correction-short-list\\s+ok.*"), r.out());
            assertTrue(r.out().matches("(?s).*measure once\\s+ok.*"), r.out());
        }
    }

    @org.junit.jupiter.api.Test
    void probeNamesTheOperationWhoseCommandTheMeterRefuses() throws Exception {
        try (QuillfenMeter meter = QuillfenMeter.start(5, 1.0)) {
            Path wrong = dir.resolve("wrong.dialect.yaml");
            String text = java.nio.file.Files.readString(QuillfenMeter.dialect());
            java.nio.file.Files.writeString(wrong, text.replace("drive-voltage: SWING {level}", "drive-voltage: SWNG {level}"));
            Sims.Result r = Sims.zweep("probe", meter.address(), "--dialect", wrong.toString());
            assertTrue(r.code() != 0, r.out());
            // the meter's own words for it: FAULT? answers 12,"unknown word SWNG"
            assertTrue(r.out().matches("(?s).*drive-voltage\\s+FAILED.*unknown word SWNG.*"), r.out());
        }
    }

    private static String faultQuery(int port) throws java.io.IOException {
        try (java.net.Socket s = new java.net.Socket("127.0.0.1", port)) {
            s.setSoTimeout(5000);
            s.getOutputStream().write("FAULT?\n".getBytes(java.nio.charset.StandardCharsets.US_ASCII));
            return new java.io.BufferedReader(new java.io.InputStreamReader(s.getInputStream(),
                    java.nio.charset.StandardCharsets.US_ASCII)).readLine();
        }
    }

    private static double rel(double value, double truth) {
        return (value - truth) / truth * 100.0;
    }
}
