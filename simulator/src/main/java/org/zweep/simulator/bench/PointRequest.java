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
 * @see #at(double)
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
        return toBuilder().noiseKey(key).build();
    }

    /**
     * A builder for an impedance point at {@code frequencyHz}: 1 V rms voltage drive, bias off (a
     * voltage source at 0), one average, 10 ms aperture, automatic ranging, noise key 1.
     */
    public static Builder at(double frequencyHz) {
        return new Builder(frequencyHz);
    }

    /** A builder holding this request's fields, to change some of them. */
    public Builder toBuilder() {
        return new Builder(frequencyHz).voltageRatio(voltageRatio).drive(drive, driveLevelRms)
                .bias(bias, biasValue, biasOn).averages(averages).apertureS(apertureS).rangeUpperOhm(rangeUpperOhm)
                .noiseKey(noiseKey);
    }

    /** Builds a {@link PointRequest} by field name. */
    public static final class Builder {
        private boolean voltageRatio;
        private final double frequencyHz;
        private SourceKind drive = SourceKind.VOLTAGE;
        private double driveLevelRms = 1.0;
        private SourceKind bias = SourceKind.VOLTAGE;
        private double biasValue;
        private boolean biasOn;
        private int averages = 1;
        private double apertureS = 0.01;
        private double rangeUpperOhm = Double.NaN;
        private long noiseKey = 1;

        private Builder(double frequencyHz) {
            this.frequencyHz = frequencyHz;
        }

        /** @see PointRequest#voltageRatio() */
        public Builder voltageRatio(boolean v) {
            voltageRatio = v;
            return this;
        }

        /** The drive source and its level in V rms or A rms. */
        public Builder drive(SourceKind kind, double levelRms) {
            drive = kind;
            driveLevelRms = levelRms;
            return this;
        }

        /** The DC bias source, its value in V or A, and whether it is on. */
        public Builder bias(SourceKind kind, double value, boolean on) {
            bias = kind;
            biasValue = value;
            biasOn = on;
            return this;
        }

        /** @see PointRequest#averages() */
        public Builder averages(int v) {
            averages = v;
            return this;
        }

        /** @see PointRequest#apertureS() */
        public Builder apertureS(double v) {
            apertureS = v;
            return this;
        }

        /** @see PointRequest#rangeUpperOhm() */
        public Builder rangeUpperOhm(double v) {
            rangeUpperOhm = v;
            return this;
        }

        /** @see PointRequest#noiseKey() */
        public Builder noiseKey(long v) {
            noiseKey = v;
            return this;
        }

        /** The request. */
        public PointRequest build() {
            return new PointRequest(voltageRatio, frequencyHz, drive, driveLevelRms, bias, biasValue, biasOn,
                    averages, apertureS, rangeUpperOhm, noiseKey);
        }
    }
}
