package org.zweep.runner.results;

import java.time.Instant;
import java.util.Objects;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.uncertainty.UncertainImpedance;

/**
 * One row of {@code points.csv}: one measured point, as small records (where it sits in the plan,
 * the conditions it was measured at, what was measured). Every derived value is computed once,
 * when the row is made ({@link Measured#of}), and read back by name with {@link #value(String)}:
 * the run, the analysis, the checks and the exports all read the same numbers. Doubles are SI;
 * {@code NaN} writes an empty cell (not applicable).
 *
 * @param key where the point sits in the plan
 * @param conditions what it was measured at
 * @param measured what was measured, with every derived value
 * @param check empty, {@code pass} or {@code fail}
 * @param time when the reading arrived
 */
public record PointRow(Key key, Conditions conditions, Measured measured, String check, Instant time) {

    public PointRow {
        Objects.requireNonNull(key, "key");
        Objects.requireNonNull(conditions, "conditions");
        Objects.requireNonNull(measured, "measured");
        Objects.requireNonNull(check, "check");
        Objects.requireNonNull(time, "time");
    }

    /**
     * Where a point sits in the plan.
     *
     * @param point the planned point's index in the run (the resume key)
     * @param step the step's name
     * @param stepIndex the step's index, from 0
     * @param repeat the repeat number within the step, from 0
     */
    public record Key(int point, String step, int stepIndex, int repeat) {
        public Key {
            Objects.requireNonNull(step, "step");
        }
    }

    /**
     * A drive or bias source: its mode and value.
     *
     * @param mode {@code V} or {@code A}
     * @param value the level in V rms or A rms (drive), the DC value in V or A (bias; 0 when off)
     */
    public record Source(String mode, double value) {
    }

    /**
     * The conditions a point was measured at.
     *
     * @param quantity {@code impedance} or {@code voltage_ratio}
     * @param wiring {@code none}, {@code secondary_open} or {@code secondary_shorted}
     * @param frequencyHz test frequency in Hz
     * @param drive the AC drive
     * @param bias the DC bias applied
     */
    public record Conditions(String quantity, String wiring, double frequencyHz, Source drive, Source bias) {
    }

    /**
     * What was measured.
     *
     * @param status {@code ok}, {@code no_value}, or {@code implausible} (physics does not allow the
     *     reading: |θ| above 90° or |Z| beyond the meter's reach, twice; its values are kept but
     *     no check accepts them)
     * @param rOhm R in ohms (corrected when compensation applies), or the ratio's real part
     * @param xOhm X in ohms (corrected when compensation applies), or the ratio's imaginary part
     * @param ratio |V2/V1| for voltage-ratio rows, {@code NaN} otherwise
     * @param derived every derived parameter; all {@code NaN} for voltage-ratio rows and rows without a value
     * @param uncertainty the standard uncertainties of R, X and every derived parameter; unknown
     *     ({@link RowUncertainty#NONE}) when the meter states no accuracy for the point
     */
    public record Measured(String status, double rOhm, double xOhm, double ratio, Derived derived,
            RowUncertainty uncertainty) {
        public Measured {
            Objects.requireNonNull(status, "status");
            Objects.requireNonNull(derived, "derived");
            Objects.requireNonNull(uncertainty, "uncertainty");
        }

        /** Without uncertainty. */
        public Measured(String status, double rOhm, double xOhm, double ratio, Derived derived) {
            this(status, rOhm, xOhm, ratio, derived, RowUncertainty.NONE);
        }

        /**
         * The one way a measured value becomes a row's values: R and X (or the ratio's parts) at
         * the conditions' frequency, with every derived parameter computed here.
         *
         * @param ok whether the meter gave a value ({@code re}, {@code im} are ignored otherwise)
         */
        public static Measured of(Conditions c, boolean ok, double re, double im) {
            return of(c, ok, re, im, Double.NaN, Double.NaN, Double.NaN);
        }

        /**
         * As {@link #of(Conditions, boolean, double, double)}, with the standard uncertainties of R
         * and X and their correlation (NaN when unknown; ignored for a voltage ratio); the derived
         * parameters' uncertainties are computed here.
         */
        public static Measured of(Conditions c, boolean ok, double re, double im, double uROhm, double uXOhm,
                double correlation) {
            if (ok && "impedance".equals(c.quantity())) {
                Impedance z = new Impedance(c.frequencyHz(), re, im);
                return new Measured("ok", re, im, Double.NaN, Derived.of(z),
                        RowUncertainty.of(z, uROhm, uXOhm, correlation));
            }
            if (!ok) {
                return new Measured("no_value", Double.NaN, Double.NaN, Double.NaN, Derived.NONE);
            }
            if ("voltage_ratio".equals(c.quantity())) {
                return new Measured("ok", re, im, Math.hypot(re, im), Derived.NONE);
            }
            return new Measured("ok", re, im, Double.NaN, Derived.of(new Impedance(c.frequencyHz(), re, im)));
        }
    }

