package org.zweep.runner.plan;

/**
 * A pass/fail limit on a measured or derived figure.
 *
 * @param name a label for the check, unique within the sequence
 * @param parameter a point parameter by its result column name ({@code cs_f}, {@code d},
 *     {@code g_s}, {@code ratio}, ...), or a whole-sweep figure: {@code srf_hz} (the self-resonant
 *     frequency) or {@code saturation} (the DC bias where the part's value has fallen by
 *     {@code dropPercent})
 * @param step the step it applies to, by name
 * @param selection the points it judges
 * @param bounds the passing interval
 * @param dropPercent for {@code saturation}, the drop in percent; {@code NaN} otherwise
 */
public record CheckLimit(String name, String parameter, String step, Selection selection, Bounds bounds,
        double dropPercent) {

    /** The whole-sweep figure of the self-resonant frequency. */
    public static final String SRF = "srf_hz";
    /** The whole-sweep figure of the bias at a stated drop. */
    public static final String SATURATION = "saturation";

    /**
     * The points of the step a check judges; {@code NaN} selects any value.
     *
     * @param frequencyHz the test frequency in Hz; {@code NaN} for a whole-sweep figure such as {@code srf_hz}
     * @param bias the DC bias in V or A
     * @param level the drive level in V rms or A rms
     */
    public record Selection(double frequencyHz, double bias, double level) {
        /** Every point (or the whole sweep). */
        public static final Selection ANY = new Selection(Double.NaN, Double.NaN, Double.NaN);

        /** The points at {@code frequencyHz}, any bias and level. */
        public static Selection at(double frequencyHz) {
            return new Selection(frequencyHz, Double.NaN, Double.NaN);
        }
    }

    /**
     * The passing interval, limits included.
     *
     * @param min the lowest passing value in SI units; {@code Double.NEGATIVE_INFINITY} for none
     * @param max the highest passing value in SI units; {@code Double.POSITIVE_INFINITY} for none
     */
    public record Bounds(double min, double max) {
        /** Whether {@code value} passes (NaN never passes). */
        public boolean passes(double value) {
            return value >= min && value <= max;
        }
    }

    /** A point check on {@code parameter} at {@code frequencyHz} ({@code NaN}: a whole-sweep figure). */
    public CheckLimit(String name, String parameter, String step, double frequencyHz, double min, double max) {
        this(name, parameter, step, Selection.at(frequencyHz), new Bounds(min, max), Double.NaN);
    }

    /** Whether this check judges a whole sweep ({@code srf_hz}, {@code saturation}, a fitted or transformer figure) rather than points. */
    public boolean wholeSweep() {
        return SATURATION.equals(parameter) || Double.isNaN(selection.frequencyHz());
    }

    /** The selected frequency, {@code NaN} for any. */
    public double frequencyHz() {
        return selection.frequencyHz();
    }

    /** The lowest passing value; {@code Double.NEGATIVE_INFINITY} for none. */
    public double min() {
        return bounds.min();
    }

    /** The highest passing value; {@code Double.POSITIVE_INFINITY} for none. */
    public double max() {
        return bounds.max();
    }

    /** Whether {@code value} passes (limits included; NaN never passes). */
    public boolean passes(double value) {
        return bounds.passes(value);
    }
}
