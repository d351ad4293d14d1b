package org.zweep.runner.plan;

/** The kind of component a sequence characterises. */
public enum PartKind {
    CAPACITOR,
    INDUCTOR,
    RESISTOR,
    TRANSFORMER
}
