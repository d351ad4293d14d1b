package org.zweep.driver.dialect;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.EnumSet;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.Range;

class DialectParserTest {

    /** Each malformed file states the exact one-line error it must give on its first line. */
    static Stream<Path> malformedFiles() {
        return TestResources.files("malformed", ".dialect");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("malformedFiles")
    void malformedDialectIsRejectedWithItsFileLineAndColumn(Path file) throws IOException {
        String text = Files.readString(file, StandardCharsets.UTF_8);
        String first = text.lines().findFirst().orElseThrow();
        assertTrue(first.startsWith("# expect: "), file + " must start with '# expect: <message>'");
        String expected = first.substring("# expect: ".length());

        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> Dialect.parse(file.getFileName().toString(), text));

        assertEquals(expected, e.getMessage());
    }

    @Test
    void standardDialectDeclaresTheSimulatorsCapabilities() {
        Dialect d = Dialect.load("standard");

        MeterCapabilities c = d.capabilities();
        assertEquals("standard", d.name());
        assertEquals(new Range(10, 20e6), c.frequencyHz()); // issue 4: at least 10 Hz to 10 MHz; the simulator goes to 20 MHz
        assertEquals(201, c.maxListPoints());
        assertEquals(EnumSet.allOf(CorrectionStandard.class), c.corrections());
        assertTrue(c.voltageRatio());
        assertTrue(d.appendErrorQuery());
        assertEquals(List.of(ReplyShape.Field.REAL, ReplyShape.Field.IMAG), d.reply().fields());
    }

    @Test
    void timingSectionIsReadAndLeftOutKeysTakeTheDefaults() {
        // standard.dialect declares the built-in simulator's timing (its bench files' defaults)
        assertEquals(new MeterTiming(0.002, 2, 0.05, 0, 10), Dialect.load("standard").timing());
        assertEquals(new MeterTiming(0.05, 1, 0.2, 0.1, 5), Dialect.load("mz300").timing());
        Dialect partial = Dialect.parse("partial.dialect", """
                zweep-dialect 1
                [meter]
                name = partial
                [capabilities]
                frequency = 10 .. 1e6 Hz
                voltage-level = 0.01 .. 1 V
                integration-time = 0.01 .. 1 s
                [timing]
                bias-settle = 1.5 s
                [commands]
                identify = *IDN?
                reset = *RST
                measure = :READ?
                bias-off = :SOUR:VOLT:OFFS:STAT OFF
                frequency = :SOUR:FREQ {frequency}
                drive-voltage = :SOUR:VOLT {level}
                integration-time = :SENS:IMP:APER {seconds}
                """);
        assertEquals(new MeterTiming(MeterTiming.DEFAULT.pointOverheadS(), MeterTiming.DEFAULT.minPeriods(), 1.5,
                MeterTiming.DEFAULT.rangeChangeS(), MeterTiming.DEFAULT.correctionPointsPerDecade()), partial.timing());
    }

    @Test
    void workedExampleDialectDeclaresPolarRepliesAndNoCurrentSource() {
        Dialect d = Dialect.load("mz300");

        MeterCapabilities c = d.capabilities();
        assertEquals(new Range(0, 0), c.currentLevelArms());
        assertEquals(new Range(0, 0), c.biasCurrentA());
        assertEquals(32, c.maxListPoints());
        assertEquals(EnumSet.of(CorrectionStandard.OPEN, CorrectionStandard.SHORT), c.corrections());
        assertEquals(List.of(ReplyShape.Field.MAGNITUDE, ReplyShape.Field.PHASE_DEG, ReplyShape.Field.SKIP),
                d.reply().fields());
        assertEquals("OSC.F {frequency:kHz}", d.command(Command.FREQUENCY).orElseThrow().text());
    }

    @Test
    void dialectGivenByPathIsLoadedFromThatFile(@TempDir Path dir) throws IOException {
        Path copy = dir.resolve("my-bridge.dialect");
        try (var in = Dialect.class.getResourceAsStream("mz300.dialect")) {
            Files.write(copy, in.readAllBytes());
        }

        Dialect d = Dialect.load(copy.toString());

        assertEquals("mz300", d.name());
        assertEquals(copy.toString(), d.source());
    }

    @Test
    void errorsInAFileGivenByPathNameThatPath(@TempDir Path dir) throws IOException {
        Path bad = dir.resolve("bad.dialect");
        Files.writeString(bad, "zweep-dialect 2\n");

        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Dialect.load(bad.toString()));

        assertEquals(bad + ":1:1: expected 'zweep-dialect 1' as the first line that is not a comment",
                e.getMessage());
    }

    @Test
    void unknownBuiltInNameListsTheBuiltIns() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Dialect.load("standart"));

        assertEquals("unknown dialect 'standart': the built-in dialects are standard, mz300; "
                + "give a path to use a dialect file", e.getMessage());
    }

    @Test
    void missingDialectFileSaysSo(@TempDir Path dir) {
        Path missing = dir.resolve("nowhere.dialect");

        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Dialect.load(missing.toString()));

        assertEquals(missing + ": no such dialect file", e.getMessage());
    }

    @Test
    void hashInsideATemplateIsNotAComment() {
        String text = """
                zweep-dialect 1
                [meter]
                name = hashes
                [capabilities]
                frequency = 10 .. 1e6 Hz
                voltage-level = 0.01 .. 1 V
                integration-time = 0.01 .. 1 s
                [commands]
                identify = *IDN?
                reset = *RST
                measure = :DATA? #H1F  # a non-decimal numeric, then a comment
                bias-off = :BIAS OFF
                frequency = :FREQ {frequency}
                drive-voltage = :VOLT {level}
                integration-time = :APER {seconds}
                """;

        Dialect d = Dialect.parse("hashes.dialect", text);

        assertEquals(":DATA? #H1F", d.command(Command.MEASURE).orElseThrow().text()); // IEEE 488.2 §7.7.4 #H form
    }
}
