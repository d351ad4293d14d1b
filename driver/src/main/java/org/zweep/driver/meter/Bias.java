package org.zweep.driver.meter;

/**
 * The DC bias applied across the part while it is measured.
 *
 * @param mode voltage or current
 * @param value the DC value in V or A according to {@code mode}; may be negative
 * @param on whether the bias source is switched on; when off, {@code value} is kept but not applied
 */
public record Bias(SourceMode mode, double value, boolean on) {
    /** No bias: a voltage bias of 0 V, switched off. */
    public static final Bias OFF = new Bias(SourceMode.VOLTAGE, 0.0, false);

    /** A voltage bias of {@code volts} V DC, switched on. */
    public static Bias voltage(double volts) {
        return new Bias(SourceMode.VOLTAGE, volts, true);
    }

    /** A current bias of {@code amperes} A DC, switched on. */
    public static Bias current(double amperes) {
        return new Bias(SourceMode.CURRENT, amperes, true);
    }

    /** The bias actually applied: {@code value} when on, zero when off. */
    public double appliedValue() {
        return on ? value : 0.0;
    }
}
