package org.zweep.driver.dialect;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

class TemplateTest {
    private static final Template.ErrorSink FAIL = (i, m) -> new IllegalArgumentException(i + ": " + m);

    @Test
    void valuesAreSentAsNr3WithAnExplicitPointAndExponent() {
        // IEEE 488.2 §8.7.4: NR3 has an explicit radix point and an exponent
        assertEquals("1.0E+03", Nr3.format(1000.0, 0));
        assertEquals("-2.5E-03", Nr3.format(-0.0025, 0));
        assertEquals("0.0E+00", Nr3.format(0.0, 0));
        assertEquals("1.23456789E+06", Nr3.format(1234567.89, 0));
        assertEquals("1.0E+10", Nr3.format(1e10, 0));
    }

    @Test
    void prefixedUnitIsAnExactDecimalShift() {
        Template t = Template.parse("OSC.F {frequency:kHz}", Command.FREQUENCY, FAIL);

        // 1234.5 Hz = 1.2345 kHz exactly; a binary division would give 1.2345000000000002
        assertEquals("OSC.F 1.2345E+00", t.render(Map.of("frequency", 1234.5)));
    }

    @Test
    void milliUnitsScaleUp() {
        Template t = Template.parse("OSC.V {level:mV}", Command.DRIVE_VOLTAGE, FAIL);

        assertEquals("OSC.V 5.0E+02", t.render(Map.of("level", 0.5))); // 0.5 V = 500 mV
    }

    @Test
    void listPlaceholderJoinsValuesWithCommas() {
        Template t = Template.parse(":SOUR:LIST:FREQ {frequencies}", Command.LIST_FREQUENCY, FAIL);
        // IEEE 488.2 §8.7.4 NR3 for each value; commas between list values, from memory

        assertEquals(":SOUR:LIST:FREQ 1.0E+02,1.0E+03,1.0E+04",
                t.render(Map.of("frequencies", List.of(100.0, 1000.0, 10000.0))));
    }

    @Test
    void countIsSentAsAnInteger() {
        Template t = Template.parse(":SENS:AVER:COUN {count}", Command.AVERAGING, FAIL);

        assertEquals(":SENS:AVER:COUN 16", t.render(Map.of("count", 16))); // IEEE 488.2 §8.7.2 NR1
    }
}
