package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.snakeyaml.engine.v2.api.LoadSettings;
import org.snakeyaml.engine.v2.api.lowlevel.Compose;
import org.zweep.config.ConfigException;
import org.zweep.config.YamlNode;
import org.zweep.driver.impedance.Unit;

class UnitsTest {
    private static YamlNode scalar(String text) {
        return new YamlNode(new Compose(LoadSettings.builder().build()).composeString(text).orElseThrow(), "t.yaml");
    }

    // the percent sign and ± as written on parts lists; common practice, no source
    @ParameterizedTest(name = "{0} = {1} %")
    @CsvSource(delimiter = ';', value = {"±10 %; 10", "10%; 10", "+-0.5 %; 0.5", "± 2 %; 2"})
    void percentagesAcceptThePlusMinusSignAndSpaces(String text, double percent) {
        assertEquals(percent, Units.percent(scalar(text), "a tolerance"), 1e-12);
    }

    @Test
    void percentageWithoutPercentSignIsRefused() {
        ConfigException e = assertThrows(ConfigException.class, () -> Units.percent(scalar("10"), "a tolerance"));
        assertEquals("t.yaml:1:1: expected a tolerance as a percentage between 0 % and 100 % such as ±10 %, got '10'",
                e.getMessage());
    }

    // 1 min = 60 s, 1 h = 3600 s, 1 d = 86 400 s (SI brochure, non-SI units accepted for use with the SI)
    @ParameterizedTest(name = "{0} = {1} s")
    @CsvSource(delimiter = ';', value = {"90 s; 90", "500 ms; 0.5", "30 min; 1800", "2h; 7200", "1.5 h; 5400",
        "1 d; 86400"})
    void durationsInSecondsMinutesHoursAndDays(String text, double seconds) {
        assertEquals(seconds, Units.durationS(scalar(text), "an age"), 1e-9);
    }

    @Test
    void rampRateTakesPrefixesAndTheBiasUnit() {
        // SI Brochure prefix m = 10⁻³, from memory
        assertEquals(0.5, Units.ratePerS(scalar("500 mA/s"), Unit.AMPERE), 1e-15);
        assertEquals(2.0, Units.ratePerS(scalar("2 V/s"), Unit.VOLT), 0.0);
        ConfigException e = assertThrows(ConfigException.class,
                () -> Units.ratePerS(scalar("0 V/s"), Unit.VOLT));
        assertEquals("t.yaml:1:1: expected a ramp rate above zero in V/s, got '0 V/s'", e.getMessage());
    }

    @Test
    void formatUsesAsFewDigitsAsTheValueNeeds() {
        // SI Brochure prefixes; common practice
        assertEquals("30 V", Units.format(30.0, Unit.VOLT));
        assertEquals("1.5 kHz", Units.format(1500.0, Unit.HERTZ));
        assertEquals("100 nF", Units.format(100e-9, Unit.FARAD));
        assertEquals("0.025", Units.format(0.025, Unit.NONE));
    }
}
