package org.zweep.runner.plan;

/** Where fixture compensation is done. */
public enum CompensationMode {
    /** No compensation. */
    NONE,
    /** The meter acquires the standards and corrects its readings itself. */
    METER,
    /** zweep measures the standards at every sweep point and corrects each reading. */
    HOST
}
