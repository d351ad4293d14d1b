package org.zweep.runner.engine;

import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.driver.meter.SourceMode;
import org.zweep.driver.uncertainty.MeterAccuracy;
import org.zweep.driver.uncertainty.UncertainImpedance;

/**
 * The standard uncertainty of every measured point: the meter's stated accuracy at the point's
 * frequency, drive level and integration time (read as its dialect says: rectangular unless
 * stated as k = 2), propagated through the host-side correction together with the uncertainty of
 * each compensation standard's reading (see {@link ReadingCorrector#uncertainty}). Repeatability
 * (Type A) enters where repeats are combined, in the analysis. Immutable; thread-safe when the
 * corrector is.
 */
public final class PointUncertainty {
    /** No stated accuracy: every point's uncertainty is unknown. */
    public static final PointUncertainty NONE = new PointUncertainty(null, ReadingCorrector.NONE);

    private final MeterAccuracy accuracy;
    private final ReadingCorrector corrector;

    /**
     * @param accuracy the meter's stated accuracy; null for none
     * @param corrector the host-side correction the readings go through ({@link ReadingCorrector#NONE} for none)
     */
    public PointUncertainty(MeterAccuracy accuracy, ReadingCorrector corrector) {
        this.accuracy = accuracy;
        this.corrector = corrector;
    }

    /**
     * The uncertainty of the corrected value of {@code raw}; null for a voltage ratio, a reading
     * without a value, or a point no row of the stated accuracy covers.
     */
    public UncertainImpedance of(Reading raw) {
        if (accuracy == null || raw.status() != ReadingStatus.OK
                || raw.setting().quantity() != MeasuredQuantity.IMPEDANCE) {
            return null;
        }
        MeasurementSetting s = raw.setting();
        return accuracy.uncertainty(new Impedance(s.frequencyHz(), raw.real(), raw.imaginary()), s.drive().levelRms(),
                s.drive().mode() == SourceMode.CURRENT, s.integrationTimeS())
                .map(u -> corrector.uncertainty(raw, u, accuracy))
                .orElse(null);
    }
}
