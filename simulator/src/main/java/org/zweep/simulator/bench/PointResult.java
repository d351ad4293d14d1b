package org.zweep.simulator.bench;

/**
 * What the simulated meter's front end measured for one {@link PointRequest}, before any
 * meter-side fixture correction.
 *
 * @param real real part: ohms for an impedance, in-phase part for a voltage ratio
 * @param imaginary imaginary part
 * @param overload the value was outside the range in use (the meter reports no value)
 * @param durationS how long the measurement takes on a real meter, in seconds (timing model)
 * @param deviceLevelRms the AC level actually across the device, in V rms
 * @param rangeUsedOhm the impedance range the point was measured in, in ohms
 */
public record PointResult(double real, double imaginary, boolean overload, double durationS,
        double deviceLevelRms, double rangeUsedOhm) {
}
