package org.zweep.simulator.bench;

import java.util.List;

/**
 * The accuracy the simulated meter states for itself, in the generic data-sheet form: the limit of
 * the relative error of |Z| is A + Zs/|Z| + Yo·|Z| and that of the phase (radians) the same with A
 * replaced by a phase term when one is given, from a table of bands by frequency, drive level
 * and integration time. When a bench states one, every reading in a covered band carries an error
 * drawn from exactly that statement (see {@link SimulatedBench}), so the claim can be checked.
 *
 * @param bands the table; the band covering the point with the longest integration time not
 *     above the point's applies
 * @param normal whether the limits are expanded uncertainties with k = 2 (errors normal with
 *     σ = limit/2); otherwise errors are uniform within ± limit
 */
record StatedAccuracy(List<Band> bands, boolean normal) {

    StatedAccuracy {
        bands = List.copyOf(bands);
    }

    /**
     * One row.
     *
     * @param minFrequencyHz lowest frequency, Hz
     * @param maxFrequencyHz highest frequency, Hz
     * @param current whether the level range is a current (A rms) rather than a voltage (V rms)
     * @param minLevel lowest drive level
     * @param maxLevel highest drive level
     * @param minIntegrationS shortest integration time it holds for, s
     * @param basic A, a fraction
     * @param shortOhm Zs, ohms
     * @param openS Yo, siemens
     * @param phaseRad phase term in radians; NaN: A
     */
    record Band(double minFrequencyHz, double maxFrequencyHz, boolean current, double minLevel, double maxLevel,
            double minIntegrationS, double basic, double shortOhm, double openS, double phaseRad) {

        double residual(double magnitudeOhm) {
            return (shortOhm == 0 ? 0 : shortOhm / magnitudeOhm) + openS * magnitudeOhm;
        }

        double magnitudeLimit(double magnitudeOhm) {
            return basic + residual(magnitudeOhm);
        }

        double phaseLimitRad(double magnitudeOhm) {
            return (Double.isNaN(phaseRad) ? basic : phaseRad) + residual(magnitudeOhm);
        }
    }

    /** The band for a point, or null when none covers it. */
    Band band(double frequencyHz, SourceKind drive, double level, double integrationS) {
        Band best = null;
        for (Band b : bands) {
            boolean covers = b.current == (drive == SourceKind.CURRENT) && frequencyHz >= b.minFrequencyHz
                    && frequencyHz <= b.maxFrequencyHz && level >= b.minLevel && level <= b.maxLevel
                    && b.minIntegrationS <= integrationS;
            if (covers && (best == null || b.minIntegrationS > best.minIntegrationS)) {
                best = b;
            }
        }
        return best;
    }
}
