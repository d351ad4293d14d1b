package org.zweep.driver.uncertainty;

import java.util.List;
import java.util.Optional;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Impedance;

/**
 * A meter's stated accuracy in the generic form of impedance meters' data sheets: the limit of the
 * relative error of |Z| is
 *
 * <pre>  e(|Z|) = A + Zs/|Z| + Yo·|Z|</pre>
 *
 * where A is the basic accuracy, Zs (Ω) an effective short-side residual and Yo (S) an effective
 * open-side residual admittance; the limit of the phase error, in radians, is the same expression
 * with A replaced by the stated phase term when there is one. A, Zs and Yo come from a table of
 * {@link Band}s by frequency, drive level and integration time.
 *
 * <p>The limits are read as a {@link Distribution}: rectangular (the GUM's reading of a bare ±
 * limit, u = e/√3, JCGM 100:2008, 4.3.7) unless the maker states them as an expanded uncertainty
 * with k = 2 (u = e/2). The magnitude and phase errors are taken as independent.
 *
 * <p>Immutable and thread-safe.
 *
 * @param bands the table; the first band that {@linkplain Band#covers covers} a point and has
 *     the longest integration time not above the point's applies
 * @param distribution how the limits are read
 */
public record MeterAccuracy(List<Band> bands, Distribution distribution) {

    /** How a stated limit e becomes a standard uncertainty u. */
    public enum Distribution {
        /** A bare ± limit: u = e/√3. */
        RECTANGULAR("rectangular", Math.sqrt(3.0)),
        /** The limit is an expanded uncertainty with k = 2 (normal): u = e/2. */
        NORMAL_K2("normal-k2", 2.0);

        private final String word;
        private final double divisor;

        Distribution(String word, double divisor) {
            this.word = word;
            this.divisor = divisor;
        }

        /** The word used in dialect and bench files. */
        public String word() {
            return word;
        }

        /** e/u. */
        public double divisor() {
            return divisor;
        }

        /** By its word; empty when there is none such. */
        public static Optional<Distribution> byWord(String word) {
            for (Distribution d : values()) {
                if (d.word.equals(word)) {
                    return Optional.of(d);
                }
            }
            return Optional.empty();
        }
    }

    /**
     * One row of the table.
     *
     * @param name the row's name, for messages
     * @param minFrequencyHz lowest frequency it covers, Hz
     * @param maxFrequencyHz highest frequency it covers, Hz
     * @param minLevel lowest drive level it covers, V rms (or A rms when {@code currentLevel})
     * @param maxLevel highest drive level it covers
     * @param currentLevel whether the levels are currents
     * @param minIntegrationS the shortest integration time it holds for, s (0: any)
     * @param relative A, as a fraction (0.001 for 0.1 %)
     * @param shortOhm Zs, in ohms
     * @param openS Yo, in siemens
     * @param phaseRad the phase term replacing A for the phase limit, in radians; NaN: A itself
     */
    public record Band(String name, double minFrequencyHz, double maxFrequencyHz, double minLevel, double maxLevel,
            boolean currentLevel, double minIntegrationS, double relative, double shortOhm, double openS,
            double phaseRad) {

        /** @throws InvalidInputException if a range is inverted or a term negative */
        public Band {
            if (!(minFrequencyHz <= maxFrequencyHz) || !(minLevel <= maxLevel)) {
                throw new InvalidInputException("accuracy band " + name + ": a range's maximum is below its minimum");
            }
            if (!(relative >= 0) || !(shortOhm >= 0) || !(openS >= 0) || !(minIntegrationS >= 0)
                    || phaseRad < 0) {
                throw new InvalidInputException("accuracy band " + name + ": terms must not be negative");
            }
        }

        /** Whether the band covers this frequency and drive level. */
        public boolean covers(double frequencyHz, double level, boolean current) {
            return current == currentLevel && frequencyHz >= minFrequencyHz && frequencyHz <= maxFrequencyHz
                    && level >= minLevel && level <= maxLevel;
        }

        /** The relative limit e(|Z|) of the magnitude. */
        public double magnitudeLimit(double magnitudeOhm) {
            return relative + residuals(magnitudeOhm);
        }

        /** The limit of the phase error in radians. */
        public double phaseLimitRad(double magnitudeOhm) {
            return (Double.isNaN(phaseRad) ? relative : phaseRad) + residuals(magnitudeOhm);
        }

        private double residuals(double magnitudeOhm) {
            return (shortOhm == 0 ? 0 : shortOhm / magnitudeOhm) + openS * magnitudeOhm;
        }
    }

    public MeterAccuracy {
        bands = List.copyOf(bands);
    }

    /**
     * The band for a point: among those covering the frequency and level, the one with the longest
     * integration time not above {@code integrationS}; empty when none does.
     */
    public Optional<Band> band(double frequencyHz, double level, boolean current, double integrationS) {
        Band best = null;
        for (Band b : bands) {
            if (b.covers(frequencyHz, level, current) && b.minIntegrationS() <= integrationS
                    && (best == null || b.minIntegrationS() > best.minIntegrationS())) {
                best = b;
            }
        }
        return Optional.ofNullable(best);
    }

    /**
     * The standard uncertainty of one reading from the stated accuracy: u(|Z|) = |Z|·e/c and
     * u(θ) = e_θ/c (c from the distribution), uncorrelated, turned into u(R), u(X) and r(R, X).
     * Empty when no band covers the point.
     *
     * @param reading the reading (|Z| in the residual terms is the reading's)
     * @param level the drive level, V rms or A rms
     * @param current whether {@code level} is a current
     * @param integrationS the integration time, s
     */
    public Optional<UncertainImpedance> uncertainty(Impedance reading, double level, boolean current,
            double integrationS) {
        double m = reading.magnitudeOhm();
        return band(reading.frequencyHz(), level, current, integrationS).map(b -> UncertainImpedance.fromPolar(reading,
                m * b.magnitudeLimit(m) / distribution.divisor(),
                Math.toDegrees(b.phaseLimitRad(m) / distribution.divisor()), 0.0));
    }
}
