package org.zweep.simulator.bench;

/**
 * One point the simulated meter is asked to measure, as its front end sees it.
 *
 * @param voltageRatio measure the voltage ratio V(second winding)/V(drive) instead of impedance
 * @param frequencyHz test frequency in Hz
 * @param drive whether the drive is a voltage or a current source
 * @param driveLevelRms drive level in V rms or A rms
 * @param bias whether the DC bias is a voltage or a current
 * @param biasValue DC bias in V or A
 * @param biasOn whether the bias source is on
 * @param averages averaging count (at least 1)
 * @param apertureS integration time per measurement in seconds
 * @param rangeUpperOhm held impedance range in ohms, or {@code NaN} for automatic ranging
 * @param noiseKey the key the point's noise is drawn from: the same key and seed give the same noise
 */
public record PointRequest(
        boolean voltageRatio,
        double frequencyHz,
        SourceKind drive,
        double driveLevelRms,
        SourceKind bias,
        double biasValue,
        boolean biasOn,
        int averages,
        double apertureS,
        double rangeUpperOhm,
        long noiseKey) {

    /** This request drawing its noise from {@code key}. */
    public PointRequest withNoiseKey(long key) {
        return new PointRequest(voltageRatio, frequencyHz, drive, driveLevelRms, bias, biasValue, biasOn, averages,
                apertureS, rangeUpperOhm, key);
    }
}
