package org.zweep.runner.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.sequence.SequenceLoader;

/**
 * The estimate's own arithmetic, worked by hand from the sequence, standard.yaml's [timing] and the
 * estimator's constants beside each check: no outside value is compared here, so no source is
 * named (how close an estimate comes to a real run is RealTimingRunIT's).
 */
class RunEstimateTest {
    @TempDir
    Path dir;

    private Plan load(String steps) throws IOException {
        Files.writeString(dir.resolve("b.bench.yaml"), "# placeholder\n");
        Path file = dir.resolve("s.yaml");
        Files.writeString(file, "format: zweep-sequence/1\nmeter: {bench: b.bench.yaml}\n"
                + "safety: {max_bias_voltage: 10 V, max_level_voltage: 1 V}\npart: {kind: capacitor, nominal: 1 µF}\n"
                + steps);
        return SequenceLoader.load(file);
    }

    @Test
    void walksTheStepAsTheEngineDoesWithTheDialectsTimingRampsAndSettling() throws IOException {
        Plan plan = load("""
                steps:
                  - name: s
                    frequency: [10 Hz, 1 kHz]
                    level: 1 V
                    averaging: 2
                    integration: 100 ms
                    bias: {values: [0 V, 10 V], ramp: 5 V/s, settle: 1 s}
                """);
        RunEstimate e = RunEstimate.of(plan);
        // from the sequence above and standard.yaml's [timing]
        // (point-overhead 2 ms, min-periods 2, bias-settle 50 ms). Two list sweeps (one per bias value):
        // 10 Hz: 2·max(0.1, 2/10) + 0.002 + 0.05 (bias changed) = 0.452 s; 1 kHz: 2·0.1 + 0.002 = 0.202 s
        assertEquals(2 * (0.452 + 0.202), e.steps().get(0).meterS(), 1e-12);
        // host: settle 1 s at 0 V; ramp 0 → 10 V at 5 V/s = 2 s then settle 1 s; ramp back down 2 s;
        // exchanges: fixture and wiring 2, per sweep apply + list set-up + trigger 3 (twice),
        // 20 ramp steps of 0.1 s up and 20 down, bias off 1: 49; rows: 4, made durable twice, behind
        // (each sync is over long before the ramp after it ends: never waited for)
        double host = 6.0 + 49 * RunEstimate.EXCHANGE_S + 4 * RunEstimate.ROW_S;
        assertEquals(host, e.steps().get(0).waitS(), 1e-12);
        assertEquals(RunEstimate.START_S + 1.308 + host + RunEstimate.END_S, e.totalS(), 1e-12);
        // the ETA's schedule adds up to the same run
        double points = e.points().stream().mapToDouble(p -> p.meterS() + p.waitS()).sum();
        assertEquals(e.totalS(), e.startS() + e.compensationS() + points + e.finishS(), 1e-12);
    }

    @Test
    void countsHostCompensationAsOnePointPerFrequencyAndStandard() throws IOException {
        Plan plan = load("""
                fixture: {terminals: 4, compensation: host, standards: [open, short]}
                steps:
                  - {name: s, frequency: [1 kHz, 10 kHz], level: 1 V, integration: 100 ms}
                """);
        RunEstimate e = RunEstimate.of(plan);
        // per standard 2 points of 0.1 + 0.002 s, one message each (setting and trigger joined), 1 for the fixture
        assertEquals(2 * (2 * 0.102 + 3 * RunEstimate.EXCHANGE_S), e.compensationS(), 1e-12);
        assertEquals(2, e.compensationStandardS().size());
    }

    @Test
    void aPointByPointStepIsOneRoundTripAPointWithItsSyncBehindTheNextPoint() throws IOException {
        Plan plan = load("""
                steps:
                  - {name: s, frequency: 100 kHz, level: [0.1 V, 0.2 V, 0.3 V], integration: 1 ms}
                """);
        RunEstimate e = RunEstimate.of(plan);
        // standard.yaml: point-overhead 2 ms + max(1 ms, 2 periods of 100 kHz) = 3 ms a point
        assertEquals(3 * 0.003, e.steps().get(0).meterS(), 1e-12);
        // the level changes every point: no list; each point one message (setting, trigger, again, error query);
        // fixture and wiring 2 exchanges; each row's 2 ms sync ends before the next 4 ms point does
        assertEquals(2 * RunEstimate.EXCHANGE_S + 3 * (RunEstimate.EXCHANGE_S + RunEstimate.ROW_S),
                e.steps().get(0).waitS(), 1e-12);
        // closing the file waits for the last sync
        assertEquals(RunEstimate.SYNC_S + RunEstimate.END_S, e.finishS(), 1e-12);

        // mz300 (mz300-point-by-point.conv): ERR? is a message of its own, so a changed setting is a
        // write and an ERR? round trip, then TRIG;RESULT?: two round trips a point
        RunEstimate mz = RunEstimate.of(plan, org.zweep.driver.dialect.Dialect.load("mz300"));
        assertEquals(2 * RunEstimate.EXCHANGE_S + 3 * (2 * RunEstimate.EXCHANGE_S + RunEstimate.ROW_S),
                mz.steps().get(0).waitS(), 1e-12);
    }

    @Test
    void formatsForPeople() {
        // 185 s = 3 min 5 s, 3720 s = 1 h 2 min
        assertEquals("4.2 s", RunEstimate.format(4.2));
        assertEquals("42 s", RunEstimate.format(42.4));
        assertEquals("3 min 5 s", RunEstimate.format(185));
        assertEquals("1 h 2 min", RunEstimate.format(3720));
    }
}
