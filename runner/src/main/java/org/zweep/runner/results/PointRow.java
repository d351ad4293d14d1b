package org.zweep.runner.results;

import java.time.Instant;
import java.util.Objects;

/**
 * One row of {@code points.csv}: one measured point. Doubles are SI; {@code NaN} writes an empty
 * cell (not applicable).
 *
 * @param point the planned point's index in the run (the resume key)
 * @param step the step's name
 * @param stepIndex the step's index, from 0
 * @param repeat the repeat number within the step, from 0
 * @param quantity {@code impedance} or {@code voltage_ratio}
 * @param wiring {@code none}, {@code secondary_open} or {@code secondary_shorted}
 * @param frequencyHz test frequency in Hz
 * @param drive {@code V} or {@code A}
 * @param level drive level in V rms or A rms according to {@code drive}
 * @param biasMode {@code V} or {@code A}
 * @param bias the DC bias applied, in V or A according to {@code biasMode}; 0 when off
 * @param rOhm R in ohms (corrected when compensation applies), or the ratio's real part
 * @param xOhm X in ohms (corrected when compensation applies), or the ratio's imaginary part
 * @param derived the derived parameters; all {@code NaN} for voltage-ratio rows
 * @param ratio |V2/V1| for voltage-ratio rows, {@code NaN} otherwise
 * @param status {@code ok}, {@code no_value}, or {@code implausible} (physics does not allow the
 *     reading: |θ| above 90° or |Z| beyond the meter's reach, twice)
 * @param check empty, {@code pass} or {@code fail}
 * @param time when the reading arrived
 */
public record PointRow(int point, String step, int stepIndex, int repeat, String quantity, String wiring,
        double frequencyHz, String drive, double level, String biasMode, double bias, double rOhm, double xOhm,
        Derived derived, double ratio, String status, String check, Instant time) {

    public PointRow {
        Objects.requireNonNull(step, "step");
        Objects.requireNonNull(derived, "derived");
        Objects.requireNonNull(check, "check");
        Objects.requireNonNull(time, "time");
    }

    /** This row with another check outcome ({@code ""}, {@code pass} or {@code fail}). */
    public PointRow withCheck(String outcome) {
        return new PointRow(point, step, stepIndex, repeat, quantity, wiring, frequencyHz, drive, level, biasMode,
                bias, rOhm, xOhm, derived, ratio, status, outcome, time);
    }

    /** This row with another status ({@code ok}, {@code no_value} or {@code implausible}). */
    public PointRow withStatus(String newStatus) {
        return new PointRow(point, step, stepIndex, repeat, quantity, wiring, frequencyHz, drive, level, biasMode, bias,
                rOhm, xOhm, derived, ratio, newStatus, check, time);
    }

    /**
     * The value of a numeric column by its name ({@code r_ohm}, {@code cs_f}, {@code ratio}, ...),
     * or {@code NaN} when the row has no such value.
     */
    public double value(String column) {
        return switch (column) {
            case "frequency_hz" -> frequencyHz;
            case "level" -> level;
            case "bias" -> bias;
            case "r_ohm" -> rOhm;
            case "x_ohm" -> xOhm;
            case "ratio" -> ratio;
            default -> derived.value(column);
        };
    }
}
