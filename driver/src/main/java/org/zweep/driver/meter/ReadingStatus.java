package org.zweep.driver.meter;

/** How the meter qualified a reading. */
public enum ReadingStatus {
    /** A valid value. */
    OK,
    /** The meter reported no value (SCPI 9.91E37): out of range or overloaded. */
    NO_VALUE
}
