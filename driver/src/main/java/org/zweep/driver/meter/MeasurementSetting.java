package org.zweep.driver.meter;

/**
 * Everything the meter is told before it measures one point.
 *
 * @param quantity what is measured (impedance unless a transformer ratio is wanted)
 * @param frequencyHz test frequency in Hz (positive)
 * @param drive the AC test signal
 * @param bias the DC bias
 * @param averagingCount how many measurements the meter averages into one reading (at least 1)
 * @param integrationTimeS the meter's integration (aperture) time per measurement, in seconds (positive)
 * @param range the impedance range
 */
public record MeasurementSetting(
        MeasuredQuantity quantity,
        double frequencyHz,
        Drive drive,
        Bias bias,
        int averagingCount,
        double integrationTimeS,
        ImpedanceRange range) {

    /**
     * The integration time a setting carries when nothing asks for another, in s. A meter without an
     * integration-time setting accepts only this value (it integrates as it does).
     */
    public static final double DEFAULT_INTEGRATION_TIME_S = 0.02;

    /** An impedance setting at {@code frequencyHz} with a 1 V rms drive, no bias, no averaging, 20 ms integration, auto range. */
    public static MeasurementSetting at(double frequencyHz) {
        return new MeasurementSetting(MeasuredQuantity.IMPEDANCE, frequencyHz, Drive.voltage(1.0), Bias.OFF, 1,
                DEFAULT_INTEGRATION_TIME_S, ImpedanceRange.AUTO);
    }

    /** This setting at another frequency. */
    public MeasurementSetting withFrequencyHz(double hz) {
        return new MeasurementSetting(quantity, hz, drive, bias, averagingCount, integrationTimeS, range);
    }

    /** This setting with another drive. */
    public MeasurementSetting withDrive(Drive d) {
        return new MeasurementSetting(quantity, frequencyHz, d, bias, averagingCount, integrationTimeS, range);
    }

    /** This setting with another bias. */
    public MeasurementSetting withBias(Bias b) {
        return new MeasurementSetting(quantity, frequencyHz, drive, b, averagingCount, integrationTimeS, range);
    }

    /** This setting with another averaging count. */
    public MeasurementSetting withAveragingCount(int n) {
        return new MeasurementSetting(quantity, frequencyHz, drive, bias, n, integrationTimeS, range);
    }

    /** This setting with another integration time in seconds. */
    public MeasurementSetting withIntegrationTimeS(double s) {
        return new MeasurementSetting(quantity, frequencyHz, drive, bias, averagingCount, s, range);
    }

    /** This setting with another range. */
    public MeasurementSetting withRange(ImpedanceRange r) {
        return new MeasurementSetting(quantity, frequencyHz, drive, bias, averagingCount, integrationTimeS, r);
    }

    /** This setting measuring another quantity. */
    public MeasurementSetting withQuantity(MeasuredQuantity q) {
        return new MeasurementSetting(q, frequencyHz, drive, bias, averagingCount, integrationTimeS, range);
    }
}
