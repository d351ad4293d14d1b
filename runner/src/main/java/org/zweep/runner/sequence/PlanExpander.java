package org.zweep.runner.sequence;

import java.util.ArrayList;
import java.util.List;
import org.zweep.driver.impedance.Unit;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.Drive;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.plan.PlannedStep;

/** Expands validated steps into points in measuring order, with run-wide 0-based indices. */
final class PlanExpander {
    private PlanExpander() {
    }

    /** The steps expanded in order; point indices run on from one step to the next. */
    static List<PlannedStep> expand(List<StepSpec> specs) {
        List<PlannedStep> steps = new ArrayList<>();
        int index = 0;
        for (int s = 0; s < specs.size(); s++) {
            PlannedStep step = expand(specs.get(s), s, index);
            index += step.points().size();
            steps.add(step);
        }
        return steps;
    }

    /** One step's points: an odometer over the axes in the step's order, the last axis turning fastest. */
    static PlannedStep expand(StepSpec spec, int stepIndex, int firstIndex) {
        List<StepSpec.Axis> order = spec.order();
        int[] sizes = order.stream().mapToInt(spec::size).toArray();
        int[] at = new int[sizes.length];
        int total = (int) spec.pointCount();
        List<PlannedPoint> points = new ArrayList<>(total);
        for (int n = 0; n < total; n++) {
            int bias = 0;
            int repeat = 0;
            int level = 0;
            int frequency = 0;
            for (int k = 0; k < order.size(); k++) {
                switch (order.get(k)) {
                    case BIAS -> bias = at[k];
                    case REPEAT -> repeat = at[k];
                    case LEVEL -> level = at[k];
                    case FREQUENCY -> frequency = at[k];
                }
            }
            points.add(new PlannedPoint(firstIndex + n, stepIndex, repeat, setting(spec, bias, level, frequency),
                    spec.wiring(), spec.delayS()));
            for (int k = sizes.length - 1; k >= 0; k--) {
                if (++at[k] < sizes[k]) {
                    break;
                }
                at[k] = 0;
            }
        }
        return new PlannedStep(stepIndex, spec.name(), spec.prompt(), spec.biasControl(), points,
                spec.deratingDrops());
    }

    private static MeasurementSetting setting(StepSpec spec, int bias, int level, int frequency) {
        double lv = spec.levels().values().get(level);
        Drive drive = spec.levels().unit() == Unit.AMPERE ? Drive.current(lv) : Drive.voltage(lv);
        Bias b = Bias.OFF;
        if (spec.bias() != null) {
            double bv = spec.bias().values().get(bias);
            b = spec.bias().unit() == Unit.AMPERE ? Bias.current(bv) : Bias.voltage(bv);
        }
        return new MeasurementSetting(spec.quantity(), spec.frequencies().values().get(frequency), drive, b,
                spec.averaging(), spec.integrationTimeS(), spec.range());
    }
}