    /** This row with another status ({@code ok}, {@code no_value} or {@code implausible}); the values stay. */
    public PointRow withStatus(String newStatus) {
        return new PointRow(key, conditions, new Measured(newStatus, measured.rOhm(), measured.xOhm(), measured.ratio(),
                measured.derived(), measured.uncertainty()), check, time);
    }

    /** A row made from a reading: the derived values are computed by {@link Measured#of}. */
    public static PointRow of(Key key, Conditions conditions, boolean ok, double re, double im, String check,
            Instant time) {
        return new PointRow(key, conditions, Measured.of(conditions, ok, re, im), check, time);
    }

    /**
     * A row made from a reading and its uncertainty ({@code u} null when unknown; its value must be
     * the reading's).
     */
    public static PointRow of(Key key, Conditions conditions, boolean ok, double re, double im, UncertainImpedance u,
            String check, Instant time) {
        return new PointRow(key, conditions, u == null ? Measured.of(conditions, ok, re, im)
                : Measured.of(conditions, ok, re, im, u.uROhm(), u.uXOhm(), u.correlation()), check, time);
    }

    /** The standard uncertainties of R, X and every derived parameter (unknown: {@link RowUncertainty#NONE}). */
    public RowUncertainty uncertainty() {
        return measured.uncertainty();
    }

    /** This row with another check outcome ({@code ""}, {@code pass} or {@code fail}). */
    public PointRow withCheck(String outcome) {
        return new PointRow(key, conditions, measured, outcome, time);
    }

    /** This row with another arrival time. */
    public PointRow withTime(Instant t) {
        return new PointRow(key, conditions, measured, check, t);
    }

    /**
     * The value named {@code name}: any numeric column ({@code frequency_hz}, {@code level},
     * {@code bias}, {@code r_ohm}, {@code x_ohm}, {@code ratio}) or any derived parameter by its key
     * ({@code cs_f}, {@code g_s}, {@code delta_deg}, ...); {@code NaN} when the row has no such value.
     */
    public double value(String name) {
        return switch (name) {
            case "frequency_hz" -> frequencyHz();
            case "level" -> level();
            case "bias" -> bias();
            case "r_ohm" -> rOhm();
            case "x_ohm" -> xOhm();
            case "ratio" -> ratio();
            default -> derived().value(name);
        };
    }

    /** Whether the meter gave a value. */
    public boolean ok() {
        return "ok".equals(measured.status());
    }

    /** Whether this is an impedance row with a value. */
    public boolean okImpedance() {
        return ok() && "impedance".equals(conditions.quantity());
    }

    /** The row's impedance R + jX at its frequency (NaN parts for a row without a value). */
    public Impedance impedance() {
        return new Impedance(frequencyHz(), rOhm(), xOhm());
    }

    /** The planned point's index. */
    public int point() {
        return key.point();
    }

    /** The step's name. */
    public String step() {
        return key.step();
    }

    /** The step's index. */
    public int stepIndex() {
        return key.stepIndex();
    }

    /** The repeat number. */
    public int repeat() {
        return key.repeat();
    }

    /** {@code impedance} or {@code voltage_ratio}. */
    public String quantity() {
        return conditions.quantity();
    }

    /** The wiring. */
    public String wiring() {
        return conditions.wiring();
    }

    /** The test frequency in Hz. */
    public double frequencyHz() {
        return conditions.frequencyHz();
    }

    /** The drive mode, {@code V} or {@code A}. */
    public String driveMode() {
        return conditions.drive().mode();
    }

    /** The drive level in V rms or A rms. */
    public double level() {
        return conditions.drive().value();
    }

    /** The bias mode, {@code V} or {@code A}. */
    public String biasMode() {
        return conditions.bias().mode();
    }

    /** The DC bias in V or A. */
    public double bias() {
        return conditions.bias().value();
    }

    /** R in Ω (or the ratio's real part). */
    public double rOhm() {
        return measured.rOhm();
    }

    /** X in Ω (or the ratio's imaginary part). */
    public double xOhm() {
        return measured.xOhm();
    }

    /** |V2/V1|, or NaN. */
    public double ratio() {
        return measured.ratio();
    }

    /** Every derived parameter. */
    public Derived derived() {
        return measured.derived();
    }

    /** {@code ok} or {@code no_value}. */
    public String status() {
        return measured.status();
    }
}
