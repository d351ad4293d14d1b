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
import org.zweep.driver.meter.Interval;

class DialectReaderTest {

    /** Each malformed file states the exact one-line error it must give on its first line. */
    static Stream<Path> malformedFiles() {
        return TestResources.files("malformed", ".yaml");
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
        assertEquals(new Interval(10, 20e6), c.frequencyHz()); // issue 4: at least 10 Hz to 10 MHz; the simulator goes to 20 MHz
        assertEquals(201, c.maxListPoints());
        assertEquals(EnumSet.allOf(CorrectionStandard.class), c.corrections());
        assertTrue(c.voltageRatio());
        assertEquals(new Dialect.Messages(true, Dialect.ReplyFraming.SEMICOLON_JOINED, Dialect.ErrorCheck.BOTH, true),
                d.messages());
        assertEquals(java.util.EnumSet.allOf(org.zweep.driver.meter.FixtureState.class), d.fixtureStates());
        assertEquals(List.of(ReplyShape.Field.REAL, ReplyShape.Field.IMAG), d.reply().fields());
    }

    @Test
    void timingSectionIsReadAndLeftOutKeysTakeTheDefaults() {
        // standard.yaml declares the built-in simulator's timing (its bench files' defaults)
        assertEquals(new MeterTiming(0.002, 2, 0.05, 0, 10), Dialect.load("standard").timing());
        assertEquals(new MeterTiming(0.05, 1, 0.2, 0.1, 5), Dialect.load("mz300").timing());
        Dialect partial = Dialect.parse("partial.yaml", """
                format: zweep-dialect/2
                meter:
                  name: partial
                capabilities:
                  frequency: 10 .. 1e6 Hz
                  voltage-level: 0.01 .. 1 V
                  integration-time: 0.01 .. 1 s
                messages:
                  error-query-after: none
                timing:
                  bias-settle: 1.5 s
                commands:
                  identify: '*IDN?'
                  measure: ':READ?'
                  frequency: ':SOUR:FREQ {frequency}'
                  drive-voltage: ':SOUR:VOLT {level}'
                  integration-time: ':SENS:IMP:APER {seconds}'
                """);
        assertEquals(new MeterTiming(MeterTiming.DEFAULT.pointOverheadS(), MeterTiming.DEFAULT.minPeriods(), 1.5,
                MeterTiming.DEFAULT.rangeChangeS(), MeterTiming.DEFAULT.correctionPointsPerDecade()), partial.timing());
    }

    @Test
    void workedExampleDialectDeclaresPolarRepliesAndNoCurrentSource() {
        Dialect d = Dialect.load("mz300");

        MeterCapabilities c = d.capabilities();
        assertEquals(new Interval(0, 0), c.currentLevelArms());
        assertEquals(new Interval(0, 0), c.biasCurrentA());
        assertEquals(32, c.maxListPoints());
        assertEquals(EnumSet.of(CorrectionStandard.OPEN, CorrectionStandard.SHORT), c.corrections());
        assertEquals(List.of(ReplyShape.Field.MAGNITUDE, ReplyShape.Field.PHASE_DEG, ReplyShape.Field.SKIP),
                d.reply().fields());
        assertEquals("OSC.F {frequency:kHz}", d.command(Command.FREQUENCY).orElseThrow().text());
    }

    @Test
    void dialectGivenByPathIsLoadedFromThatFile(@TempDir Path dir) throws IOException {
        Path copy = dir.resolve("my-bridge.yaml");
        try (var in = Dialect.class.getResourceAsStream("mz300.yaml")) {
            Files.write(copy, in.readAllBytes());
        }

        Dialect d = Dialect.load(copy.toString());

        assertEquals("mz300", d.name());
        assertEquals(copy.toString(), d.source());
    }

    @Test
    void errorsInAFileGivenByPathNameThatPath(@TempDir Path dir) throws IOException {
        Path bad = dir.resolve("bad.yaml");
        Files.writeString(bad, "format: zweep-dialect/1\n");

        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Dialect.load(bad.toString()));

