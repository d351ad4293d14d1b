package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.ImpedanceRange;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.TerminalConfiguration;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.plan.FixturePlan;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedStep;

/** What the meter, fixture and step sections turn into, defaults included. */
class SequenceSectionsTest {
    @TempDir
    Path dir;

    private Plan load(String meterAndFixture, String step) {
        SequenceTestFiles.bench(dir);
        String text = "format: zweep-sequence/1\n" + meterAndFixture
                + "safety: {max_level_voltage: 1 V}\n"
                + "part: {kind: capacitor, nominal: 1 nF}\n"
                + "steps: [" + step + "]\n";
        return SequenceLoader.parse(text, dir.resolve("s.yaml"));
    }

    @Test
    void benchBecomesASimAddressResolvedAgainstTheSequenceFolder() {
        Plan plan = load("meter: {bench: b.bench.yaml}\n", "{name: s, frequency: 1 kHz, level: 1 V}");
        assertEquals("sim:" + dir.resolve("b.bench.yaml").toAbsolutePath().normalize(), plan.meter().address());
        assertEquals("standard", plan.meter().dialect());
    }

    @Test
    void simAddressIsResolvedTooAndOtherAddressesPassUnchanged() {
        assertEquals("sim:" + dir.resolve("b.bench.yaml").toAbsolutePath().normalize(),
                load("meter: {address: 'sim:b.bench.yaml'}\n", "{name: s, frequency: 1 kHz, level: 1 V}")
                        .meter().address());
        Plan tcp = load("meter: {address: 'tcp://127.0.0.1:5025', dialect: mz300}\n",
                "{name: s, frequency: 1 kHz, level: 1 V}");
        assertEquals("tcp://127.0.0.1:5025", tcp.meter().address());
        assertEquals("mz300", tcp.meter().dialect());
    }

    @Test
    void dialectFileIsResolvedAgainstTheSequenceFolderAndLoaded() throws Exception {
        Path meters = Files.createDirectories(dir.resolve("meters"));
        try (InputStream in = Dialect.class.getResourceAsStream("/org/zweep/driver/dialect/standard.yaml")) {
            Files.write(meters.resolve("mine.yaml"), in.readAllBytes());
        }
        Plan plan = load("meter: {address: 'tcp://127.0.0.1:5025', dialect: meters/mine.yaml}\n",
                "{name: s, frequency: 1 kHz, level: 1 V}");
        assertEquals(meters.resolve("mine.yaml").toAbsolutePath().normalize().toString(), plan.meter().dialect());
    }

