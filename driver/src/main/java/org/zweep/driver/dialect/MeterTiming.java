package org.zweep.driver.dialect;

import java.util.List;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Interval;

/**
 * How long a meter works on what it is asked, as its dialect's {@code [timing]} section declares.
 * The one timing model of zweep: the driver's reply deadlines (expected time plus the slack the
 * user allows) and the runner's run-time estimates both come from it.
 *
 * <p>One point takes {@code pointOverheadS + averages · max(integration time, minPeriods / f)},
 * plus {@code biasSettleS} when its DC bias (on/off, kind or value) differs from the point
 * measured before, plus {@code rangeChangeS} when its impedance range setting differs. A list
 * sweep is the sum of its points. A correction standard is acquired on a log grid of
 * {@code correctionPointsPerDecade} points per decade over the meter's frequency range, each a
 * point at the current setting. Immutable.
 *
 * @param pointOverheadS fixed time per measured point (trigger, ranging, computing), in s
 * @param minPeriods the fewest periods of the test frequency one integration covers
 * @param biasSettleS extra time for a point whose DC bias differs from the one before, in s
 * @param rangeChangeS extra time for a point whose impedance range setting differs from the one before, in s
 * @param correctionPointsPerDecade points per decade of the grid a correction standard is acquired on
 */
public record MeterTiming(double pointOverheadS, double minPeriods, double biasSettleS, double rangeChangeS,
        int correctionPointsPerDecade) {

    /** What a dialect without a {@code [timing]} section is assumed to take. */
    public static final MeterTiming DEFAULT = new MeterTiming(0.01, 2, 0.05, 0, 10);

    public MeterTiming {
        if (!(pointOverheadS >= 0) || !(minPeriods >= 0) || !(biasSettleS >= 0) || !(rangeChangeS >= 0)
                || correctionPointsPerDecade < 1) {
            throw new IllegalArgumentException("timing values must be finite and not negative");
        }
    }

    /**
     * The expected time of measuring one point at {@code s}, in s.
     *
     * @param previous the setting of the point measured before on this meter, or {@code null}
     *     when unknown (the meter then counts as fresh: bias off, automatic range)
     */
    public double pointS(MeasurementSetting s, MeasurementSetting previous) {
        double integration = Math.max(s.integrationTimeS(), minPeriods / s.frequencyHz());
        double t = pointOverheadS + s.averagingCount() * integration;
        if (biasDiffers(s.bias(), previous == null ? Bias.OFF : previous.bias())) {
            t += biasSettleS;
        }
        if (previous == null ? !s.range().auto() : !s.range().equals(previous.range())) {
            t += rangeChangeS;
        }
        return t;
    }

    /** The expected time of a list sweep (or of its points one by one) after {@code previous}, in s. */
    public double sweepS(List<MeasurementSetting> points, MeasurementSetting previous) {
        double t = 0;
        MeasurementSetting before = previous;
        for (MeasurementSetting s : points) {
            t += pointS(s, before);
            before = s;
        }
        return t;
    }

    /**
     * The expected time of acquiring one correction standard at setting {@code at} (its frequency
     * ignored) over {@code frequencyHz}, the meter's frequency range, in s.
     */
    public double correctionS(MeasurementSetting at, Interval frequencyHz) {
        double lo = Math.log10(frequencyHz.min());
        double hi = Math.log10(frequencyHz.max());
        int n = Math.max(2, (int) Math.ceil((hi - lo) * correctionPointsPerDecade) + 1);
        double t = 0;
        for (int i = 0; i < n; i++) {
            double f = Math.pow(10, lo + (hi - lo) * i / (n - 1));
            t += pointS(at.withFrequencyHz(f), at);
        }
        return t;
    }

    /** Whether two biases differ as the meter sees them: off is off, whatever kind and value are set. */
    static boolean biasDiffers(Bias a, Bias b) {
        if (!a.on() && !b.on()) {
            return false;
        }
        return a.on() != b.on() || a.mode() != b.mode() || a.value() != b.value();
    }
}
