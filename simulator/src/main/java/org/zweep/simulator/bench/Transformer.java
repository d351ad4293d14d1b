package org.zweep.simulator.bench;

import org.apache.commons.math3.complex.Complex;

/**
 * A two-winding transformer measured at its first winding: L1 and L2 coupled by
 * M = k·√(L1·L2), each with its winding resistance. With the second winding open the first reads
 * R1 + jωL1; shorted it reads R1 + jωL1 + (ωM)² / (R2 + jωL2). The open-circuit voltage ratio is
 * V2/V1 = jωM / (R1 + jωL1).
 *
 * @param primaryInductanceH L1 in H
 * @param secondaryInductanceH L2 in H
 * @param coupling k, greater than 0 and at most 1
 * @param primaryResistanceOhm R1 in ohms
 * @param secondaryResistanceOhm R2 in ohms
 */
record Transformer(double primaryInductanceH, double secondaryInductanceH, double coupling,
        double primaryResistanceOhm, double secondaryResistanceOhm) implements Device {

    double mutualInductanceH() {
        return coupling * Math.sqrt(primaryInductanceH * secondaryInductanceH);
    }

    @Override
    public Complex impedance(double frequencyHz, OperatingPoint op, Wiring wiring) {
        double w = 2 * Math.PI * frequencyHz;
        Complex primary = new Complex(primaryResistanceOhm, w * primaryInductanceH);
        if (wiring == Wiring.SECONDARY_OPEN) {
            return primary;
        }
        double wm = w * mutualInductanceH();
        Complex secondary = new Complex(secondaryResistanceOhm, w * secondaryInductanceH);
        return primary.add(secondary.reciprocal().multiply(wm * wm));
    }

    @Override
    public Complex voltageRatio(double frequencyHz, OperatingPoint op) {
        double w = 2 * Math.PI * frequencyHz;
        return new Complex(0, w * mutualInductanceH())
                .divide(new Complex(primaryResistanceOhm, w * primaryInductanceH));
    }

    @Override
    public double dcResistanceOhm() {
        return primaryResistanceOhm;
    }
}
