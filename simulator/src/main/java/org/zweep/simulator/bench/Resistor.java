package org.zweep.simulator.bench;

import org.apache.commons.math3.complex.Complex;

/**
 * A resistor: R in series with its lead inductance, shunted by its body capacitance.
 *
 * @param resistanceOhm R in ohms
 * @param seriesInductanceH series inductance in H
 * @param parallelCapacitanceF parallel capacitance in F
 */
record Resistor(double resistanceOhm, double seriesInductanceH, double parallelCapacitanceF)
        implements Device {

    @Override
    public Complex impedance(double frequencyHz, OperatingPoint op, Wiring wiring) {
        double w = 2 * Math.PI * frequencyHz;
        Complex series = new Complex(resistanceOhm, w * seriesInductanceH);
        if (parallelCapacitanceF == 0) {
            return series;
        }
        return series.reciprocal().add(new Complex(0, w * parallelCapacitanceF)).reciprocal();
    }

    @Override
    public double dcResistanceOhm() {
        return resistanceOhm;
    }
}
