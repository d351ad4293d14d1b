package org.zweep.runner.plan;

/**
 * Limits a run must never exceed, checked before any command is sent to the meter.
 *
 * @param maxBiasVoltageV largest DC bias voltage magnitude in V
 * @param maxBiasCurrentA largest DC bias current magnitude in A
 * @param maxLevelVrms largest AC drive voltage in V rms
 * @param maxLevelArms largest AC drive current in A rms
 */
public record SafetyLimits(double maxBiasVoltageV, double maxBiasCurrentA, double maxLevelVrms, double maxLevelArms) {
}
