package org.zweep.driver.meter;

import java.util.Set;

/**
 * What a meter can do, as its dialect declares it.
 *
 * @param frequencyHz test frequencies in Hz
 * @param voltageLevelVrms drive levels in V rms
 * @param currentLevelArms drive levels in A rms
 * @param biasVoltageV DC bias voltages in V
 * @param biasCurrentA DC bias currents in A
 * @param maxListPoints the most points one list sweep may hold; 0 when the meter cannot sweep a list
 * @param corrections the fixture corrections the meter can acquire itself (may be empty)
 * @param voltageRatio whether the meter can measure a voltage ratio (for transformer turns ratio)
 * @param correctionStyle how the meter's own correction applies what it acquired
 */
public record MeterCapabilities(
        Interval frequencyHz,
        Interval voltageLevelVrms,
        Interval currentLevelArms,
        Interval biasVoltageV,
        Interval biasCurrentA,
        int maxListPoints,
        Set<CorrectionStandard> corrections,
        boolean voltageRatio,
        CorrectionStyle correctionStyle) {

    public MeterCapabilities {
        corrections = Set.copyOf(corrections);
        java.util.Objects.requireNonNull(correctionStyle, "correctionStyle");
    }

    /** Capabilities of a meter whose correction covers its whole range ({@link CorrectionStyle#WHOLE_RANGE}). */
    public MeterCapabilities(Interval frequencyHz, Interval voltageLevelVrms, Interval currentLevelArms, Interval biasVoltageV,
            Interval biasCurrentA, int maxListPoints, Set<CorrectionStandard> corrections, boolean voltageRatio) {
        this(frequencyHz, voltageLevelVrms, currentLevelArms, biasVoltageV, biasCurrentA, maxListPoints, corrections,
                voltageRatio, CorrectionStyle.WHOLE_RANGE);
    }

    /** Whether a whole list of points can be measured with one trigger. */
    public boolean listSweep() {
        return maxListPoints > 0;
    }
}
