package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class ToleranceCodeTest {
    @Test
    void bandLimitsMatchThePublishedBinningValues() {
        // IEC 60062:2016 tolerance letter code: J ±5 %, Z +80/−20 %, B ±0.1 %; C ±0.25 pF below 10 pF
        assertEquals(9500, ToleranceCode.of('J').orElseThrow().min(10e3, "Ω"), 1e-9);
        assertEquals(10500, ToleranceCode.of('J').orElseThrow().max(10e3, "Ω"), 1e-9);
        assertEquals(80e-9, ToleranceCode.of('Z').orElseThrow().min(100e-9, "F"), 1e-20);
        assertEquals(180e-9, ToleranceCode.of('Z').orElseThrow().max(100e-9, "F"), 1e-20);
        assertEquals(4.45e-12, ToleranceCode.of('C').orElseThrow().min(4.7e-12, "F"), 1e-24);
        assertEquals(4.95e-12, ToleranceCode.of('C').orElseThrow().max(4.7e-12, "F"), 1e-24);
        assertEquals(999, ToleranceCode.of('B').orElseThrow().min(1000, "Ω"), 1e-9);
        assertEquals(1001, ToleranceCode.of('B').orElseThrow().max(1000, "Ω"), 1e-9);
    }

    @Test
    void measuredValueFallsInTheTightestLetterThatHoldsIt() {
        // IEC 60062:2016 tolerance letter code (H ±3 %, N ±30 %, Q +30/−10 % from memory; the rest as printed on
        // parts): +3.5 % is outside H (±3 %) and inside J (±5 %)
        assertEquals('J', ToleranceCode.classOf(103.5, 100, "Ω").orElseThrow().letter());
        assertEquals('F', ToleranceCode.classOf(99.2, 100, "Ω").orElseThrow().letter()); // −0.8 %: F ±1 %
        assertEquals('M', ToleranceCode.classOf(85, 100, "Ω").orElseThrow().letter()); // −15 %: M ±20 %
        assertEquals('Q', ToleranceCode.classOf(125, 100, "Ω").orElseThrow().letter()); // +25 %: Q +30/−10 % is narrower than N ±30 %
        assertEquals('Z', ToleranceCode.classOf(170, 100, "Ω").orElseThrow().letter()); // +70 %: only Z +80/−20 %
        assertTrue(ToleranceCode.classOf(50, 100, "Ω").isEmpty()); // −50 %: no letter
        // IEC 60062:2016: below 10 pF A/B/C/D/F/G are absolute pF bands: 4.77 pF on 4.7 pF is outside A ±0.05 pF, within B ±0.1 pF
        assertEquals('B', ToleranceCode.classOf(4.77e-12, 4.7e-12, "F").orElseThrow().letter());
        // 4.9 pF: outside B and H (±3 % = ±0.141 pF); J ±5 % (±0.235 pF) is narrower than C ±0.25 pF
        assertEquals('J', ToleranceCode.classOf(4.9e-12, 4.7e-12, "F").orElseThrow().letter());
    }

    @Test
    void aPartCarriesOnlySymmetricLettersAndSmallCapacitorsConvertTheirPicofaradBands() {
        // IEC 60062:2016 tolerance letter code: H ±3 % (from memory), K ±10 %, Z +80/−20 % (not one ± figure),
        // C ±0.25 pF below 10 pF; A means ±0.05 pF only on such small capacitors
        assertEquals(3.0, ToleranceCode.symmetricPercent('H', false, 1e3).getAsDouble(), 0.0);
        assertEquals(10.0, ToleranceCode.symmetricPercent('k', true, 100e-9).getAsDouble(), 0.0);
        assertTrue(ToleranceCode.symmetricPercent('Z', true, 100e-9).isEmpty());
        assertTrue(ToleranceCode.symmetricPercent('A', false, 1e3).isEmpty());
        assertEquals(0.25 / 4.7 * 100, ToleranceCode.symmetricPercent('C', true, 4.7e-12).getAsDouble(), 1e-12);
        assertEquals(1.0, ToleranceCode.symmetricPercent('A', true, 5e-12).getAsDouble(), 1e-12);
        assertEquals("E L P W B C D F G H J K M N", ToleranceCode.symmetricLetters());
    }
}
