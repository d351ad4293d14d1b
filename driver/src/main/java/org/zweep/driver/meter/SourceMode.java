package org.zweep.driver.meter;

/** Whether a source (the AC drive or the DC bias) is set as a voltage or as a current. */
public enum SourceMode {
    /** Set in volts (V rms for the drive, V DC for the bias). */
    VOLTAGE,
    /** Set in amperes (A rms for the drive, A DC for the bias). */
    CURRENT;

    /** The SI unit symbol of this mode: {@code V} or {@code A}. */
    public String unit() {
        return this == VOLTAGE ? "V" : "A";
    }
}
