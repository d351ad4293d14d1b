package org.zweep.runner.analysis;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The spread of repeated readings of one point (same step, frequency, level, bias, wiring).
 *
 * @param frequencyHz test frequency
 * @param level drive level
 * @param bias DC bias
 * @param wiring the wiring
 * @param count the number of readings
 * @param mean the mean of each statistic's column ({@code r_ohm}, {@code x_ohm} and the part's
 *     main column)
 * @param std the sample standard deviation (n − 1) of each
 * @param relativeSpread std/|mean| of each
 */
public record RepeatStats(double frequencyHz, double level, double bias, String wiring, int count,
        Map<String, Double> mean, Map<String, Double> std, Map<String, Double> relativeSpread) {
    public RepeatStats {
        mean = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(mean));
        std = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(std));
        relativeSpread = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(relativeSpread));
    }

}
