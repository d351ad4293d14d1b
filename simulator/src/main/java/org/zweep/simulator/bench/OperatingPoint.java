package org.zweep.simulator.bench;

/**
 * The conditions a level- or bias-dependent part sees.
 *
 * @param acVoltageRms AC voltage across the device in V rms
 * @param acCurrentRms AC current through the device in A rms
 * @param dcVoltageV DC voltage across the device in V
 * @param dcCurrentA DC current through the device in A
 */
record OperatingPoint(double acVoltageRms, double acCurrentRms, double dcVoltageV,
        double dcCurrentA) {

    static final OperatingPoint NONE = new OperatingPoint(0, 0, 0, 0);

    OperatingPoint withAc(double voltageRms, double currentRms) {
        return new OperatingPoint(voltageRms, currentRms, dcVoltageV, dcCurrentA);
    }
}
