package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import picocli.CommandLine;

class DurationConverterTest {
    private final DurationConverter c = new DurationConverter();

    @Test
    void unitsFractionsAndBareSeconds() {
        assertEquals(Duration.ofMillis(500), c.convert("500ms"));
        assertEquals(Duration.ofSeconds(2), c.convert("2s"));
        assertEquals(Duration.ofMillis(1500), c.convert("1.5s"));
        assertEquals(Duration.ofMinutes(2), c.convert("2min"));
        assertEquals(Duration.ofSeconds(2), c.convert("2"));
        assertEquals(Duration.ofMillis(250), c.convert("0.25"));
        assertEquals(Duration.ofMillis(500), c.convert("500 ms"));
        assertEquals(Duration.ZERO, c.convert("0"));
    }

    @ParameterizedTest
    @ValueSource(strings = {"-1s", "-2", "2h", "fast", "", "1e3", "s"})
    void refusesNegativesUnknownUnitsAndText(String text) {
        assertThrows(CommandLine.TypeConversionException.class, () -> c.convert(text));
    }

    @Test
    void writesADurationTheWayItIsTyped() {
        assertEquals("10s", DurationConverter.text(Duration.ofSeconds(10)));
        assertEquals("1min", DurationConverter.text(Duration.ofSeconds(60)));
        assertEquals("90s", DurationConverter.text(Duration.ofSeconds(90)));
        assertEquals("500ms", DurationConverter.text(Duration.ofMillis(500)));
    }
}
