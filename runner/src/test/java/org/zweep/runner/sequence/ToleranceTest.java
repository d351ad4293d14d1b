package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.zweep.driver.impedance.ToleranceCode;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.plan.Plan;

class ToleranceTest {
    @TempDir
    Path dir;

    // IEC 60062:2016 tolerance letter code (H ±3 %, N ±30 % from memory)
    @ParameterizedTest(name = "{0} = ±{1} %")
    @CsvSource({"B, 0.1", "C, 0.25", "D, 0.5", "F, 1", "G, 2", "H, 3", "J, 5", "K, 10", "M, 20", "N, 30"})
    void letterMeansItsIec60062Percentage(char letter, double percent) {
        Plan plan = SequenceTestFiles.load(dir, "{max_level_voltage: 1 V}",
                "{kind: resistor, nominal: 1 kohm, tolerance: " + letter + "}",
                "steps: [{name: s, frequency: 1 kHz, level: 0.1 V}]\n");
        assertEquals(percent, plan.part().tolerancePercent(), 0.0);
    }

    @Test
    void asymmetricLetterZIsRefused() {
        // IEC 60062:2016: Z is +80 %/−20 %, not a single ± figure
        assertEquals(true, ToleranceCode.symmetricPercent('Z', true, 100e-9).isEmpty());
    }

    private CheckLimit within(String part, String parameter) {
        Plan plan = SequenceTestFiles.load(dir, "{max_level_voltage: 1 V}", part, """
                steps: [{name: s, frequency: 1 kHz, level: 1 V}]
                checks: [{name: c, step: s, parameter: %s, at: 1 kHz, within: tolerance}]
                """.formatted(parameter));
        return plan.checks().get(0);
    }

    @Test
    void tenKiloohmJBinsFrom9500To10500() {
        CheckLimit c = within("{kind: resistor, nominal: 10 kohm, tolerance: J}", "rs_ohm");
        assertEquals(9500.0, c.min(), 1e-9); // IEC 60062:2016 tolerance letter code (J ±5 %, B ±0.1 %)
        assertEquals(10500.0, c.max(), 1e-9);
    }

    @Test
    void oneKiloohmBBinsFrom999To1001() {
        CheckLimit c = within("{kind: resistor, nominal: 1 kohm, tolerance: B}", "r_ohm");
        assertEquals(999.0, c.min(), 1e-9); // IEC 60062:2016 tolerance letter code (J ±5 %, B ±0.1 %)
        assertEquals(1001.0, c.max(), 1e-9);
    }

    @Test
    void smallCapacitorLetterCIsQuarterPicofarad() {
        CheckLimit c = within("{kind: capacitor, nominal: 4.7 pF, tolerance: C}", "cs_f");
        assertEquals(4.45e-12, c.min(), 1e-24); // IEC 60062:2016: 4.7 pF C (±0.25 pF below 10 pF) is 4.45–4.95 pF
        assertEquals(4.95e-12, c.max(), 1e-24);
    }

    @Test
    void percentageToleranceIsAcceptedWithPlusMinusSign() {
        CheckLimit c = within("{kind: inductor, nominal: 10 µH, tolerance: ±30 %}", "ls_h");
        assertEquals(7e-6, c.min(), 1e-18); // 10 µH − 30 %, arithmetic
        assertEquals(13e-6, c.max(), 1e-18);
    }
}
