package org.zweep.runner.compensation;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;

class HostCorrectorTest {
    static final Instant T = Instant.parse("2024-05-01T10:00:00Z");

    static CompensationData.Info info(List<String> standards) {
        return new CompensationData.Info(CompensationData.FORMAT, T.toString(), "Fake,BENCH,0,1", "FOUR_TERMINAL",
                standards, null, null, "V", 1.0, 1, 0.02);
    }

    static CompensationData.Entry e(CorrectionStandard s, double f, double r, double x) {
        return new CompensationData.Entry(s, f, r, x, T);
    }

    static Reading reading(double f, double r, double x) {
        return new Reading(MeasurementSetting.at(f), r, x, ReadingStatus.OK, T);
    }

    @Test
    void openShortAtAStoredFrequencyRecoversTheDut() {
        // Zs = 0.05 Ω + 20 nH at the meter, Yo = 1 nS + 5 pF across a 0.5 Ω + 1 µH DUT, f = 1 MHz; readings computed from Zm = Zs + 1/(Yo + 1/Zdut), so the exact
        // open/short correction must give the DUT 0.5 + j6.28318530718 back
        CompensationData d = new CompensationData(info(List.of("OPEN", "SHORT")), List.of(
                e(CorrectionStandard.OPEN, 1e6, 1.0632118354, -31830.8629224),
                e(CorrectionStandard.SHORT, 1e6, 0.05, 0.125663706144)));
        Reading out = new HostCorrector(d, "test", null).correct(reading(1e6, 0.550197489669, 6.41008164433));
        assertEquals(0.5, out.real(), 1e-8);
        assertEquals(6.28318530718, out.imaginary(), 1e-8); // ωL = 2π·1 MHz·1 µH
    }

    @Test
    void openShortLoadRecoversTheDutThroughAnArbitraryFixture() {
        // a non-symmetric fixture, ABCD A = 1.02 + j0.01, B = 0.3 + j2, C = 1e-5 + j3e-5, D = 0.98 − j0.02, maps Z to
        // (A·Z + B)/(C·Z + D) (Pozar, Microwave Engineering, §4.4, from memory); the readings of open, short, a 100 Ω
        // load and the 0.5 Ω + 1 µH DUT at 1 MHz are computed, and OSL must give 0.5 + j6.28318530718 back
        CompensationData d = new CompensationData(info(List.of("OPEN", "SHORT", "LOAD")), List.of(
                e(CorrectionStandard.OPEN, 1e6, 10500, -30500),
                e(CorrectionStandard.SHORT, 1e6, 0.264363030808, 2.04621149042),
                e(CorrectionStandard.LOAD, 1e6, 104.197060198, 4.86376149172)));
        Reading out = new HostCorrector(d, "test", new Impedance(1e6, 100, 0))
                .correct(reading(1e6, 0.587717263528, 8.59911787287));
        assertEquals(0.5, out.real(), 1e-9);
        assertEquals(6.28318530718, out.imaginary(), 1e-9);
    }

    /** Residuals: Zs = 0.05 ohm + 20 nH at the meter, Yo = 1 nS + 5 pF across the DUT. */
    static Complex zs(double f) {
        return new Complex(0.05, 2 * Math.PI * f * 20e-9);
    }

    static Complex yo(double f) {
        return new Complex(1e-9, 2 * Math.PI * f * 5e-12);
    }

    @Test
    void betweenStoredFrequenciesTheStandardsAreInterpolatedNotTheirImpedanceOnly() {
        List<CompensationData.Entry> entries = new ArrayList<>();
        for (double f : new double[] {0.5e6, 1.5e6}) {
            Complex open = zs(f).add(yo(f).reciprocal());
            entries.add(e(CorrectionStandard.OPEN, f, open.getReal(), open.getImaginary()));
            entries.add(e(CorrectionStandard.SHORT, f, zs(f).getReal(), zs(f).getImaginary()));
        }
        CompensationData d = new CompensationData(info(List.of("OPEN", "SHORT")), entries);
        // the 1 MHz DUT reading above: residuals linear in f, so interpolation is exact
        Reading out = new HostCorrector(d, "test", null).correct(reading(1e6, 0.550197489669, 6.41008164433));
        assertEquals(0.5, out.real(), 1e-6);
        assertEquals(6.28318530718, out.imaginary(), 1e-6);
    }

    @Test
    void frequencyOutsideTheStoredSpanIsRefusedNotExtrapolated() {
        CompensationData d = new CompensationData(info(List.of("SHORT")), List.of(
                e(CorrectionStandard.SHORT, 100, 0.05, 0.0), e(CorrectionStandard.SHORT, 1e5, 0.05, 0.01)));
        HostCorrector c = new HostCorrector(d, "comp.csv", null);
        InvalidInputException ex = assertThrows(InvalidInputException.class, () -> c.checkCovers(List.of(1e3, 1e6)));
        assertTrue(ex.getMessage().startsWith("comp.csv: the SHORT data covers 100.0 Hz to 100000.0 Hz but the sweep"
                + " needs 1000000.0 Hz; compensation is never extrapolated"), ex.getMessage());
    }

    @Test
    void dataWrittenAndReadBackIsTheSame(@TempDir Path dir) {
        CompensationData d = new CompensationData(info(List.of("OPEN", "SHORT")), List.of(
                e(CorrectionStandard.OPEN, 1e3, 1e-3, -1.0e7), e(CorrectionStandard.SHORT, 1e3, 0.004, 1.2566e-5)));
        Path f = dir.resolve("c/host.csv");
        d.write(f);
        assertEquals(d, CompensationData.read(f));
    }

    @Test
    void settingsFileKeepsItsFieldNames(@TempDir Path dir) throws Exception {
        new CompensationData(info(List.of("OPEN")), List.of(e(CorrectionStandard.OPEN, 1e3, 1e-3, -1.0e7)))
                .write(dir.resolve("host.csv"));
        JsonNode n = new ObjectMapper().readTree(dir.resolve("host.json").toFile());
        assertEquals("FOUR_TERMINAL", n.get("connection").asText());
        assertEquals("V", n.get("drive").asText());
        assertTrue(n.get("terminals") == null && n.get("drive_mode") == null, n.toString());
    }
}
