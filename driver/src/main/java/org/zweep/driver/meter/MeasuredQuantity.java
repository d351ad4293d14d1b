package org.zweep.driver.meter;

/** What one trigger measures. */
public enum MeasuredQuantity {
    /** Complex impedance across the meter's terminals, in ohms. */
    IMPEDANCE,
    /** Complex ratio of the voltage across a second winding to the drive voltage (dimensionless). */
    VOLTAGE_RATIO
}
