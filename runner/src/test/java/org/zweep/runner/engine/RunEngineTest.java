package org.zweep.runner.engine;

import org.zweep.runner.safety.Interruption;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import java.util.stream.IntStream;
import org.junit.jupiter.api.Test;
import org.zweep.runner.verdict.CheckEvaluator;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.safety.SafetyGuard;

class RunEngineTest {
    final FakeBench bench = new FakeBench();
    final FakeBench.Link link = bench.new Link();
    final Interruption interruption = new Interruption();
    // filled from the engine's thread and its writing thread
    final List<String> notes = java.util.Collections.synchronizedList(new ArrayList<>());
    final List<String> prompts = java.util.Collections.synchronizedList(new ArrayList<>());
    final List<PointRow> rows = java.util.Collections.synchronizedList(new ArrayList<>());
    ReconnectPolicy policy = new ReconnectPolicy(0.1, 1.0, 2.0, 10.0, 5);
    ProgressListener progress = new Recorder();

    class Recorder implements ProgressListener {
        @Override
        public void note(String line) {
            notes.add(line);
        }
    }

    Station station() {
        Station s = new Station(link, new SafetyGuard(TestPlans.LIMITS), port(), bench.waiter(interruption),
                policy, notes::add);
        s.start();
        return s;
    }

    /** The meter's own fixture when it has one, else the operator (prompts recorded). */
    FixturePort port() {
        return FixturePort.meter(link, FixturePort.operator(prompts::add), notes::add);
    }

    RunResult run(Plan plan, BitSet done) {
        Station st = station();
        return new RunEngine(plan, st, ReadingCorrector.NONE, new CheckEvaluator(plan.checks()), progress, interruption)
                .run(done, (row, last) -> rows.add(row));
    }

    /**
     * How many triggers had been sent and were not yet durable (their last row's write not
     * returned) as each trigger was sent, with a sink slower than the meter.
     */
    private List<Long> lagAtEachTrigger(RowSync sync) {
        java.util.concurrent.atomic.AtomicLong sent = new java.util.concurrent.atomic.AtomicLong();
        java.util.concurrent.atomic.AtomicLong durable = new java.util.concurrent.atomic.AtomicLong();
        List<Long> lag = java.util.Collections.synchronizedList(new ArrayList<>());
        bench.onTrigger = () -> lag.add(sent.getAndIncrement() - durable.get());
        Plan plan = TestPlans.capacitor();
        RunResult r = new RunEngine(plan, station(), ReadingCorrector.NONE, PointUncertainty.NONE,
                new CheckEvaluator(plan.checks()), progress, interruption, sync).run(new BitSet(), (row, last) -> {
                    sleepMillis(3); // a slow disk
                    rows.add(row);
                    if (last) {
                        durable.incrementAndGet();
                    }
                });
        assertEquals(RunResult.Outcome.COMPLETED, r.outcome());
        assertEquals(11, rows.size());
        return lag;
    }

    @Test
    void rowsAreWrittenWhileTheNextPointIsMeasuredAndDurableBeforeTheOneAfter() {
        // the run-folder contract (RowSync.BEHIND): a power cut loses at most the point in progress
        // and the one before it
        List<Long> lag = lagAtEachTrigger(RowSync.BEHIND);
        assertTrue(lag.stream().allMatch(n -> n <= 1), lag.toString());
        assertTrue(lag.contains(1L), "some point was measured while the one before it was written: " + lag);
    }

    @Test
    void rowsSyncedBeforeTheNextTriggerAreDurableWhenItIsSent() {
        List<Long> lag = lagAtEachTrigger(RowSync.BEFORE_NEXT);
        assertTrue(lag.stream().allMatch(n -> n == 0), lag.toString());
    }

