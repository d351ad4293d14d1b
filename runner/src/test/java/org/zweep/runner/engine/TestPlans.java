package org.zweep.runner.engine;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.CheckLimit;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.TerminalConfiguration;
import org.zweep.runner.plan.FixturePlan;
import org.zweep.runner.plan.MeterChoice;
import org.zweep.runner.plan.Part;
import org.zweep.driver.impedance.PartKind;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.plan.PlannedStep;
import org.zweep.runner.plan.SafetyLimits;
import org.zweep.runner.plan.Wiring;

/** Small plans for engine tests. */
final class TestPlans {
    static final SafetyLimits LIMITS = new SafetyLimits(25.0, 0.5, 2.0, 0.02);

    private TestPlans() {
    }

    /** One step sweeping {@code freqs} at each bias in {@code biasV} (bias outermost), 1 V drive. */
    static PlannedStep step(int stepIndex, int firstIndex, String name, String prompt, BiasControl bc,
            double[] biasV, double... freqs) {
        List<PlannedPoint> pts = new ArrayList<>();
        int idx = firstIndex;
        for (double b : biasV) {
            for (double f : freqs) {
                MeasurementSetting s = MeasurementSetting.at(f).withBias(b == 0 ? Bias.OFF : Bias.voltage(b));
                pts.add(new PlannedPoint(idx++, stepIndex, 0, s, Wiring.NONE, 0.0));
            }
        }
        return new PlannedStep(stepIndex, name, prompt, bc, pts);
    }

    static Plan plan(List<PlannedStep> steps, List<CheckLimit> checks) {
        return Plan.builder().name("test").source(Path.of("test.yaml")).meter(new MeterChoice("fake:bench", "standard"))
                .safety(LIMITS)
                .fixture(new FixturePlan(TerminalConfiguration.FOUR_TERMINAL, CompensationMode.NONE, List.of(), null,
                        Duration.ZERO, null))
                .part(new Part(PartKind.CAPACITOR, "KP-C0805-104", 100e-9, 10.0, Double.NaN)).steps(steps).checks(checks)
                .build();
    }

    /** A frequency sweep of 5 points plus a bias step of 3 x 2 points with a 1 V/s ramp and 0.5 s settle. */
    static Plan capacitor() {
        PlannedStep sweep = step(0, 0, "sweep", "insert the part", BiasControl.NONE, new double[] {0},
                100, 1000, 10_000, 100_000, 1e6);
        PlannedStep bias = step(1, 5, "bias", "", new BiasControl(1.0, 0.5), new double[] {0, 2, 5}, 1000, 10_000);
        return plan(List.of(sweep, bias), List.of(
                // Cs within 10 % of 100 nF at 1 kHz; D <= 0.025 at 1 kHz (a usual class-2 ceramic tan δ limit; common practice, no source)
                new CheckLimit("cs", "cs_f", "sweep", 1000, 90e-9, 110e-9),
                new CheckLimit("d", "d", "sweep", 1000, Double.NEGATIVE_INFINITY, 0.025),
                new CheckLimit("srf", "srf_hz", "sweep", Double.NaN, 10e6, Double.POSITIVE_INFINITY)));
    }
}
