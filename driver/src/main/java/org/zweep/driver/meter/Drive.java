package org.zweep.driver.meter;

/**
 * The AC test signal: a voltage in V rms or a current in A rms.
 *
 * @param mode voltage or current
 * @param levelRms the rms level, in V or A according to {@code mode} (positive)
 */
public record Drive(SourceMode mode, double levelRms) {
    /** A voltage drive of {@code volts} V rms. */
    public static Drive voltage(double volts) {
        return new Drive(SourceMode.VOLTAGE, volts);
    }

    /** A current drive of {@code amperes} A rms. */
    public static Drive current(double amperes) {
        return new Drive(SourceMode.CURRENT, amperes);
    }
}
