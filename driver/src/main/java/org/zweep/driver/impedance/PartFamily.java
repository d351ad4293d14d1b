package org.zweep.driver.impedance;

/** What kind of part an impedance belongs to, as far as the choice of equivalent circuit cares. */
public enum PartFamily {
    /** A capacitor: its main loss is usually dielectric leakage, across the part. */
    CAPACITOR,
    /** An inductor or transformer winding: its main loss is usually winding resistance, in series. */
    INDUCTOR,
    /** A resistor, or any part of unknown kind: decided by the sign of the reactance. */
    OTHER
}