    @Test
    void unknownDialectNameIsRefusedAtItsNode() {
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> load("meter: {bench: b.bench.yaml, dialect: nosuch}\n", "{name: s, frequency: 1 kHz, level: 1 V}"));
        assertEquals(dir.resolve("s.yaml") + ":2:39: unknown dialect 'nosuch': the built-in dialects are standard, mz300;"
                + " give a path to use a dialect file", e.getMessage());
    }

    @Test
    void missingDialectFileIsRefusedAtItsNode() {
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> load("meter: {bench: b.bench.yaml, dialect: x.yaml}\n", "{name: s, frequency: 1 kHz, level: 1 V}"));
        assertEquals(dir.resolve("s.yaml") + ":2:39: dialect file not found: x.yaml (looked for "
                + dir.resolve("x.yaml").toAbsolutePath().normalize() + "); put it there, or give the dialect with --dialect"
                + " NAME|FILE", e.getMessage());
    }

    @Test
    void aDialectGivenByTheUserReplacesAMissingDialectFileWithoutLookingAtIt() throws Exception {
        // a sequence copied away from its dialect file, run with --dialect
        Files.writeString(dir.resolve("s.yaml"), "format: zweep-sequence/1\n"
                + "meter: {address: 'tcp://127.0.0.1:5025', dialect: ./gone.dialect.yaml}\n"
                + "safety: {max_level_voltage: 1 V}\n"
                + "part: {kind: capacitor, nominal: 1 nF}\n"
                + "steps: [{name: s, frequency: 1 kHz, level: 1 V}]\n");
        Plan plan = SequenceLoader.loadForMeter(dir.resolve("s.yaml"), "standard");
        assertEquals(1, plan.steps().size());
        // without it, the missing file is refused at its node, as before
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> SequenceLoader.loadForMeter(dir.resolve("s.yaml"), null));
        assertTrue(e.getMessage().startsWith(dir.resolve("s.yaml") + ":2:51: dialect file not found"), e.getMessage());
    }

    @Test
    void malformedAddressIsRefusedAtItsNode() {
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> load("meter: {address: 'tcp://:x'}\n", "{name: s, frequency: 1 kHz, level: 1 V}"));
        assertEquals(dir.resolve("s.yaml") + ":2:18: address 'tcp://:x': missing host", e.getMessage());
    }

    @Test
    void missingBenchFileIsRefusedAtItsNodeWhenTheSequencesMeterIsUsed() {
        Plan plan = load("meter: {bench: none.bench.yaml}\n", "{name: s, frequency: 1 kHz, level: 1 V}");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> plan.meter().requireUsable());
        assertEquals(dir.resolve("s.yaml") + ":2:16: bench file not found: none.bench.yaml (looked for "
                + dir.resolve("none.bench.yaml").toAbsolutePath().normalize() + "); put it there, or give the meter"
                + " with --meter ADDRESS", e.getMessage());
    }

    @Test
    void sequenceCopiedAwayFromItsBenchStillLoads() {
        // the address is only looked at when the sequence's own meter is used (--meter replaces it)
        Plan plan = load("meter: {address: 'sim:gone/b.bench.yaml'}\n", "{name: s, frequency: 1 kHz, level: 1 V}");
        assertEquals("sim:" + dir.resolve("gone/b.bench.yaml").toAbsolutePath().normalize(), plan.meter().address());
        assertThrows(InvalidInputException.class, () -> plan.meter().requireUsable());
    }

    @Test
    void hostCompensationWithLoadAndReuseAge() {
        Plan plan = load("""
                meter: {bench: b.bench.yaml}
                fixture:
                  terminals: 4
                  compensation: host
                  standards: [open, short, load]
                  load: {r: 100 ohm, x: -2 ohm}
                  reuse: 2h
                  store: comp
                """, "{name: s, frequency: 1 kHz, level: 1 V}");
        FixturePlan f = plan.fixture();
        assertEquals(TerminalConfiguration.FOUR_TERMINAL, f.terminals());
        assertEquals(CompensationMode.HOST, f.compensation());
        assertEquals(List.of(CorrectionStandard.OPEN, CorrectionStandard.SHORT, CorrectionStandard.LOAD), f.standards());
        assertEquals(100.0, f.loadStandard().resistanceOhm(), 0.0);
        assertEquals(-2.0, f.loadStandard().reactanceOhm(), 0.0);
        assertEquals(0.0, f.loadStandardU().uROhm(), 0.0, "no uncertainty stated: exact");
        assertEquals(Duration.ofHours(2), f.reuseYoungerThan());
        assertEquals(dir.resolve("comp").toAbsolutePath().normalize(), f.store());
    }

    @Test
    void fittedValuesAreWholeSweepChecksAndWithinToleranceComparesTheFittedCapacitance() {
        SequenceTestFiles.bench(dir);
        Plan checked = SequenceLoader.parse("format: zweep-sequence/1\nmeter: {bench: b.bench.yaml}\n"
                + "safety: {max_level_voltage: 1 V}\npart: {kind: capacitor, nominal: 100 nF, tolerance: K}\n"
                + "steps: [{name: s, frequency: [1 kHz, 10 kHz, 100 kHz, 1 MHz], level: 1 V}]\n" + """
                checks:
                  - {name: c, step: s, parameter: c_f, within: tolerance}
                  - {name: esl, step: s, parameter: esl_h, max: 2 nH}
                """, dir.resolve("s.yaml"));
        CheckLimit c = checked.checks().get(0);
        assertTrue(c.wholeSweep());
        assertEquals(90e-9, c.min(), 1e-20);
        assertEquals(110e-9, c.max(), 1e-20);
        assertEquals(2e-9, checked.checks().get(1).max(), 1e-20);
    }

    @Test
    void theLoadStandardsStatedUncertaintyIsReadAsStandardOrExpandedWithItsK() {
        FixturePlan f = load("""
                meter: {bench: b.bench.yaml}
                fixture:
                  terminals: 4
                  compensation: host
                  standards: [open, short, load]
                  load: {r: 100 ohm, u_r: 20 mohm, u_x: 40 mohm, k: 2}
                """, "{name: s, frequency: 1 kHz, level: 1 V}").fixture();
        assertEquals(100.0, f.loadStandardU().value().resistanceOhm(), 0.0);
        assertEquals(0.010, f.loadStandardU().uROhm(), 1e-15);
        assertEquals(0.020, f.loadStandardU().uXOhm(), 1e-15);
    }

    @Test
    void meterCompensationDefaultsToOpenAndShortAndNoFixtureMeansNone() {
        FixturePlan f = load("meter: {bench: b.bench.yaml}\nfixture: {terminals: 2, compensation: meter}\n",
                "{name: s, frequency: 1 kHz, level: 1 V}").fixture();
        assertEquals(List.of(CorrectionStandard.OPEN, CorrectionStandard.SHORT), f.standards());
        assertEquals(Duration.ZERO, f.reuseYoungerThan());
        FixturePlan none = load("meter: {bench: b.bench.yaml}\n", "{name: s, frequency: 1 kHz, level: 1 V}").fixture();
        assertEquals(CompensationMode.NONE, none.compensation());
        assertEquals(List.of(), none.standards());
        assertNull(none.loadStandard());
    }

    @Test
    void stepDefaultsAndExplicitSettings() {
        Plan plan = load("meter: {bench: b.bench.yaml}\n", """
                {name: s, frequency: 1 kHz, level: 1 V},
                {name: t, prompt: Insert the SHORT., frequency: 1 kHz, level: 1 V, averaging: 8, integration: 100 ms,
                 delay: 250 ms, range: 10 kohm, repeats: 3}""");
        PlannedStep s = plan.steps().get(0);
        assertEquals("", s.prompt());
        assertEquals(1, s.points().get(0).setting().averagingCount());
        assertEquals(0.02, s.points().get(0).setting().integrationTimeS(), 0.0);
        assertEquals(ImpedanceRange.AUTO, s.points().get(0).setting().range());
        assertEquals(0.0, s.points().get(0).delayS(), 0.0);
        PlannedStep t = plan.steps().get(1);
        assertEquals("Insert the SHORT.", t.prompt());
        assertEquals(3, t.points().size());
        assertEquals(List.of(0, 1, 2), t.points().stream().map(p -> p.repeat()).toList());
        assertEquals(8, t.points().get(0).setting().averagingCount());
        assertEquals(0.1, t.points().get(0).setting().integrationTimeS(), 0.0);
        assertEquals(0.25, t.points().get(0).delayS(), 0.0);
        assertEquals(ImpedanceRange.hold(10e3), t.points().get(0).setting().range());
    }
}
