package org.zweep.driver.meter;

import java.time.Instant;
import org.zweep.driver.impedance.Impedance;

/**
 * One point as the meter returned it.
 *
 * @param setting the setting as applied when the point was measured
 * @param real real part: R in ohms for an impedance, the in-phase part for a voltage ratio
 * @param imaginary imaginary part: X in ohms for an impedance, the quadrature part for a ratio
 * @param status whether the value is valid ({@code NaN} parts when not)
 * @param timestamp when the reading arrived at the host
 */
public record Reading(MeasurementSetting setting, double real, double imaginary, ReadingStatus status,
        Instant timestamp) {

    /** The reading as an impedance at the setting's frequency (meaningful when the quantity is impedance). */
    public Impedance impedance() {
        return new Impedance(setting.frequencyHz(), real, imaginary);
    }

    /** The magnitude of the reading: |Z| in ohms, or the voltage ratio |V2/V1|. */
    public double magnitude() {
        return Math.hypot(real, imaginary);
    }
}
