package org.zweep.runner.results;

import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/** Bridges to the impedance domain's derived-parameter table, whose names are the column names. */
final class DerivedTable {
    private DerivedTable() {
    }

    static Derived of(Impedance z) {
        return new Derived(DerivedParameter.Z.of(z), DerivedParameter.THETA.of(z), DerivedParameter.CS.of(z),
                DerivedParameter.CP.of(z), DerivedParameter.LS.of(z), DerivedParameter.LP.of(z),
                DerivedParameter.RS.of(z), DerivedParameter.RP.of(z), DerivedParameter.D.of(z),
                DerivedParameter.Q.of(z));
    }
}
