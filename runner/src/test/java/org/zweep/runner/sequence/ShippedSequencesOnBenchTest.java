package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.zweep.driver.impedance.Compensation;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.SourceMode;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.FixtureSlot;
import org.zweep.simulator.bench.MeterLimits;
import org.zweep.simulator.bench.PointRequest;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.SourceKind;
import org.zweep.simulator.bench.Wiring;

/**
 * Each shipped sequence fits its bench's meter limits, and its checks pass when its points are
 * measured straight on the bench (no SCPI, no engine) with open/short correction as the sequence
 * asks: the demo's verdict is "pass" because the sequence's limits agree with the device the
 * bench simulates, not because the engine is lenient.
 */
class ShippedSequencesOnBenchTest {

    static List<Path> sequenceFiles() throws Exception {
        return ShippedSequencesTest.sequenceFiles().toList();
    }

    @ParameterizedTest
    @MethodSource("sequenceFiles")
    void everyPointIsWithinTheMeterLimitsAndEveryCheckPasses(Path file) {
        Plan plan = SequenceLoader.load(file);
        Bench bench = new SimulatedBench(BenchSpec.load(Path.of(plan.meter().address().substring(4))));
        MeterLimits limits = bench.limits();
        for (PlannedPoint p : plan.points()) {
            assertWithin(limits, p.setting());
        }
        List<double[]> measured = new ArrayList<>();
        for (PlannedPoint p : plan.points()) {
            measured.add(measure(bench, plan, p));
        }
        for (CheckLimit c : plan.checks()) {
            List<Double> values = values(plan, c, measured);
            assertFalse(values.isEmpty(), c.name());
            for (double v : values) {
                assertTrue(c.passes(v), file.getFileName() + " check " + c.name() + ": " + v + " not in [" + c.min()
                        + ", " + c.max() + "]");
            }
        }
    }

    private static void assertWithin(MeterLimits l, MeasurementSetting s) {
        assertTrue(s.frequencyHz() >= l.minFrequencyHz() && s.frequencyHz() <= l.maxFrequencyHz(), s.toString());
        boolean volts = s.drive().mode() == SourceMode.VOLTAGE;
        double lo = volts ? l.minVoltageVrms() : l.minCurrentArms();
        double hi = volts ? l.maxVoltageVrms() : l.maxCurrentArms();
        assertTrue(s.drive().levelRms() >= lo && s.drive().levelRms() <= hi, s.toString());
        double maxBias = s.bias().mode() == SourceMode.VOLTAGE ? l.maxBiasVoltageV() : l.maxBiasCurrentA();
        assertTrue(Math.abs(s.bias().appliedValue()) <= maxBias, s.toString());
    }

    /** {R, X} corrected as the plan asks (or the ratio's real and imaginary parts). */
    private static double[] measure(Bench bench, Plan plan, PlannedPoint p) {
        MeasurementSetting s = p.setting();
        if (p.wiring() != org.zweep.runner.plan.Wiring.NONE) {
            bench.setWiring(Wiring.valueOf(p.wiring().name()));
        }
        Complex z = raw(bench, FixtureSlot.DEVICE, s, p.index());
        if (plan.fixture().compensation() != CompensationMode.NONE && s.quantity() == MeasuredQuantity.IMPEDANCE) {
            Complex open = raw(bench, FixtureSlot.OPEN, s, p.index());
            Complex shorted = raw(bench, FixtureSlot.SHORT, s, p.index());
            z = Compensation.openShort(open, shorted).correct(z);
        }
        return new double[] {z.getReal(), z.getImaginary()};
    }

    private static Complex raw(Bench bench, FixtureSlot slot, MeasurementSetting s, long key) {
        bench.setSlot(slot);
        var r = bench.measure(PointRequest.at(s.frequencyHz()).voltageRatio(s.quantity() == MeasuredQuantity.VOLTAGE_RATIO)
                .drive(kind(s.drive().mode()), s.drive().levelRms())
                .bias(kind(s.bias().mode()), s.bias().value(), s.bias().on()).averages(s.averagingCount())
                .apertureS(s.integrationTimeS()).rangeUpperOhm(s.range().auto() ? Double.NaN : s.range().upperOhm())
                .noiseKey(key).build());
        assertFalse(r.overload(), s.toString());
        return new Complex(r.real(), r.imaginary());
    }

    private static SourceKind kind(SourceMode m) {
        return m == SourceMode.VOLTAGE ? SourceKind.VOLTAGE : SourceKind.CURRENT;
    }

    private static List<Double> values(Plan plan, CheckLimit c, List<double[]> measured) {
        int step = plan.steps().stream().filter(s -> s.name().equals(c.step())).findFirst().orElseThrow().index();
        List<PlannedPoint> points = plan.steps().get(step).points();
        List<Double> out = new ArrayList<>();
        if (c.parameter().equals("srf_hz")) {
            // the lowest frequency where X turns from capacitive to inductive, linearly interpolated
            for (int i = 1; i < points.size(); i++) {
                double x0 = measured.get(points.get(i - 1).index())[1];
                double x1 = measured.get(points.get(i).index())[1];
                if (x0 < 0 && x1 >= 0) {
                    double f0 = points.get(i - 1).setting().frequencyHz();
                    double f1 = points.get(i).setting().frequencyHz();
                    out.add(f0 + (f1 - f0) * (-x0) / (x1 - x0));
                    break;
                }
            }
            return out;
        }
        if (c.parameter().equals(CheckLimit.SATURATION)) {
            // the bias where Ls (Cs for a capacitor) has first fallen by the drop from its value at the lowest
            // bias, linearly interpolated between the two bias points around the crossing
            String key = plan.part().kind() == org.zweep.driver.impedance.PartKind.CAPACITOR ? "cs_f" : "ls_h";
            double ref = Double.NaN;
            double lastBias = Double.NaN;
            double lastValue = Double.NaN;
            for (PlannedPoint p : points) {
                double[] rx = measured.get(p.index());
                double v = DerivedParameter.contractValues(Impedance.fromRX(p.setting().frequencyHz(), rx[0], rx[1]))
                        .get(key);
                double b = p.setting().bias().appliedValue();
                if (Double.isNaN(ref)) {
                    ref = v;
                }
                double target = ref * (1 - c.dropPercent() / 100);
                if (v <= target && !Double.isNaN(lastValue)) {
                    out.add(lastBias + (b - lastBias) * (lastValue - target) / (lastValue - v));
                    break;
                }
                lastBias = b;
                lastValue = v;
            }
            return out;
        }
        for (PlannedPoint p : points) {
            boolean bias = Double.isNaN(c.selection().bias()) || p.setting().bias().appliedValue() == c.selection().bias();
            boolean level = Double.isNaN(c.selection().level()) || p.setting().drive().levelRms() == c.selection().level();
            if (p.setting().frequencyHz() == c.frequencyHz() && bias && level) {
                double[] rx = measured.get(p.index());
                if (c.parameter().equals("ratio")) {
                    out.add(Math.hypot(rx[0], rx[1]));
                } else {
                    Map<String, Double> v = DerivedParameter.contractValues(
                            Impedance.fromRX(p.setting().frequencyHz(), rx[0], rx[1]));
                    out.add(v.get(c.parameter()));
                }
            }
        }
        return out;
    }
}
