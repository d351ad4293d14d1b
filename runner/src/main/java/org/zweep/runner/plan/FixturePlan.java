package org.zweep.runner.plan;

import java.time.Duration;
import java.util.List;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.uncertainty.UncertainImpedance;

/**
 * How the fixture is connected and compensated.
 *
 * @param terminals 2- or 4-terminal
 * @param compensation none, meter-side or host-side
 * @param standards the standards to acquire, in order (e.g. OPEN, SHORT or OPEN, SHORT, LOAD); empty with NONE
 * @param loadStandard the load standard's known impedance (its frequency is ignored: R + jX held constant);
 *     {@code null} when no LOAD is used
 * @param reuseYoungerThan stored compensation data younger than this is reused instead of measured
 *     again; {@link Duration#ZERO} means always measure
 * @param store a folder to keep host-side compensation data in for reuse; {@code null} means the run folder
 * @param loadStandardU the load standard's stated value with its standard uncertainty (the value is
 *     {@code loadStandard}'s); exact when none is stated; {@code null} when no LOAD is used
 */
public record FixturePlan(
        TerminalConfiguration terminals,
        CompensationMode compensation,
        List<CorrectionStandard> standards,
        Impedance loadStandard,
        Duration reuseYoungerThan,
        java.nio.file.Path store,
        UncertainImpedance loadStandardU) {

    public FixturePlan {
        standards = List.copyOf(standards);
        if (loadStandardU == null && loadStandard != null) {
            loadStandardU = UncertainImpedance.exact(loadStandard);
        }
    }

    /** With the load standard's value taken as exact. */
    public FixturePlan(TerminalConfiguration terminals, CompensationMode compensation, List<CorrectionStandard> standards,
            Impedance loadStandard, Duration reuseYoungerThan, java.nio.file.Path store) {
        this(terminals, compensation, standards, loadStandard, reuseYoungerThan, store, null);
    }
}
