package org.zweep.simulator.bench;

import org.apache.commons.math3.complex.Complex;

/**
 * The fixture between the meter and the slot, and the load standard it can hold. The series
 * residual (and, in a 2-terminal configuration, the lead resistance) sits on the meter side; the
 * stray admittance sits across the slot.
 *
 * @param terminals 2-terminal or 4-terminal (Kelvin)
 * @param residualResistanceOhm series residual resistance in ohms
 * @param residualInductanceH series residual inductance in H
 * @param strayConductanceS stray conductance across the slot in S
 * @param strayCapacitanceF stray capacitance across the slot in F
 * @param leadResistanceOhm resistance of the leads (both together) in ohms
 * @param loadResistanceOhm the load standard's resistance in ohms
 * @param loadInductanceH the load standard's series inductance in H
 */
record FixtureSpec(TerminalConfiguration terminals, double residualResistanceOhm, double residualInductanceH,
        double strayConductanceS, double strayCapacitanceF, double leadResistanceOhm,
        double loadResistanceOhm, double loadInductanceH) {

    static FixtureSpec defaults() {
        return new FixtureSpec(TerminalConfiguration.FOUR_TERMINAL, 5e-3, 5e-9, 1e-10, 0.3e-12, 0.05, 100, 0);
    }

    /** No residuals, no strays, no lead resistance; the same load standard. */
    FixtureSpec ideal() {
        return new FixtureSpec(terminals, 0, 0, 0, 0, 0, loadResistanceOhm, loadInductanceH);
    }

    /** Everything in series between the meter and the slot, in ohms. */
    Complex seriesImpedance(double frequencyHz) {
        double lead = terminals == TerminalConfiguration.TWO_TERMINAL ? leadResistanceOhm : 0;
        return new Complex(residualResistanceOhm + lead,
                2 * Math.PI * frequencyHz * residualInductanceH);
    }

    /** Series resistance between the meter and the slot at DC, in ohms. */
    double seriesResistanceOhm() {
        return residualResistanceOhm
                + (terminals == TerminalConfiguration.TWO_TERMINAL ? leadResistanceOhm : 0);
    }

    /** The stray admittance across the slot, in siemens. */
    Complex strayAdmittance(double frequencyHz) {
        return new Complex(strayConductanceS, 2 * Math.PI * frequencyHz * strayCapacitanceF);
    }

    /** The load standard's impedance, in ohms. */
    Complex loadImpedance(double frequencyHz) {
        return new Complex(loadResistanceOhm, 2 * Math.PI * frequencyHz * loadInductanceH);
    }
}
