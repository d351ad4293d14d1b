package org.zweep.runner.sequence;

import org.zweep.config.YamlNode;
import java.util.List;
import org.zweep.driver.meter.ImpedanceRange;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.Wiring;

/**
 * One step as read from the file, before expansion into points.
 *
 * @param name unique step name
 * @param prompt operator instruction, empty for none
 * @param quantity impedance or voltage ratio
 * @param wiring a transformer's secondary connection
 * @param frequencies the frequency axis in Hz
 * @param levels the drive-level axis (V rms or A rms per its unit)
 * @param bias the bias axis (V or A per its unit); {@code null} for no bias
 * @param biasControl ramp and settle
 * @param order the axes outermost first: a permutation of {@link Axis#values()}
 * @param averaging averaging count
 * @param integrationTimeS integration time per measurement in s
 * @param repeats how many times the step's sweep is measured
 * @param delayS extra wait before each point in s
 * @param range impedance range
 * @param deratingDrops the drops (whole percentages) the analysis reports for the bias sweep; empty for the defaults
 * @param node the step's mapping, for complaints
 */
record StepSpec(String name, String prompt, MeasuredQuantity quantity, Wiring wiring, AxisValues frequencies,
        AxisValues levels, AxisValues bias, BiasControl biasControl, List<Axis> order, int averaging, double integrationTimeS,
        int repeats, double delayS, ImpedanceRange range, List<Integer> deratingDrops, YamlNode node) {

    /** The nested axes of a step. */
    enum Axis {
        BIAS, REPEAT, LEVEL, FREQUENCY;

        String key() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }

    /** The default nesting, outermost first: slow bias changes happen least. */
    static final List<Axis> DEFAULT_ORDER = List.of(Axis.BIAS, Axis.REPEAT, Axis.LEVEL, Axis.FREQUENCY);

    /** The number of values along {@code axis}. */
    int size(Axis axis) {
        return switch (axis) {
            case BIAS -> bias == null ? 1 : bias.values().size();
            case REPEAT -> repeats;
            case LEVEL -> levels.values().size();
            case FREQUENCY -> frequencies.values().size();
        };
    }

    /** The number of points the step expands to (may exceed {@code int}). */
    long pointCount() {
        long n = 1;
        for (Axis a : Axis.values()) {
            n *= size(a);
        }
        return n;
    }
}
