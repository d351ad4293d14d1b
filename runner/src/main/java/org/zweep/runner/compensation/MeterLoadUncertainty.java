package org.zweep.runner.compensation;

import org.zweep.driver.meter.Reading;
import org.zweep.driver.uncertainty.MeterAccuracy;
import org.zweep.driver.uncertainty.UncertainImpedance;
import org.zweep.runner.engine.ReadingCorrector;

/**
 * Meter-side open/short/load: the meter corrects its readings itself (they pass unchanged), and
 * its stated accuracy is that of a corrected reading; what it cannot state is the uncertainty of
 * the load standard's value it was given, which is added here
 * ({@link HostCorrector#loadValueContribution}). Immutable.
 */
final class MeterLoadUncertainty implements ReadingCorrector {
    private final UncertainImpedance loadStated;

    MeterLoadUncertainty(UncertainImpedance loadStated) {
        this.loadStated = loadStated;
    }

    @Override
    public Reading correct(Reading raw) {
        return raw;
    }

    @Override
    public UncertainImpedance uncertainty(Reading raw, UncertainImpedance rawU, MeterAccuracy accuracy) {
        return rawU == null ? null : rawU.plus(HostCorrector.loadValueContribution(rawU.value(), loadStated));
    }
}
