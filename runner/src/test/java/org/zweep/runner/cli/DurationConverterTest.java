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
    void unitsAndFractions() {
        assertEquals(Duration.ofMillis(500), c.convert("500ms"));
        assertEquals(Duration.ofSeconds(2), c.convert("2s"));
        assertEquals(Duration.ofMillis(1500), c.convert("1.5s"));
        assertEquals(Duration.ofMinutes(2), c.convert("2min"));
    }

    @ParameterizedTest
    @ValueSource(strings = {"2", "0s", "-1s", "2h", "fast", ""})
    void refusesBareNumbersZeroAndUnknownUnits(String text) {
        assertThrows(CommandLine.TypeConversionException.class, () -> c.convert(text));
    }
}
