package org.zweep.runner.engine;

import org.zweep.driver.impedance.Unit;
import org.zweep.runner.text.Figures;
import java.util.Locale;
import java.util.Optional;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;

/**
 * What physics allows a reading of a passive part in a passive fixture: a phase within ±90°
 * (no negative resistance) and an impedance the meter can measure at all. A reading outside is
 * measured again; a second one outside too is stored with status {@code implausible}.
 *
 * @param maxImpedanceOhm the largest |Z| the meter can read (ten times its top range), or
 *     infinity when unknown
 */
record Plausibility(double maxImpedanceOhm) {
    /** No limit on |Z|: only the phase is checked. */
    static final Plausibility PHASE_ONLY = new Plausibility(Double.POSITIVE_INFINITY);

    /** What is wrong with {@code r}, or empty when physics allows it (or it is not an impedance). */
    Optional<String> problem(Reading r) {
        if (r.status() != ReadingStatus.OK || r.setting() == null
                || r.setting().quantity() != MeasuredQuantity.IMPEDANCE) {
            return Optional.empty();
        }
        if (!Double.isFinite(r.real()) || !Double.isFinite(r.imaginary())) {
            return Optional.of("R or X is not a finite number");
        }
        if (r.real() < 0) {
            double thetaDeg = Math.toDegrees(Math.atan2(r.imaginary(), r.real()));
            return Optional.of(String.format(Locale.ROOT, "θ = %.2f° (R = %s), beyond the ±90° a passive part"
                    + " allows", thetaDeg, Figures.format(r.real(), Unit.OHM)));
        }
        double z = r.magnitude();
        if (z > maxImpedanceOhm) {
            return Optional.of("|Z| = " + Figures.format(z, Unit.OHM) + ", beyond what the meter can read ("
                    + Figures.format(maxImpedanceOhm, Unit.OHM) + ")");
        }
        return Optional.empty();
    }
}
