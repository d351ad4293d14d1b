package org.zweep.simulator.bench;

import org.apache.commons.math3.complex.Complex;

/** What sits in the fixture when the slot holds the device: a part model or a netlist. */
interface Device {

    /**
     * The impedance between the device's terminals.
     *
     * @param frequencyHz test frequency in Hz
     * @param op AC level and DC bias at the device
     * @param wiring how a transformer's second winding is connected (ignored by other devices)
     */
    Complex impedance(double frequencyHz, OperatingPoint op, Wiring wiring);

    /**
     * V(second winding, open) / V(first winding); zero for a device without a second winding.
     */
    default Complex voltageRatio(double frequencyHz, OperatingPoint op) {
        return Complex.ZERO;
    }

    /** Whether the impedance depends on the AC level or DC bias (the bench then iterates). */
    default boolean levelDependent() {
        return false;
    }

    /** DC resistance between the terminals in ohms; {@code +Infinity} when DC is blocked. */
    double dcResistanceOhm();

    /** The parallel combination of {@code a} and {@code b}. */
    static Complex parallel(Complex a, Complex b) {
        return a.multiply(b).divide(a.add(b));
    }
}
