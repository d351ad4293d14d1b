package org.zweep.runner.results;

import org.zweep.driver.impedance.Impedance;

/** Bridges to the impedance domain's derived-parameter table (temporary local formulas until it lands). */
final class DerivedTable {
    private DerivedTable() {
    }

    static Derived of(Impedance z) {
        double r = z.resistanceOhm();
        double x = z.reactanceOhm();
        double w = z.omega();
        double mag2 = r * r + x * x;
        double rp = mag2 / r;
        double xp = mag2 / x;
        return new Derived(z.magnitudeOhm(), z.phaseDeg(), -1.0 / (w * x), -1.0 / (w * xp), x / w, xp / w, r, rp,
                r / Math.abs(x), Math.abs(x) / r);
    }
}
