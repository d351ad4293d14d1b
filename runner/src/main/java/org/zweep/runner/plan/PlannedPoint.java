package org.zweep.runner.plan;

import org.zweep.driver.meter.MeasurementSetting;

/**
 * One point the engine will measure, in measuring order.
 *
 * @param index position in the whole run, from 0; the key for resume and for simulator noise
 * @param stepIndex index of the step it belongs to, from 0
 * @param repeat repeat number within its step, from 0
 * @param setting what the meter is set to
 * @param wiring how a transformer's second winding is connected
 * @param delayS extra wait before measuring, in seconds (0 for none)
 */
public record PlannedPoint(int index, int stepIndex, int repeat, MeasurementSetting setting, Wiring wiring,
        double delayS) {
}