    @Test
    void measuresEveryPointInPlanOrderWithPointChecksPerRow() {
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.COMPLETED, r.outcome());
        // our own demo plan (TestPlans.capacitor): 5 sweep points + 3 bias values × 2 frequencies = 11 points
        assertEquals(IntStream.range(0, 11).boxed().toList(), rows.stream().map(PointRow::point).toList());
        PointRow oneK = rows.get(1);
        assertEquals(1000.0, oneK.frequencyHz());
        // 100 nF at 1 kHz: X_C = −1/(2πfC) = -1591.5494 ohm, computed -> Cs = 100 nF, D = 0.010/1591.5 = 6.3e-6
        assertEquals(-1591.5494, oneK.xOhm(), 1e-4);
        assertEquals(100e-9, oneK.derived().csF(), 1e-15); // FakeBench's 100 nF part
        assertEquals("pass", oneK.check()); // against the plan's limits (TestPlans)
        assertEquals("", rows.get(0).check());
        assertEquals(5.0, rows.get(10).bias());
        assertEquals("V", rows.get(10).biasMode());
    }

    @Test
    void biasIsNeverSteppedFasterThanTheRampLimitAndSettlesBeforeMeasuring() {
        run(TestPlans.capacitor(), new BitSet());
        List<FakeBench.BiasEvent> h = bench.biasHistory;
        assertTrue(h.size() > 10, "a 0 -> 2 -> 5 V ramp at 1 V/s takes intermediate steps: " + h);
        double rampPerS = 1.0; // the plan's ramp limit
        for (int i = 1; i < h.size(); i++) {
            FakeBench.BiasEvent a = h.get(i - 1);
            FakeBench.BiasEvent b = h.get(i);
            if (a.on() && b.on()) {
                double dv = Math.abs(b.value() - a.value());
                assertTrue(dv <= rampPerS * (b.timeS() - a.timeS()) + 1e-9, "step " + a + " -> " + b);
            }
            if (!a.on() && b.on()) {
                assertTrue(Math.abs(b.value()) <= rampPerS * Station.RAMP_STEP_S + 1e-9, "first step " + b);
            }
        }
        // every biased point is measured at least the settle time (0.5 s) after the last bias change before it
        for (PointRow row : rows) {
            if (row.bias() == 0) {
                continue;
            }
            double t = (row.time().getEpochSecond() - 1_700_000_000L) + row.time().getNano() / 1e9;
            double lastChange = h.stream().filter(e -> e.timeS() <= t).mapToDouble(FakeBench.BiasEvent::timeS).max()
                    .orElseThrow();
            assertTrue(t - lastChange >= 0.5 - 1e-6, "point " + row.point() + " measured " + (t - lastChange)
                    + " s after a bias change");
        }
    }

    @Test
    void readingWithPhaseBeyondNinetyDegreesIsMeasuredAgainAndTheSecondReadingKept() {
        bench.negativeRAtMeasure.add(2); // point 1's reading arrives with R < 0: θ below -90°
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.COMPLETED, r.outcome());
        assertEquals("ok", rows.get(1).status());
        assertEquals(0.010, rows.get(1).rOhm(), 1e-6); // FakeBench's part: 10 mOhm ESR, R > 0 as read again
        String point1 = "measure " + FakeBench.label(TestPlans.capacitor().points().get(1).setting());
        List<String> measures = bench.trace.stream().filter(t -> t.startsWith("measure")).toList();
        assertEquals(List.of(point1, point1), measures.subList(1, 3), bench.trace.toString()); // read twice in a row
        assertTrue(notes.stream().anyMatch(n -> n.startsWith("point 1: θ = ") && n.endsWith("; measuring again")),
                notes.toString());
    }

    @Test
    void readingWithPhaseBeyondNinetyDegreesTwiceIsStoredAsImplausibleAndFailsItsCheck() {
        bench.negativeRAtMeasure.addAll(List.of(2, 3));
        run(TestPlans.capacitor(), new BitSet());
        assertEquals("implausible", rows.get(1).status());
        assertTrue(rows.get(1).rOhm() < 0, "what the meter said is kept");
        assertEquals("fail", rows.get(1).check());
        assertTrue(notes.stream().anyMatch(n -> n.contains("again; stored with status implausible")), notes.toString());
    }

    @Test
    void biasIsOffAtTheNormalEnd() {
        run(TestPlans.capacitor(), new BitSet());
        assertEquals(Bias.OFF, bench.instrumentBias);
        // 5 V is the plan's highest bias
        assertTrue(bench.biasHistory.stream().anyMatch(e -> e.value() == 5.0), "bias was applied during the run");
    }

    @Test
    void meterReportedErrorStopsTheStepShowsTheMeterTextAndLaterStepsStillRun() {
        bench.meterErrorAtMeasure = 2;
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.FAILED, r.outcome());
        assertEquals(1, r.problems().size());
        // -222 "Data out of range": SCPI-1999 Vol 2 §21.8.10
        assertTrue(r.problems().get(0).startsWith("step 'sweep' stopped: meter reported -222,\"Data out of range\""),
                r.problems().get(0));
        // the error at point 1 ends step 'sweep' (points 1-4), step 'bias' is 5-10
        assertEquals(List.of(0, 5, 6, 7, 8, 9, 10), rows.stream().map(PointRow::point).toList());
        assertEquals(Bias.OFF, bench.instrumentBias);
    }

    @Test
    void droppedLinkToAMeterThatCannotTellItsBiasIsReopenedBiasTurnedOffAndThePointMeasuredAgain() {
        bench.dropAtMeasure.add(8); // the 8th trigger is point 7: 2 V bias on, at 10 kHz
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.COMPLETED, r.outcome());
        assertEquals(IntStream.range(0, 11).boxed().toList(), rows.stream().map(PointRow::point).toList());
        int reconnect = bench.trace.indexOf("reconnect");
        assertTrue(reconnect > 0, bench.trace.toString());
        assertEquals("read bias", bench.trace.get(reconnect + 1), "asked first (this meter cannot tell)");
        assertEquals("bias off", bench.trace.get(reconnect + 2), "then bias off, before anything else");
        // the instrument kept 2 V while the link was down, then went off, then ramped up again
        assertTrue(bench.biasHistory.stream().anyMatch(e -> !e.on() && e.timeS() > 0), bench.biasHistory.toString());
        assertEquals(2.0, rows.get(7).bias()); // our own demo plan: point 7 is at 2 V
        assertEquals(1, notes.stream().filter(n -> n.startsWith("reconnected to fake:bench")).count(), notes.toString());
    }

    @Test
    void droppedLinkDuringABiasStepKeepsTheBiasTheMeterHoldsAndGoesOnFromThere() {
        bench.readsBias = true;
        bench.dropAtMeasure.add(8); // the 8th trigger is point 7: 2 V bias on, at 10 kHz
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.COMPLETED, r.outcome());
        assertEquals(IntStream.range(0, 11).boxed().toList(), rows.stream().map(PointRow::point).toList());
        int reconnect = bench.trace.indexOf("reconnect");
        assertEquals("read bias", bench.trace.get(reconnect + 1), "the bias is read back first");
        assertFalse(bench.trace.subList(reconnect, reconnect + 3).contains("bias off"), bench.trace.toString());
        // between the first time 2 V was reached and the end of the step, the bias was never off
        double firstAt2 = bench.biasHistory.stream().filter(e -> e.on() && e.value() == 2.0).findFirst()
                .orElseThrow().timeS();
        double leftAt2 = bench.biasHistory.stream().filter(e -> e.timeS() > firstAt2 && e.value() != 2.0).findFirst()
                .map(FakeBench.BiasEvent::timeS).orElse(Double.MAX_VALUE);
        assertTrue(bench.biasHistory.stream().noneMatch(e -> !e.on() && e.timeS() > firstAt2 && e.timeS() < leftAt2),
                bench.biasHistory.toString());
        assertTrue(notes.stream().anyMatch(n -> n.contains("bias held at 2 V")), notes.toString());
    }

    @Test
    void givingUpAfterTheReconnectBudgetFailsTheRunWithAClearMessage() {
        policy = new ReconnectPolicy(0.1, 1.0, 2.0, 10.0, 3);
        bench.dropAtMeasure.add(3);
        bench.failingReconnects = 3;
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.FAILED, r.outcome());
        // arithmetic from the inputs above: points 0 and 1 measured; waits 0.1 + 0.2 + 0.4 s = 0.7 s
        assertEquals(2, r.measured());
        assertTrue(r.problems().get(0).startsWith("lost the link to fake:bench while measuring at 10 kHz and could"
                + " not reconnect (3 attempts in 0.7 s since the last successful operation)"), r.problems().get(0));
        assertEquals(Bias.OFF, bench.instrumentBias);
    }

    @Test
    void linkThatBreaksAgainBeforeEveryPointCanFinishStillEndsWithinTheBudget() {
        policy = new ReconnectPolicy(0.1, 1.0, 2.0, 10.0, 4);
        for (int i = 3; i < 100; i++) {
            bench.dropAtMeasure.add(i); // every trigger from the third on breaks the link
        }
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.FAILED, r.outcome());
        // arithmetic from the inputs above: two triggers succeed, the policy allows four reconnects
        assertEquals(2, r.measured());
        assertEquals(4, bench.trace.stream().filter("reconnect"::equals).count() - 1,
                "four reconnects for the point, one more to turn bias off at the end: " + bench.trace);
        assertEquals(Bias.OFF, bench.instrumentBias);
    }

    @Test
    void stopRequestEndsTheRunAfterThePointInProgressWithBiasOff() {
        progress = new Recorder() {
            @Override
            public void measured(PointRow row, int done, int total) {
                if (row.point() == 7) {
                    interruption.request("Ctrl-C");
                }
            }
        };
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.ABORTED, r.outcome());
        // the stop was asked while point 7's row was written: by then the meter may have been
        // measuring point 8 (rows are written while the next point is measured), never point 9,
        // and every point measured is written
        long measured = bench.trace.stream().filter(t -> t.startsWith("measure ")).count();
        assertTrue(measured == 8 || measured == 9, bench.trace.toString());
        assertEquals(measured, rows.size());
        assertEquals(Bias.OFF, bench.instrumentBias);
        assertEquals("stopped: Ctrl-C", r.problems().get(0));
    }

    @Test
    void resumedRunMeasuresOnlyTheMissingPointsWithTheSameNoiseKeys() {
        run(TestPlans.capacitor(), new BitSet());
        List<PointRow> full = List.copyOf(rows);
        rows.clear();
        BitSet done = new BitSet();
        done.set(0, 6);
        RunResult r = run(TestPlans.capacitor(), done);
        // arithmetic from the inputs above: 6 done + 5 measured of the 11 points
        assertEquals(11, r.measured());
        assertEquals(List.of(6, 7, 8, 9, 10), rows.stream().map(PointRow::point).toList());
        for (PointRow row : rows) {
            assertEquals(full.get(row.point()).rOhm(), row.rOhm(), 0.0); // the first run's value
        }
    }

    @Test
    void listSweepIsUsedForPointsThatDifferOnlyInFrequencyAndSplitTheSameWayOnResume() {
        bench.maxListPoints = 3;
        run(TestPlans.capacitor(), new BitSet());
        // arithmetic from the inputs above: at most 3 per list; sweep 0-4 → 3 + 2; bias pairs start at 5, 7, 9
        List<org.zweep.runner.plan.PlannedPoint> p = TestPlans.capacitor().points();
        assertTrue(bench.trace.contains("list 3 from " + FakeBench.label(p.get(0).setting())), bench.trace.toString());
        assertTrue(bench.trace.contains("list 2 from " + FakeBench.label(p.get(3).setting())), bench.trace.toString());
        assertTrue(bench.trace.contains("list 2 from " + FakeBench.label(p.get(9).setting())), bench.trace.toString());
        List<PointRow> full = List.copyOf(rows);
        rows.clear();
        BitSet done = new BitSet();
        done.set(0);
        done.set(1);
        run(TestPlans.capacitor(), done);
        assertEquals(2, rows.get(0).point());
        assertEquals(full.get(2).rOhm(), rows.get(0).rOhm(), 0.0); // the first run's value
    }

    @Test
    void aMeterWithItsOwnFixtureIsSwitchedInsteadOfPromptingTheOperator() {
        bench.slot = org.zweep.driver.meter.FixtureState.OPEN;
        run(TestPlans.capacitor(), new BitSet());
        assertTrue(prompts.isEmpty());
        assertEquals(org.zweep.driver.meter.FixtureState.PART, bench.slot);
        assertTrue(notes.stream().anyMatch(n -> n.equals(">> insert the part (the meter's fixture holds part)")),
                notes.toString());
    }

    @Test
    void onARealMeterTheOperatorIsPromptedWithTheStepInstruction() {
        bench.simulator = false;
        run(TestPlans.capacitor(), new BitSet());
        assertEquals(List.of("insert the part"), prompts);
    }

    @Test
    void settingOverTheSafetyLimitIsRefusedBeforeAnyCommandIsSent() {
        Station st = station();
        bench.trace.clear();
        MeasurementSetting hot = MeasurementSetting.at(1000).withBias(Bias.voltage(30.0)); // limit is 25 V
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> st.measure(hot, BiasControl.NONE, 0));
        // 25 V: TestPlans.LIMITS
        assertTrue(e.getMessage().contains("DC bias 30 V exceeds the safety limit 25 V"), e.getMessage());
        assertTrue(bench.trace.isEmpty(), bench.trace.toString());
    }

    @Test
    void planOverTheSafetyLimitIsRefusedNamingTheStep() {
        Plan p = TestPlans.plan(List.of(TestPlans.step(0, 0, "hot", "", BiasControl.NONE, new double[] {30}, 1000)),
                List.of());
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> new SafetyGuard(TestPlans.LIMITS).checkPlan(p));
        assertTrue(e.getMessage().startsWith("step 'hot', point 0: DC bias 30 V exceeds"), e.getMessage());
        assertFalse(bench.trace.contains("apply"));
    }

    /**
     * Every change in the bench's bias history is within {@code rampPerS} (the plan's ramp): between
     * two values by the time between them, and switching on or off only within one ramp step of 0.
     */
    void assertRampedEverywhere(double rampPerS) {
        List<FakeBench.BiasEvent> h = bench.biasHistory;
        for (int i = 1; i < h.size(); i++) {
            FakeBench.BiasEvent a = h.get(i - 1);
            FakeBench.BiasEvent b = h.get(i);
            if (a.on() && b.on()) {
                assertTrue(Math.abs(b.value() - a.value()) <= rampPerS * (b.timeS() - a.timeS()) + 1e-9,
                        "step " + a + " -> " + b + " in " + h);
            } else if (a.on() != b.on()) {
                double v = a.on() ? a.value() : b.value();
                assertTrue(Math.abs(v) <= rampPerS * Station.RAMP_STEP_S + 1e-9, "switched at " + v + " in " + h);
            }
        }
        assertEquals(Bias.OFF, bench.instrumentBias);
    }

    @Test
    void stopRequestDuringARampUpBringsBiasDownAtTheRampRateNotAtOnce() {
        Waiter inner = bench.waiter(interruption);
        Waiter stopAt4V = new Waiter() {
            @Override
            public void waitS(double seconds) {
                if (bench.instrumentBias.on() && bench.instrumentBias.value() >= 4.0) {
                    interruption.request("Ctrl-C");
                }
                inner.waitS(seconds);
            }

            @Override
            public void waitThroughStopS(double seconds) {
                inner.waitThroughStopS(seconds);
            }
        };
        Station st = new Station(link, new SafetyGuard(TestPlans.LIMITS), port(), stopAt4V, policy, notes::add);
        st.start();
        Plan plan = TestPlans.capacitor();
        RunResult r = new RunEngine(plan, st, ReadingCorrector.NONE, new CheckEvaluator(plan.checks()), progress,
                interruption).run(new BitSet(), (row, last) -> rows.add(row));
        assertEquals(RunResult.Outcome.ABORTED, r.outcome());
        assertTrue(bench.biasHistory.stream().anyMatch(e -> e.value() >= 4.0), "stopped mid ramp: " + bench.biasHistory);
        assertRampedEverywhere(1.0); // the plan's 1 V/s ramp
        double peakS = bench.biasHistory.stream().filter(e -> e.value() >= 4.0).findFirst().orElseThrow().timeS();
        double offS = bench.biasHistory.get(bench.biasHistory.size() - 1).timeS();
        assertTrue(offS - peakS >= 4.0 - 1.0 * Station.RAMP_STEP_S - 1e-9, "from 4 V at 1 V/s takes 4 s, took "
                + (offS - peakS));
    }

    @Test
    void meterErrorDuringABiasStepBringsBiasDownAtTheRampRate() {
        bench.meterErrorAtMeasure = 10; // point 9: 5 V on (points 5-6 at 0 V, 7-8 at 2 V, 9-10 at 5 V)
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.FAILED, r.outcome());
        assertTrue(bench.biasHistory.stream().anyMatch(e -> e.value() == 5.0), "5 V was reached");
        assertRampedEverywhere(1.0);
    }

    @Test
    void endOfStepRampDownGoesOnThroughAStopRequest() {
        progress = new Recorder() {
            @Override
            public void measured(PointRow row, int done, int total) {
                if (row.point() == 10) {
                    interruption.request("shutting down"); // the last point: the end-of-step ramp is next
                }
            }
        };
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(11, r.measured());
        assertRampedEverywhere(1.0);
    }

    @Test
    void aLinkGivenUpOnIsRampedDownOnceItIsBack() {
        policy = new ReconnectPolicy(0.1, 1.0, 2.0, 10.0, 3);
        bench.dropAtMeasure.add(10); // point 9: 5 V on (points 5-6 at 0 V, 7-8 at 2 V, 9-10 at 5 V)
        bench.failingReconnects = 3; // the run gives up after 3 attempts; the 4th connects
        RunResult r = run(TestPlans.capacitor(), new BitSet());
        assertEquals(RunResult.Outcome.FAILED, r.outcome());
        assertTrue(bench.biasHistory.stream().anyMatch(e -> e.value() == 5.0), "5 V was reached");
        assertRampedEverywhere(1.0); // the plan's 1 V/s: brought down from 5 V, not cut
        assertTrue(notes.stream().anyMatch(n -> n.contains("brought DC bias down at the ramp rate")), notes.toString());
    }

    private static void sleepMillis(long ms) {
        try {
            Thread.sleep(ms);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
