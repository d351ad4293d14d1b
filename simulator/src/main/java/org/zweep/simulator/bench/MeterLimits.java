package org.zweep.simulator.bench;

/**
 * The simulated meter's limits; a setting outside them is refused (SCPI -222) and left unchanged.
 *
 * @param minFrequencyHz lowest test frequency in Hz
 * @param maxFrequencyHz highest test frequency in Hz
 * @param minVoltageVrms lowest voltage drive in V rms
 * @param maxVoltageVrms highest voltage drive in V rms
 * @param minCurrentArms lowest current drive in A rms
 * @param maxCurrentArms highest current drive in A rms
 * @param maxBiasVoltageV largest DC bias voltage magnitude in V
 * @param maxBiasCurrentA largest DC bias current magnitude in A
 * @param maxListPoints most points in one list sweep
 * @param rangesOhm the impedance ranges' upper limits in ohms, ascending
 * @param sourceResistanceOhm the source's output resistance in ohms
 */
public record MeterLimits(
        double minFrequencyHz,
        double maxFrequencyHz,
        double minVoltageVrms,
        double maxVoltageVrms,
        double minCurrentArms,
        double maxCurrentArms,
        double maxBiasVoltageV,
        double maxBiasCurrentA,
        int maxListPoints,
        double[] rangesOhm,
        double sourceResistanceOhm) {

    public MeterLimits {
        rangesOhm = rangesOhm.clone();
    }

    @Override
    public double[] rangesOhm() {
        return rangesOhm.clone();
    }
}
