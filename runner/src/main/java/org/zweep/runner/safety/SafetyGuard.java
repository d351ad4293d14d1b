package org.zweep.runner.safety;

import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.Drive;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.Interval;
import org.zweep.driver.meter.SourceMode;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.plan.PlannedStep;
import org.zweep.runner.plan.SafetyLimits;

/**
 * Checks settings against a run's {@link SafetyLimits}. A setting that exceeds them is refused
 * with an {@link InvalidInputException} (exit code 2) before anything is sent. Immutable and
 * thread-safe.
 */
public final class SafetyGuard {
    private final SafetyLimits limits;

    /** A guard for {@code limits}. */
    public SafetyGuard(SafetyLimits limits) {
        this.limits = limits;
    }

    /** The limits enforced. */
    public SafetyLimits limits() {
        return limits;
    }

    /**
     * Checks every point of {@code plan} (bias ramps only pass through values between two
     * checked points, so they are covered too).
     *
     * @throws InvalidInputException naming the step and point of the first setting over a limit
     */
    public void checkPlan(Plan plan) {
        for (PlannedStep step : plan.steps()) {
            for (PlannedPoint p : step.points()) {
                check(p.setting(), "step '" + step.name() + "', point " + p.index());
            }
        }
    }

    /**
     * Checks one setting.
     *
     * @param where what to name in the message (e.g. {@code step 'bias', point 12})
     * @throws InvalidInputException when the drive level or the DC bias exceeds its limit
     */
    public void check(MeasurementSetting s, String where) {
        String problem = problem(s);
        if (problem != null) {
            throw new InvalidInputException(where + ": " + problem + "; nothing was sent to the meter");
        }
    }

    /** What is wrong with {@code s}, or {@code null} when it is within the limits. */
    public String problem(MeasurementSetting s) {
        Drive d = s.drive();
        if (!(d.levelRms() >= 0) || !Double.isFinite(d.levelRms())) {
            return "drive level " + d.levelRms() + " is not a valid level";
        }
        double maxLevel = d.mode() == SourceMode.VOLTAGE ? limits.maxLevelVrms() : limits.maxLevelArms();
        if (d.levelRms() > maxLevel) {
            return "drive level " + human(d.levelRms(), d.mode().unit() + " rms") + " exceeds the safety limit "
                    + human(maxLevel, d.mode().unit() + " rms");
        }
        Bias b = s.bias();
        if (b.on()) {
            double v = Math.abs(b.value());
            double maxBias = b.mode() == SourceMode.VOLTAGE ? limits.maxBiasVoltageV() : limits.maxBiasCurrentA();
            if (!Double.isFinite(b.value())) {
                return "DC bias " + b.value() + " is not a valid bias";
            }
            if (v > maxBias) {
                return "DC bias " + human(b.value(), b.mode().unit()) + " exceeds the safety limit "
                        + human(maxBias, b.mode().unit());
            }
        }
        return null;
    }

    /**
     * Checks that the meter can do every point of {@code plan} (frequency, drive level, DC bias
     * within the ranges its dialect declares), so that a run is refused before its first point
     * rather than stopped in the middle.
     *
     * @param meterName the meter or dialect, for the message
     * @throws InvalidInputException naming the step and point of the first setting out of range
     */
    public static void checkCapabilities(Plan plan, MeterCapabilities caps, String meterName) {
        for (PlannedStep step : plan.steps()) {
            for (PlannedPoint p : step.points()) {
                MeasurementSetting s = p.setting();
                String where = "step '" + step.name() + "', point " + p.index() + ": ";
                within(where + "frequency", s.frequencyHz(), caps.frequencyHz(), "Hz", meterName);
                Drive d = s.drive();
                within(where + "drive level", d.levelRms(), d.mode() == SourceMode.VOLTAGE ? caps.voltageLevelVrms()
                        : caps.currentLevelArms(), d.mode().unit() + " rms", meterName);
                Bias b = s.bias();
                if (b.on()) {
                    within(where + "DC bias", b.value(), b.mode() == SourceMode.VOLTAGE ? caps.biasVoltageV()
                            : caps.biasCurrentA(), b.mode().unit(), meterName);
                }
            }
        }
    }

    private static void within(String what, double v, Interval r, String unit, String meterName) {
        if (!r.contains(v)) {
            throw new InvalidInputException(what + " " + human(v, unit) + " is outside what the meter can do ("
                    + human(r.min(), unit) + " to " + human(r.max(), unit) + ", " + meterName + "); nothing was measured");
        }
    }

    /** {@code v} with an SI prefix for people ({@code 25.12 MHz}, {@code 500 mV rms}); {@code unit} may carry a remark after a space. */
    public static String human(double v, String unit) {
        int space = unit.indexOf(' ');
        String symbol = space < 0 ? unit : unit.substring(0, space);
        String rest = space < 0 ? "" : unit.substring(space);
        return org.zweep.driver.impedance.Unit.ofSymbol(symbol)
                .map(u -> org.zweep.runner.text.Figures.format(v, u, 6) + rest).orElse(v + " " + unit);
    }
}
