package org.zweep.runner.plan;

import org.zweep.driver.impedance.PartKind;

/**
 * The component under test.
 *
 * @param kind capacitor, inductor, resistor or transformer
 * @param name a label for reports (maker's part number or similar); may be empty
 * @param nominal the nominal value in SI units (F, H or Ω; for a transformer its primary inductance in H)
 * @param tolerancePercent the symmetric tolerance in percent (from an IEC 60062 letter or ±%); {@code NaN} when none
 * @param turnsRatio a transformer's nominal turns ratio N1/N2; {@code NaN} for other parts or when not given
 */
public record Part(PartKind kind, String name, double nominal, double tolerancePercent, double turnsRatio) {
    /** The SI unit of {@link #nominal()}: {@code F}, {@code H} or {@code Ω}. */
    public String nominalUnit() {
        return switch (kind) {
            case CAPACITOR -> "F";
            case INDUCTOR, TRANSFORMER -> "H";
            case RESISTOR -> "Ω";
        };
    }
}
