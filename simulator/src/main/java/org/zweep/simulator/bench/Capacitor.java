package org.zweep.simulator.bench;

import org.apache.commons.math3.complex.Complex;

/**
 * A capacitor: C with dielectric loss tan δ, in series with ESR and ESL. Class-2 dielectrics lose
 * capacitance under DC bias, C(V) = C0 / (1 + (|V|/V½)^n), which halves at V½, and gain a little
 * with AC level, × (1 + a·Vac).
 *
 * @param capacitanceF C0 at no bias and vanishing AC level, in F
 * @param esrOhm equivalent series resistance in ohms
 * @param eslH equivalent series inductance in H
 * @param tanDelta dielectric loss tangent (dimensionless)
 * @param biasHalfVoltageV DC bias at which C falls to half, in V; infinite for no derating
 * @param biasExponent n of the derating curve
 * @param levelCoefficientPerVrms a: relative rise of C per V rms of AC level
 */
record Capacitor(double capacitanceF, double esrOhm, double eslH, double tanDelta,
        double biasHalfVoltageV, double biasExponent, double levelCoefficientPerVrms)
        implements Device {

    /** C at the given DC and AC voltage, in F. */
    double capacitanceAt(double dcVoltageV, double acVoltageRms) {
        double derating = Double.isInfinite(biasHalfVoltageV) ? 1
                : 1 / (1 + Math.pow(Math.abs(dcVoltageV) / biasHalfVoltageV, biasExponent));
        return capacitanceF * derating * (1 + levelCoefficientPerVrms * acVoltageRms);
    }

    @Override
    public Complex impedance(double frequencyHz, OperatingPoint op, Wiring wiring) {
        double w = 2 * Math.PI * frequencyHz;
        double c = capacitanceAt(op.dcVoltageV(), op.acVoltageRms());
        Complex admittance = new Complex(w * c * tanDelta, w * c);
        return new Complex(esrOhm, w * eslH).add(admittance.reciprocal());
    }

    @Override
    public boolean levelDependent() {
        return !Double.isInfinite(biasHalfVoltageV) || levelCoefficientPerVrms != 0;
    }

    @Override
    public double dcResistanceOhm() {
        return Double.POSITIVE_INFINITY;
    }
}
