package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.plan.Wiring;

/** Every sequence shipped in {@code sequences/} loads, runs on its simulator bench and says what it promises. */
class ShippedSequencesTest {
    static final Path SEQUENCES = Path.of("..", "sequences");

    static Stream<Path> sequenceFiles() throws IOException {
        assertTrue(Files.isDirectory(SEQUENCES), "sequences/ not found from " + Path.of("").toAbsolutePath());
        try (Stream<Path> files = Files.walk(SEQUENCES)) {
            // bench files under benches/ belong to the simulator and have their own reader; quillfen/
            // holds the files for the tests' second meter, which SecondMeterIT runs against that meter
            List<Path> list = files.filter(Files::isRegularFile)
                    .filter(p -> !SEQUENCES.relativize(p).startsWith("benches"))
                    .filter(p -> !SEQUENCES.relativize(p).startsWith("quillfen"))
                    .sorted().toList();
            assertFalse(list.isEmpty());
            return list.stream();
        }
    }

    @ParameterizedTest
    @MethodSource("sequenceFiles")
    void everyShippedSequenceLoadsAndRunsOnItsBenchInTensOfSecondsToMinutes(Path file) {
        Plan plan = SequenceLoader.load(file);
        assertTrue(plan.meter().address().startsWith("sim:"), "runs unattended on the simulator");
        assertTrue(Files.isRegularFile(Path.of(plan.meter().address().substring(4))));
        double s = org.zweep.runner.engine.RunEstimate.of(plan).totalS();
        assertTrue(s >= 10 && s <= 300, file + " takes about " + s + " s"); // issue 5: tens of seconds to a few minutes
        assertEquals(file.getFileName().toString().replace(".yaml", ""), plan.name());
    }

    @Test
    void threeSequencesAreShipped() throws IOException {
        assertEquals(List.of("characterise-kp-l1210-100.yaml", "incoming-kp-c0805-104.yaml",
                "transformer-kp-t2010.yaml"), sequenceFiles().map(p -> p.getFileName().toString()).toList());
    }

    @Test
    void capacitorInspectionChecksToleranceLossAndSelfResonance() {
        Plan plan = SequenceLoader.load(SEQUENCES.resolve("incoming-kp-c0805-104.yaml"));
        assertEquals(10.0, plan.part().tolerancePercent(), 0.0); // IEC 60062:2016 letter code: K = ±10 %
        CheckLimit cs = plan.checks().get(0);
        assertEquals("cs_f", cs.parameter());
        assertEquals(1000.0, cs.frequencyHz(), 0.0);
        assertEquals(90e-9, cs.min(), 1e-21); // 100 nF − 10 %
        assertEquals(110e-9, cs.max(), 1e-21); // 100 nF + 10 %
        CheckLimit d = plan.checks().get(1);
        assertEquals(Double.NEGATIVE_INFINITY, d.min());
        assertEquals(0.025, d.max(), 0.0);
        CheckLimit srf = plan.checks().get(2);
        assertTrue(Double.isNaN(srf.frequencyHz()));
        assertEquals(10e6, srf.min(), 0.0);
        assertEquals(CompensationMode.HOST, plan.fixture().compensation());
        List<PlannedPoint> derating = plan.steps().get(1).points();
        assertEquals(0.0, derating.get(0).setting().bias().value(), 0.0);
        assertEquals(25.0, derating.get(derating.size() - 1).setting().bias().value(), 0.0);
        assertTrue(plan.safety().maxBiasVoltageV() <= 25.0); // half of the 50 V rating
    }

    @Test
    void inductorSweepsBiasCurrentUpToFourAmperes() {
        Plan plan = SequenceLoader.load(SEQUENCES.resolve("characterise-kp-l1210-100.yaml"));
        List<PlannedPoint> sweep = plan.steps().get(1).points();
        assertTrue(sweep.stream().allMatch(p -> p.setting().frequencyHz() == 100e3));
        assertEquals(4.0, sweep.get(sweep.size() - 1).setting().bias().value(), 0.0);
        assertEquals(org.zweep.driver.meter.SourceMode.CURRENT, sweep.get(0).setting().bias().mode());
    }

    @Test
    void transformerMeasuresOpenShortedAndRatio() {
        Plan plan = SequenceLoader.load(SEQUENCES.resolve("transformer-kp-t2010.yaml"));
        assertEquals(4.0, plan.part().turnsRatio(), 0.0);
        assertEquals(Wiring.SECONDARY_OPEN, plan.steps().get(0).points().get(0).wiring());
        assertEquals(Wiring.SECONDARY_SHORTED, plan.steps().get(1).points().get(0).wiring());
        assertEquals(MeasuredQuantity.VOLTAGE_RATIO, plan.steps().get(2).points().get(0).setting().quantity());
        CheckLimit ratio = plan.checks().get(2);
        assertEquals(0.245, ratio.min(), 1e-15); // N2/N1 = 1/4, −2 %
        assertEquals(0.255, ratio.max(), 1e-15); // +2 %
    }

    @Test
    void readmeCompleteExampleLoadsAndMatchesTheShippedCapacitorSequence() throws IOException {
        String readme = Files.readString(Path.of("..", "README.md"));
        int section = readme.indexOf("#### A complete example");
        int start = readme.indexOf("```yaml\n", section) + "```yaml\n".length();
        String example = readme.substring(start, readme.indexOf("```", start));
        // parsed as if it sat in sequences/, so that its bench path resolves
        Plan fromReadme = SequenceLoader.parse(example, SEQUENCES.resolve("readme-example.yaml"));
        Plan shipped = SequenceLoader.load(SEQUENCES.resolve("incoming-kp-c0805-104.yaml"));
        assertEquals(shipped.points(), fromReadme.points());
        assertEquals(shipped.checks(), fromReadme.checks());
        assertEquals(shipped.safety(), fromReadme.safety());
        assertEquals(shipped.fixture(), fromReadme.fixture());
    }
}