        assertEquals(bad + ":1:1: missing key 'meter' in the dialect", e.getMessage());
    }

    @Test
    void unknownBuiltInNameListsTheBuiltIns() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Dialect.load("standart"));

        assertEquals("unknown dialect 'standart': the built-in dialects are standard, mz300; "
                + "give a path to use a dialect file", e.getMessage());
    }

    @Test
    void missingDialectFileSaysSo(@TempDir Path dir) {
        Path missing = dir.resolve("nowhere.yaml");

        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Dialect.load(missing.toString()));

        assertEquals(missing + ": cannot read: no such file", e.getMessage());
    }

    @Test
    void hashInsideAQuotedTemplateIsNotAComment() {
        String text = """
                format: zweep-dialect/2
                meter: {name: hashes}
                capabilities:
                  frequency: 10 .. 1e6 Hz
                  voltage-level: 0.01 .. 1 V
                messages: {error-query-after: none}
                commands:
                  identify: '*IDN?'
                  measure: ':DATA? #H1F'  # a non-decimal numeric, then a comment
                  frequency: ':FREQ {frequency}'
                  drive-voltage: ':VOLT {level}'
                """;

        Dialect d = Dialect.parse("hashes.yaml", text);

        assertEquals(":DATA? #H1F", d.command(Command.MEASURE).orElseThrow().text()); // IEEE 488.2 §7.7.4 #H form
    }

    @Test
    void aMeterWithoutIntegrationTimeRefusesAPlanThatAsksForOneAndAcceptsOneThatDoesNot() {
        Dialect d = Dialect.parse("tiny.yaml", """
                format: zweep-dialect/2
                meter: {name: tiny}
                capabilities:
                  frequency: 10 .. 1e6 Hz
                  voltage-level: 0.01 .. 1 V
                messages: {error-query-after: none}
                commands:
                  identify: WHO?
                  measure: TAKE?
                  frequency: TONE {frequency}
                  drive-voltage: SWING {level}
                """);
        org.zweep.driver.meter.MeasurementSetting s = org.zweep.driver.meter.MeasurementSetting.at(1e3);

        assertEquals(java.util.Optional.empty(), d.refusal(s));
        assertEquals("integration time 100 ms: the meter (dialect tiny) has no integration-time setting (leave"
                + " 'integration' out of the step to use the meter's own)",
                d.refusal(s.withIntegrationTimeS(0.1)).orElseThrow().message());
        assertEquals("frequency 6 MHz is above the maximum 1 MHz of the meter (dialect tiny)",
                d.refusal(s.withFrequencyHz(6e6)).orElseThrow().message());
        assertEquals("averaging count 4 is above the maximum 1 of the meter (dialect tiny)",
                d.refusal(s.withAveragingCount(4)).orElseThrow().message());
    }

    @Test
    void aPolarOneLinePerQueryMeterWithAJigAndSpotCorrectionCanBeDescribed() {
        Dialect d = Dialect.parse("jig.yaml", """
                format: zweep-dialect/2
                meter: {name: jig}
                capabilities:
                  frequency: 20 .. 100e6 Hz
                  voltage-level: 0.01 .. 1 V
                  bias-voltage: 0 .. 10 V
                messages:
                  join: yes
                  replies: one-line-per-query
                  error-query-after: both
                  error-query-joined: yes
                reply:
                  fields: [magnitude, phase-deg]
                correction:
                  standards: [open, short]
                  style: at-acquired-frequency
                commands:
                  identify: WHO?
                  reset: CLEAR
                  error-query: FAULT?
                  measure: TAKE?
                  frequency: TONE {frequency}
                  drive-voltage: SWING {level}
                  bias-voltage: LIFT {bias}
                  bias-voltage-on: LIFT ON
                  bias-voltage-off: LIFT OFF
                  bias-off: LIFT OFF
                  correction-open: NULL OPEN
                  correction-short: NULL SHORT
                  correction-on: NULL ON
                  correction-off: NULL OFF
                fixture:
                  part: JIG PART
                  open: JIG OPEN
                  short: JIG SHORT
                """);

        assertEquals(org.zweep.driver.meter.CorrectionStyle.AT_ACQUIRED_FREQUENCY, d.capabilities().correctionStyle());
        assertEquals(Dialect.ReplyFraming.ONE_LINE_PER_QUERY, d.messages().replies());
        assertEquals(java.util.EnumSet.of(org.zweep.driver.meter.FixtureState.PART,
                org.zweep.driver.meter.FixtureState.OPEN, org.zweep.driver.meter.FixtureState.SHORT), d.fixtureStates());
        assertTrue(!d.hasIntegrationTime());
    }
}
