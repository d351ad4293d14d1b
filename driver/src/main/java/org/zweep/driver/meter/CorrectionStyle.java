package org.zweep.driver.meter;

/** How a meter's own fixture correction applies what it acquired. */
public enum CorrectionStyle {
    /**
     * One acquisition of a standard covers the meter's whole frequency range (the meter sweeps its
     * own grid when it acquires).
     */
    WHOLE_RANGE,
    /**
     * A standard is acquired at the frequency the meter is set to, and corrects only there: zweep
     * acquires each standard at every frequency of the plan.
     */
    AT_ACQUIRED_FREQUENCY
}
