package org.zweep.simulator.bench;

import org.apache.commons.math3.complex.Complex;

/**
 * An inductor: L in series with its winding resistance, shunted by the winding capacitance (the
 * self-resonance) and by a resistance standing for core loss. The core saturates with the peak
 * winding current I = |Idc| + √2·Iac: L(I) = L0 / (1 + (I/I½)^n), which halves at I½.
 *
 * @param inductanceH L0 at no current, in H
 * @param windingResistanceOhm series winding resistance in ohms
 * @param parallelCapacitanceF winding capacitance in F (0 for none)
 * @param coreLossResistanceOhm parallel core-loss resistance in ohms; infinite for none
 * @param saturationCurrentA I½: the peak current at which L falls to half, in A; infinite for none
 * @param saturationExponent n of the saturation curve
 */
record Inductor(double inductanceH, double windingResistanceOhm, double parallelCapacitanceF,
        double coreLossResistanceOhm, double saturationCurrentA, double saturationExponent)
        implements Device {

    /** L at the given DC and AC winding current, in H. */
    double inductanceAt(double dcCurrentA, double acCurrentRms) {
        if (Double.isInfinite(saturationCurrentA)) {
            return inductanceH;
        }
        double peak = Math.abs(dcCurrentA) + Math.sqrt(2) * acCurrentRms;
        return inductanceH / (1 + Math.pow(peak / saturationCurrentA, saturationExponent));
    }

    @Override
    public Complex impedance(double frequencyHz, OperatingPoint op, Wiring wiring) {
        double w = 2 * Math.PI * frequencyHz;
        double l = inductanceAt(op.dcCurrentA(), op.acCurrentRms());
        Complex winding = new Complex(windingResistanceOhm, w * l);
        Complex admittance = winding.reciprocal().add(new Complex(
                Double.isInfinite(coreLossResistanceOhm) ? 0 : 1 / coreLossResistanceOhm,
                w * parallelCapacitanceF));
        return admittance.reciprocal();
    }

    @Override
    public boolean levelDependent() {
        return !Double.isInfinite(saturationCurrentA);
    }

    @Override
    public double dcResistanceOhm() {
        return Double.isInfinite(coreLossResistanceOhm) ? windingResistanceOhm
                : windingResistanceOhm * coreLossResistanceOhm
                        / (windingResistanceOhm + coreLossResistanceOhm);
    }
}
